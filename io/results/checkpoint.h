// Checkpoints: the state of a running simulation (solver/engine/simulation_state.h) in one HDF5 file next
// to its results, so a killed or interrupted run can finish later with results bit for bit equal to
// an uninterrupted run. Written atomically (a .partial file, then a rename); read back only after
// checking that it belongs to this program version, scene, grid and time step, with a per-chunk
// checksum on every array. Layout and rules: docs/results_file.md, "Checkpoints".
#pragma once

#include <string>
#include <vector>

#include "solver/scene.h"
#include "solver/engine/grid.h"
#include "solver/engine/simulation_state.h"

namespace yeegap::io {

inline constexpr const char* checkpoint_format = "yeegap-checkpoint";
inline constexpr int checkpoint_format_version = 1;

/// What must be the same for a checkpoint to be resumed, besides the scene text and the model.
struct CheckpointInfo {
  std::string program_version;         // e.g. YEEGAP_VERSION
  std::vector<std::string> overrides;  // the `--set` values of the run, in order
};

/// Where the checkpoint of a results file lives: "out.h5" -> "out.checkpoint.h5".
std::string checkpoint_path(const std::string& results_path);

/// Writes the state of `sim` (a Simulation, or a run of several; between two steps), built from
/// `scene`, to `path` via `path.partial` and a rename. Throws std::runtime_error naming `path` on
/// failure; an older checkpoint of that name then survives untouched.
void write_checkpoint(const std::string& path, solver::Checkpointable& sim, const solver::Scene& scene,
                      const CheckpointInfo& info);

/// Checks the checkpoint at `path` against `sim` (freshly built from `scene`) and `info`, then
/// loads it into `sim`, which continues from the checkpoint's step. Throws RunError naming the
/// file and what differs (program version, scene text, overrides, grid, time step, the list or
/// sizes of the state arrays) or what is damaged (truncated file, checksum failure). After a
/// failure `sim` may hold part of the checkpoint: build a new one.
void read_checkpoint(const std::string& path, solver::Checkpointable& sim, const solver::Scene& scene,
                     const CheckpointInfo& info);

}  // namespace yeegap::io
