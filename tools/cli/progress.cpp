// Terminal progress line (see progress.h).
#include "progress.h"

#include <unistd.h>

#include <cstdio>

#include <fmt/format.h>

namespace yeegap::cli {

namespace {
std::string clock_text(double seconds) {
  if (seconds < 0 || seconds > 1e8) return "?";
  const long s = static_cast<long>(seconds + 0.5);
  return s >= 3600 ? fmt::format("{}:{:02}:{:02}", s / 3600, (s / 60) % 60, s % 60) : fmt::format("{}:{:02}", s / 60, s % 60);
}
}  // namespace

ProgressLine::ProgressLine() : enabled_(isatty(fileno(stderr)) == 1) {}

ProgressLine::~ProgressLine() { break_line(); }

void ProgressLine::break_line() {
  if (drawn_) std::fputs("\n", stderr);
  drawn_ = false;
}

void ProgressLine::update(const solver::Progress& p) {
  if (!enabled_) return;
  const double percent = p.planned_steps > 0 ? 100.0 * p.step / p.planned_steps : 0.0;
  const std::string line =
      fmt::format("\r{:5.1f} %  step {} of ~{}  {:.0f} steps/s  {:.1f} Mcells/s  ETA {}   ", percent < 100 ? percent : 99.9,
                  p.step, p.planned_steps, p.steps_per_second, p.cells_per_second / 1e6, clock_text(p.eta_seconds));
  std::fputs(line.c_str(), stderr);
  std::fflush(stderr);
  drawn_ = true;
}

}  // namespace yeegap::cli
