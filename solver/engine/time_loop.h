// The time loop of every kind of run (Simulation, BlochRun): steps until a stop rule holds, stops a run
// whose fields diverge (not finite, runaway, or growth from a small seed: growth_watch.h), reports
// progress at most twice a second, and lets the caller stop between steps (checkpoints, signals). It
// only reads and updates the run's own counters.
#pragma once

#include <functional>
#include <string>

#include "solver/scene.h"
#include "solver/engine/simulation.h"

namespace yeegap::solver {

struct TimeLoopSetup {
  const StopSpec& stop;
  double dt = 0;                   // s
  double source_end = 0;           // s, when the last source has ended
  long planned_steps = 0;          // for progress when the stop rule is not a time
  long long cells = 0;             // per step, for the progress rate
  long growth_window = 400;        // steps: the envelope window of GrowthWatch (growth_watch.h)
};

/// The counters a run carries across resumed segments.
struct TimeLoopCounters {
  long& step;
  double& peak_energy;
  double& last_energy;
  double& wall_seconds;            // summed over the segments
  std::string& stop_reason;        // "time", "max_steps", "energy_below", "interrupted" or "diverged"
};

void run_time_loop(const TimeLoopSetup& setup, TimeLoopCounters counters, const std::function<void()>& step,
                   const std::function<double()>& field_energy, const std::function<void(const Progress&)>& progress,
                   const std::function<bool()>& between_steps);

}  // namespace yeegap::solver
