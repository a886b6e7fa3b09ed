// Resident memory and a timed scene run (see run_costs.h).
#include "tools/benchmark/run_costs.h"

#include <unistd.h>

#include <chrono>
#include <fstream>

#include "io/scene/scene_reader.h"
#include "solver/runs/run_plan.h"
#include "tools/benchmark/timing.h"

namespace yeegap::benchmark {

std::size_t resident_bytes() {
  std::ifstream in("/proc/self/statm");
  std::size_t total_pages = 0, resident_pages = 0;
  if (!(in >> total_pages >> resident_pages)) return 0;
  return resident_pages * static_cast<std::size_t>(sysconf(_SC_PAGESIZE));
}

SceneRunCost time_scene_run(const std::string& path) {
  const solver::Scene scene = io::read_scene_file(path);
  const auto t0 = std::chrono::steady_clock::now();
  const solver::RunResults r = solver::run_scene(scene);
  return {seconds_since(t0), r.summary.steps};
}

}  // namespace yeegap::benchmark
