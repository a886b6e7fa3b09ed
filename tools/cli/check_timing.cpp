// Stepping a run for a moment to measure its rate (see check_timing.h). The run's own hook between
// steps counts them; an angle scan calls it from every angle under way, so the count is of all of
// them together, as the plan's steps are.
#include "check_timing.h"

#include <chrono>

namespace yeegap::cli {

namespace {

// Untimed first steps: page faults of the first touch, caches.
constexpr long warmup_steps = 3;

}  // namespace

StepTiming time_steps(const solver::RunPlan& plan, double budget_seconds) {
  using clock = std::chrono::steady_clock;
  const auto t0 = clock::now();
  const std::unique_ptr<solver::Run> run = solver::make_run(plan);
  StepTiming t;
  t.setup_seconds = std::chrono::duration<double>(clock::now() - t0).count();
  long calls = 0;
  clock::time_point start;
  // Called between steps by one thread at a time; true stops the run.
  run->run({}, [&] {
    ++calls;
    if (calls == warmup_steps) start = clock::now();
    if (calls <= warmup_steps) return false;
    t.timed_steps = calls - warmup_steps;
    t.timed_seconds = std::chrono::duration<double>(clock::now() - start).count();
    return t.timed_seconds >= budget_seconds;
  });
  if (t.timed_steps > 0 && t.timed_seconds > 0) {
    t.steps_per_second = t.timed_steps / t.timed_seconds;
    t.cell_updates_per_second = t.steps_per_second * static_cast<double>(plan.summary.cell_count);
  }
  return t;
}

}  // namespace yeegap::cli
