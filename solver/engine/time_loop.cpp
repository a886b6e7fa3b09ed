#include "solver/engine/time_loop.h"

#include "solver/engine/growth_watch.h"

#include <algorithm>
#include <chrono>
#include <cmath>

namespace yeegap::solver {
namespace {

// How often (in steps) the field energy is measured for the decay stop rule; a full pass over
// the fields costs about half a step, so every 20th step adds 2.5 %.
constexpr long energy_interval = 20;
// Without the decay rule the energy is still measured every 50 steps (1 %), to catch a run
// going unstable: a non-finite energy, or after the sources have ended a field energy 1000 times
// any seen before. A passive scene cannot do that: with no source its total energy only falls, and
// the field's share can exceed its earlier peak only by what the media's polarization held, a
// factor of a few, not a thousand.
constexpr long guard_interval = 50;
constexpr double runaway_factor = 1e3;

}  // namespace

void run_time_loop(const TimeLoopSetup& setup, TimeLoopCounters c, const std::function<void()>& step,
                   const std::function<double()>& field_energy, const std::function<void(const Progress&)>& progress,
                   const std::function<bool()>& between_steps) {
  using clock = std::chrono::steady_clock;
  const StopSpec& st = setup.stop;
  // Clamped before the conversion: a count beyond long is undefined behaviour, and the cap stops first.
  const long after_steps =
      st.after > 0 ? static_cast<long>(std::min<double>(static_cast<double>(st.max_steps), std::ceil(st.after / setup.dt))) : -1;
  const long planned = after_steps >= 0 ? after_steps : setup.planned_steps;
  const auto start = clock::now();
  const long first_step = c.step;             // > 0 when resumed from a checkpoint
  const double earlier_wall = c.wall_seconds;  // run time of the segments before a resume
  auto last_report = start;
  auto wall = [&] { return earlier_wall + std::chrono::duration<double>(clock::now() - start).count(); };
  c.stop_reason.clear();
  // Not carried across a resume: the watch starts afresh and only sees growth a window later.
  GrowthWatch growth(setup.growth_window);
  while (c.stop_reason.empty()) {
    step();
    const long n = c.step;
    if (after_steps >= 0 && n >= after_steps) c.stop_reason = "time";
    else if (n >= st.max_steps) c.stop_reason = "max_steps";
    else if ((st.energy_below > 0 && n % energy_interval == 0) || n % guard_interval == 0) {
      c.last_energy = field_energy();
      const bool sources_over = n * setup.dt > setup.source_end;
      if (!std::isfinite(c.last_energy) ||
          (sources_over && c.peak_energy > 0 && c.last_energy > runaway_factor * c.peak_energy)) {
        c.stop_reason = "diverged";
      } else {
        c.peak_energy = std::max(c.peak_energy, c.last_energy);
        if (sources_over && growth.add(n, c.last_energy, c.peak_energy)) c.stop_reason = "diverged";
        else if (st.energy_below > 0 && sources_over && c.peak_energy > 0 && c.last_energy < st.energy_below * c.peak_energy)
          c.stop_reason = "energy_below";
      }
    }
    if (progress && (n & 15) == 0) {
      const auto now = clock::now();
      if (std::chrono::duration<double>(now - last_report).count() > 0.5) {
        last_report = now;
        Progress p;
        p.step = n;
        p.planned_steps = std::max(planned, n);
        const double elapsed = std::chrono::duration<double>(now - start).count();
        p.steps_per_second = (n - first_step) / elapsed;
        p.cells_per_second = p.steps_per_second * static_cast<double>(setup.cells);
        p.eta_seconds = (p.planned_steps - n) / p.steps_per_second;
        progress(p);
      }
    }
    if (c.stop_reason.empty() && between_steps) {
      c.wall_seconds = wall();
      if (between_steps()) c.stop_reason = "interrupted";
    }
  }
  c.wall_seconds = wall();
  if (c.stop_reason != "interrupted" && c.stop_reason != "diverged") {
    c.last_energy = field_energy();
    if (!std::isfinite(c.last_energy)) c.stop_reason = "diverged";  // between two checks, at the very end
    else c.peak_energy = std::max(c.peak_energy, c.last_energy);
  }
}

}  // namespace yeegap::solver
