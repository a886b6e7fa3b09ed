// One run with checkpoints: resumed from its checkpoint if asked, checkpointed every so often
// between two steps, and stopped cleanly by SIGINT/SIGTERM with a last checkpoint. Works for any
// kind of run that is Checkpointable and whose run() takes a between-steps hook (a Simulation; a
// run of several Simulations): the caller passes the run function, this file does the rest.
#pragma once

#include <functional>
#include <string>

#include "io/results/checkpoint.h"
#include "progress.h"
#include "solver/results.h"
#include "solver/engine/simulation.h"

namespace yeegap::cli {

struct CheckpointSettings {
  std::string path;            // <results>.checkpoint.h5
  double every_seconds = 0;    // 0: only on a signal
  io::CheckpointInfo info;
  /// How messages name the run's place from its state counter; empty: "step N".
  std::function<std::string(long)> position;
  std::string where(long counter) const { return position ? position(counter) : "step " + std::to_string(counter); }
};

struct CheckpointedResults {
  solver::RunResults results;
  bool interrupted = false;        // stopped by a signal: partial results
  bool checkpoint_failed = false;  // ... and the last checkpoint could not be written
};

using RunFunction = std::function<solver::RunResults(const std::function<void(const solver::Progress&)>& progress,
                                                     const std::function<bool()>& between_steps)>;

/// With `resume`, loads the checkpoint into `state` (throws RunError if it does not fit);
/// otherwise notes on stderr that an old checkpoint will be replaced, if there is one.
void resume_or_start(solver::Checkpointable& state, const solver::Scene& scene, const CheckpointSettings& c,
                     bool resume);

/// Runs `run` to its end or to a signal, checkpointing `state` as `c` says.
CheckpointedResults run_with_checkpoints(solver::Checkpointable& state, const RunFunction& run,
                                         const solver::Scene& scene, const CheckpointSettings& c,
                                         ProgressLine& progress);

}  // namespace yeegap::cli
