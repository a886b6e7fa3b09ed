// Dispatch between the kinds of run (see run_scene.h).
#include "solver/run_scene.h"

#include "solver/angle_scan.h"
#include "solver/bloch_halos.h"
#include "solver/bloch_run.h"
#include "solver/layered_stack.h"

namespace yeegap::solver {

namespace {

// The scene as it will run: a plane-wave stack reduced to one lateral cell.
Scene reduced(const Scene& s, std::string* note) {
  if (s.bloch_waves.empty()) return s;
  const int axis = s.bloch_waves.front().axis;
  return laterally_uniform(s, axis) ? as_one_dimensional(s, axis, note) : s;
}

}  // namespace

bool is_bloch_scene(const Scene& s) { return !s.bloch_waves.empty() || needs_imaginary_part(s.domain); }

Scene bloch_scene_as_run(const Scene& scene) { return reduced(scene, nullptr); }

bool is_angle_scan(const Scene& s) { return !s.bloch_waves.empty() && !s.bloch_waves.front().scan_angles.empty(); }

ModelSummary plan_scene(const Scene& scene) {
  if (!is_bloch_scene(scene)) {
    ModelSummary m = Simulation::plan(scene);
    // Above this the material map alone takes 100 MB: the run checks placements at its start.
    constexpr long long placement_check_cells = 100'000'000;
    if (m.cell_count <= placement_check_cells) Simulation::check_placements(scene);
    return m;
  }
  std::string note;
  const Scene s = reduced(scene, &note);
  const bool scan = !s.bloch_waves.empty() && !s.bloch_waves.front().scan_angles.empty();
  ModelSummary m = scan ? plan_angle_scan(s) : BlochRun::plan(s);
  if (!note.empty()) m.mesh_notes.insert(m.mesh_notes.begin(), note);
  return m;
}

RunResults run_scene(const Scene& scene, const std::function<void(const Progress&)>& progress) {
  if (!is_bloch_scene(scene)) return Simulation(scene).run(progress);
  const Scene s = reduced(scene, nullptr);
  if (!s.bloch_waves.empty() && !s.bloch_waves.front().scan_angles.empty()) return run_angle_scan(s, progress);
  return BlochRun(s).run(progress);
}

}  // namespace yeegap::solver
