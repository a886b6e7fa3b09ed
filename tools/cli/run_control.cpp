// Signal flag and durations (see run_control.h).
#include "run_control.h"

#include <csignal>
#include <cstdlib>
#include <regex>

namespace yeegap::cli {

namespace {
// The only state a handler touches: lock-free and async-signal-safe.
volatile std::sig_atomic_t received_signal = 0;
struct sigaction previous_int, previous_term;

extern "C" void on_stop_signal(int sig) { received_signal = sig; }
}  // namespace

std::optional<double> parse_duration(const std::string& text) {
  if (text == "off" || text == "0") return 0.0;
  static const std::regex pattern(R"(\s*([0-9]*\.?[0-9]+(?:[eE][-+]?[0-9]+)?)\s*(s|min|h)\s*)");
  std::smatch m;
  if (!std::regex_match(text, m, pattern)) return std::nullopt;
  const double value = std::strtod(m[1].str().c_str(), nullptr);
  const double unit = m[2] == "s" ? 1.0 : m[2] == "min" ? 60.0 : 3600.0;
  return value * unit;
}

StopSignals::StopSignals() {
  received_signal = 0;
  struct sigaction action {};
  action.sa_handler = on_stop_signal;
  sigemptyset(&action.sa_mask);
  action.sa_flags = SA_RESETHAND;  // one-shot: a second signal takes the default action (ends the program)
  sigaction(SIGINT, &action, &previous_int);
  sigaction(SIGTERM, &action, &previous_term);
}

StopSignals::~StopSignals() {
  sigaction(SIGINT, &previous_int, nullptr);
  sigaction(SIGTERM, &previous_term, nullptr);
}

int StopSignals::received() const { return received_signal; }

}  // namespace yeegap::cli
