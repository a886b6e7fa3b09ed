// `check`'s time estimate from this machine's own rate for this scene: the run is built as `run`
// would build it and stepped for about a second, and the planned steps are divided by the steps
// per second measured. A fixed rate for every scene was off 5-40x (a 1D scan runs at a tenth of a
// 3D vacuum rate, poles and averaging cost several times a plain cell).
#pragma once

#include <string>

#include "solver/runs/run_plan.h"

namespace yeegap::cli {

struct StepTiming {
  double setup_seconds = 0;     // building the run: grid, materials, averaging, absorbers
  long timed_steps = 0;         // steps in the timed window (all angles under way, for a scan)
  double timed_seconds = 0;
  double steps_per_second = 0;  // of the whole run: all angles under way together, for a scan
  double cell_updates_per_second = 0;
};

/// Builds the run of `plan`, steps it for about `budget_seconds` after a few untimed steps, and
/// drops it. Throws what the run's constructor throws.
StepTiming time_steps(const solver::RunPlan& plan, double budget_seconds);

}  // namespace yeegap::cli
