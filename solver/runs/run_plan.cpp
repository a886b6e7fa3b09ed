// The run plan and the one factory (run_plan.h): which kind of run a scene is, and the run of that
// kind behind one interface.
#include "solver/runs/run_plan.h"

#include <fmt/format.h>

#include "base/errors.h"
#include "solver/engine/bloch_halos.h"
#include "solver/runs/angle_scan.h"
#include "solver/runs/bloch_run.h"
#include "solver/runs/layered_stack.h"
#include "solver/runs/sensor_scan.h"

namespace yeegap::solver {

namespace {

RunKind kind_of(const Scene& s) {
  if (s.bloch_waves.empty() && !needs_imaginary_part(s.domain)) return RunKind::plain;
  return s.bloch_waves.empty() || s.bloch_waves.front().scan_angles.empty() ? RunKind::bloch : RunKind::angle_scan;
}

// A sensor output needs an angle scan to repeat; the scene reader refuses it earlier with the
// place in the file, this guards scenes built in code.
void require_scan_for_sensors(const Scene& s) {
  if (!s.sensors.empty() && kind_of(s) != RunKind::angle_scan)
    throw RunError(fmt::format("{}: the sensor output '{}' needs a plane_wave with 'angles' (an angle scan)",
                               s.sensors.front().where.file.empty() ? s.file : s.sensors.front().where.location(),
                               s.sensors.front().name));
}

// Scans a run makes: its own, the sensor's raised one, and the one before binding if asked.
int scan_count(const Scene& s) {
  if (s.sensors.empty()) return 1;
  return s.sensors.front().binding >= 0 ? 3 : 2;
}

std::string sensor_note(const Scene& s) {
  const SensorSpec& spec = s.sensors.front();
  return fmt::format(
      "sensor '{}': the scan runs {} times: as written, with '{}' raised by {:g} in index{}; steps above are for all",
      spec.name, scan_count(s) == 3 ? "three" : "two", s.materials[static_cast<std::size_t>(spec.medium)].name,
      spec.delta_n,
      spec.binding >= 0
          ? fmt::format(", and with '{}' replaced by it (before binding)", s.materials[static_cast<std::size_t>(spec.binding)].name)
          : std::string());
}

// A Run around one run object of kind K: the checkpoint calls go to it as they are.
template <class K>
class RunAround : public Run {
 public:
  explicit RunAround(const Scene& s) : inner_(s) {}
  const Grid& grid() const override { return inner_.grid(); }
  double dt() const override { return inner_.dt(); }
  StateCounters state_counters() const override { return inner_.state_counters(); }
  void restore_counters(const StateCounters& c) override { inner_.restore_counters(c); }
  StateArrays state_arrays() override { return inner_.state_arrays(); }

 protected:
  K inner_;
};

class PlainRun final : public RunAround<Simulation> {
 public:
  using RunAround::RunAround;
  RunKind kind() const override { return RunKind::plain; }
  ModelSummary summary() const override { return inner_.summary(); }
  RunResults run(const ProgressHook& progress, const StopHook& between_steps) override {
    return inner_.run(progress, between_steps);
  }
};

class BlochCellRun final : public RunAround<BlochRun> {
 public:
  BlochCellRun(const Scene& s, ModelSummary planned) : RunAround(s), planned_(std::move(planned)) {}
  RunKind kind() const override { return RunKind::bloch; }
  ModelSummary summary() const override { return planned_; }
  RunResults run(const ProgressHook& progress, const StopHook& between_steps) override {
    return inner_.run(progress, between_steps);
  }

 private:
  ModelSummary planned_;
};

class AngleScanRun final : public RunAround<AngleScan> {
 public:
  AngleScanRun(const Scene& s, ModelSummary planned) : RunAround(s), scene_(s), planned_(std::move(planned)) {}
  RunKind kind() const override { return RunKind::angle_scan; }
  ModelSummary summary() const override { return planned_; }
  RunResults run(const ProgressHook& progress, const StopHook& between_steps) override {
    return inner_.run(scan_progress(progress, 0), between_steps);
  }
  bool run_repeats(RunResults& results, const ProgressHook& progress, const StopHook& between_steps) override;
  std::string position(long counter) const override {
    return fmt::format("{} of {} angles finished", counter, inner_.angle_count());
  }

 private:
  // Progress of the sensor's repeats continues the count of the first scan: scans x angles in all.
  ProgressHook scan_progress(const ProgressHook& progress, int scan_index) const;

  Scene scene_;
  ModelSummary planned_;
};

Run::ProgressHook AngleScanRun::scan_progress(const ProgressHook& progress, int scan_index) const {
  if (!progress || scene_.sensors.empty()) return progress;
  const long n = static_cast<long>(inner_.angle_count());
  const long scans = scan_count(scene_);
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

bool AngleScanRun::run_repeats(RunResults& results, const ProgressHook& progress, const StopHook& between_steps) {
  if (scene_.sensors.empty()) return true;
  const AngleScanCurve reference = curve_of(results);
  struct RepeatStopped {};
  try {
    for (const SensorSpec& spec : scene_.sensors) {
      int scan = 0;
      results.sensors.push_back(run_sensor(scene_, spec, reference, [&](const Scene& changed) {
        const RunResults repeat = AngleScan(changed).run(scan_progress(progress, ++scan), between_steps);
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

}  // namespace

std::string RunPlan::description() const {
  const bool one_dimensional = scene.bloch_waves.empty() ? false : [&] {
    int lateral_cells = 1;
    for (int a = 0; a < 3; ++a)
      if (a != scene.bloch_waves.front().axis) lateral_cells *= summary.cells[static_cast<std::size_t>(a)];
    return lateral_cells == 1;
  }();
  const std::string stack = one_dimensional ? ", a 1D stack" : "";
  switch (kind) {
    case RunKind::plain:
      return "plain run (real fields)";
    case RunKind::bloch:
      return fmt::format("Bloch cell ({}{}){}", needs_imaginary_part(scene.domain) ? "complex fields" : "real fields",
                         scene.bloch_waves.empty() ? "" : ", plane wave with its incident problem", stack);
    case RunKind::angle_scan:
      return fmt::format("angle scan: {} angles{}{}", angles,
                         scans > 1 ? fmt::format(", {} scans (sensor)", scans) : std::string(), stack);
  }
  return {};
}

RunPlan plan_run(const Scene& scene) {
  RunPlan p;
  p.kind = kind_of(scene);
  if (p.kind == RunKind::plain) {
    p.scene = scene;
    p.summary = Simulation::plan(scene);
    // Above this the material map alone takes 100 MB: the run checks placements at its start.
    constexpr long long placement_check_cells = 100'000'000;
    if (p.summary.cell_count <= placement_check_cells) Simulation::check_placements(scene);
    return p;
  }
  std::string note;
  const int axis = scene.bloch_waves.empty() ? -1 : scene.bloch_waves.front().axis;
  p.scene = axis >= 0 && laterally_uniform(scene, axis) ? as_one_dimensional(scene, axis, &note) : scene;
  require_scan_for_sensors(p.scene);
  if (p.kind == RunKind::bloch) {
    p.summary = BlochRun::plan(p.scene);
  } else {
    p.summary = plan_angle_scan(p.scene);
    p.angles = static_cast<long>(p.scene.bloch_waves.front().scan_angles.size());
    p.scans = scan_count(p.scene);
  }
  if (!note.empty()) p.summary.mesh_notes.insert(p.summary.mesh_notes.begin(), note);
  if (!p.scene.sensors.empty()) {
    p.summary.steps *= p.scans;
    p.summary.mesh_notes.push_back(sensor_note(p.scene));
  }
  return p;
}

std::unique_ptr<Run> make_run(const RunPlan& plan) {
  switch (plan.kind) {
    case RunKind::plain:
      return std::make_unique<PlainRun>(plan.scene);
    case RunKind::bloch:
      return std::make_unique<BlochCellRun>(plan.scene, plan.summary);
    case RunKind::angle_scan:
      return std::make_unique<AngleScanRun>(plan.scene, plan.summary);
  }
  throw RunError("unknown kind of run");
}

RunResults run_scene(const Scene& scene, const Run::ProgressHook& progress, const Run::StopHook& between_steps) {
  const std::unique_ptr<Run> run = make_run(plan_run(scene));
  RunResults r = run->run(progress, between_steps);
  if (r.summary.stop_reason == "interrupted" || r.summary.stop_reason == "diverged") return r;
  if (!run->run_repeats(r, progress, between_steps)) r.summary.stop_reason = "interrupted";
  return r;
}

}  // namespace yeegap::solver
