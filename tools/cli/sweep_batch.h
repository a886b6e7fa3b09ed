// `yeegap sweep --batch slurm`: a Slurm array job script with one task per sweep point, each task
// running `yeegap sweep SCENE --point K` on one node, and the merge as a dependent job.
#pragma once

#include <string>
#include <vector>

#include "io/sweep/sweep_expand.h"

namespace yeegap::cli {

/// Writes FOLDER/sweep.sbatch and prints how to submit it and merge afterwards. `threads` (0: all
/// cores of this machine) becomes --cpus-per-task; `jobs` > 1 caps the tasks running at once.
/// Returns the exit code.
int write_slurm_script(const std::string& scene, const std::string& folder, const io::SweepPlan& plan,
                       const std::vector<std::string>& overrides, int threads, int jobs);

}  // namespace yeegap::cli
