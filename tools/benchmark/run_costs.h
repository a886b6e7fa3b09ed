// Two costs the benchmark measures outside the update loops: the memory a vacuum box really holds
// per cell (resident set, not an estimate), and the wall time of a whole scene run as a user
// starts it (the flagship chip's three angle scans).
#pragma once

#include <cstddef>
#include <string>

namespace yeegap::benchmark {

/// Resident memory of this process in bytes (/proc/self/statm), 0 where it cannot be read.
std::size_t resident_bytes();

struct SceneRunCost {
  double seconds = 0;   // wall time of the run, reading the scene excluded
  long steps = 0;       // all runs together (an angle scan sums its angles' steps)
};

/// Reads the scene at `path` and runs it as `yeegap run` would, writing no file.
SceneRunCost time_scene_run(const std::string& path);

}  // namespace yeegap::benchmark
