// Dispatch between the kinds of run (see run_scene.h).
#include "solver/runs/run_scene.h"

#include <fmt/format.h>

#include "base/errors.h"
#include "solver/runs/angle_scan.h"
#include "solver/engine/bloch_halos.h"
#include "solver/runs/bloch_run.h"
#include "solver/runs/layered_stack.h"
#include "solver/runs/sensor_scan.h"

namespace yeegap::solver {

namespace {

// The scene as it will run: a plane-wave stack reduced to one lateral cell.
Scene reduced(const Scene& s, std::string* note) {
  if (s.bloch_waves.empty()) return s;
  const int axis = s.bloch_waves.front().axis;
  return laterally_uniform(s, axis) ? as_one_dimensional(s, axis, note) : s;
}

// A sensor output needs an angle scan to repeat; the scene reader refuses it earlier with the
// place in the file, this guards scenes built in code.
void require_scan_for_sensors(const Scene& s) {
  if (!s.sensors.empty() && !is_angle_scan(s))
    throw RunError(fmt::format("{}: the sensor output '{}' needs a plane_wave with 'angles' (an angle scan)",
                               s.sensors.front().where.file.empty() ? s.file : s.sensors.front().where.location(),
                               s.sensors.front().name));
}

// Scans a run makes: its own, the sensor's raised one, and the one before binding if asked.
int scan_count(const Scene& s) {
  if (s.sensors.empty()) return 1;
  return s.sensors.front().binding >= 0 ? 3 : 2;
}

// Progress of the sensor's repeats continues the count of the first scan: scans x angles in all.
std::function<void(const Progress&)> scan_progress(const std::function<void(const Progress&)>& progress,
                                                   const Scene& s, int scan_index) {
  if (!progress || s.sensors.empty()) return progress;
  const long n = static_cast<long>(s.bloch_waves.front().scan_angles.size());
  const long scans = scan_count(s);
  return [progress, n, scans, scan_index](const Progress& p) {
    Progress q = p;
    q.step = p.step + scan_index * n;
    q.planned_steps = scans * n;
    q.eta_seconds = p.steps_per_second > 0 ? (q.planned_steps - q.step) / p.steps_per_second : -1;
    progress(q);
  };
}

AngleScanCurve curve_of(const RunResults& r) {
  const ReflectanceResult& t = r.reflectance.at(0);
  return {t.omegas.at(0), t.angles, t.reflectance};
}

}  // namespace

bool add_sensor_results(const Scene& scene, RunResults& results, const std::function<void(const Progress&)>& progress,
                        const std::function<bool()>& between_steps) {
  if (scene.sensors.empty()) return true;
  require_scan_for_sensors(scene);
  const AngleScanCurve reference = curve_of(results);
  struct RepeatStopped {};
  try {
    for (const SensorSpec& spec : scene.sensors) {
      int scan = 0;
      results.sensors.push_back(run_sensor(scene, spec, reference, [&](const Scene& changed) {
        const RunResults repeat = AngleScan(changed).run(scan_progress(progress, scene, ++scan), between_steps);
        if (repeat.summary.stop_reason == "interrupted") throw RepeatStopped{};
        // The summary counts every scan: the run's cost is theirs together.
        results.summary.steps += repeat.summary.steps;
        results.summary.simulated_time += repeat.summary.simulated_time;
        results.summary.wall_seconds += repeat.summary.wall_seconds;
        return curve_of(repeat);
      }));
      results.summary.stop_reason = fmt::format("{} and its repeat with {} raised by {:g}{} (sensor)",
                                                results.summary.stop_reason, results.sensors.back().medium, spec.delta_n,
                                                spec.binding >= 0 ? " and before binding" : "");
    }
  } catch (const RepeatStopped&) {
    return false;
  }
  return true;
}

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
  require_scan_for_sensors(s);
  ModelSummary m = is_angle_scan(s) ? plan_angle_scan(s) : BlochRun::plan(s);
  if (!note.empty()) m.mesh_notes.insert(m.mesh_notes.begin(), note);
  if (!s.sensors.empty()) {
    const SensorSpec& spec = s.sensors.front();
    m.steps *= scan_count(s);
    m.mesh_notes.push_back(fmt::format(
        "sensor '{}': the scan runs {} times: as written, with '{}' raised by {:g} in index{}; steps above are for all",
        spec.name, scan_count(s) == 3 ? "three" : "two", s.materials[static_cast<std::size_t>(spec.medium)].name, spec.delta_n,
        spec.binding >= 0
            ? fmt::format(", and with '{}' replaced by it (before binding)", s.materials[static_cast<std::size_t>(spec.binding)].name)
            : std::string()));
  }
  return m;
}

RunResults run_scene(const Scene& scene, const std::function<void(const Progress&)>& progress,
                     const std::function<bool()>& between_steps) {
  require_scan_for_sensors(scene);
  if (!is_bloch_scene(scene)) return Simulation(scene).run(progress, between_steps);
  const Scene s = reduced(scene, nullptr);
  if (!is_angle_scan(s)) return BlochRun(s).run(progress, between_steps);
  RunResults r = AngleScan(s).run(scan_progress(progress, s, 0), between_steps);
  if (r.summary.stop_reason == "interrupted") return r;
  if (!add_sensor_results(s, r, progress, between_steps)) r.summary.stop_reason = "interrupted";
  return r;
}

}  // namespace yeegap::solver
