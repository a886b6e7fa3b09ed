// Angle scan (see angle_scan.h).
#include "solver/runs/angle_scan.h"

#include <omp.h>

#include <atomic>
#include <chrono>
#include <exception>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "solver/runs/bloch_run.h"
#include "solver/engine/mesh_plan.h"

namespace yeegap::solver {

namespace {

Scene one_angle(const Scene& scene, double angle) {
  Scene s = scene;
  BlochWaveSpec& w = s.bloch_waves.front();
  w.scan_angles.clear();
  w.angle = angle;
  w.omegas = {w.reference_omega};
  w.single_frequency = true;
  return s;
}

}  // namespace

AngleScan::AngleScan(const Scene& scene) : scene_(scene) {
  YG_CHECK(scene.bloch_waves.size() == 1 && !scene.bloch_waves.front().scan_angles.empty(),
           "an angle scan needs one plane_wave with angles");
  angles_ = scene.bloch_waves.front().scan_angles;
  if (!scene.orders.empty())
    throw RunError(fmt::format("{}: diffraction orders are reported for a run at one angle (a band, or one "
                               "wavelength), not for an angle scan", scene.orders.front().where.location()));
  // Refuse what cannot run before any thread starts: every angle's scene is prepared here.
  for (double a : angles_) (void)BlochRun::prepare(one_angle(scene, a));
  const Scene first = BlochRun::prepare(one_angle(scene, angles_.front()));
  grid_ = plan_mesh(first).grid;
  dt_ = Simulation::plan(first).time_step;
  const std::size_t n = angles_.size();
  for (auto* v : {&finished_, &omega_, &angle_, &k_parallel_, &reflectance_, &transmittance_, &absorptance_, &steps_,
                  &energy_fraction_})
    v->assign(n, 0.0);
}

std::size_t AngleScan::finished_count() const {
  std::size_t n = 0;
  for (double f : finished_) n += f != 0;
  return n;
}

void AngleScan::take_static_parts(const RunResults& r) {
  static_ = RunResults{};
  static_.grid_x = r.grid_x, static_.grid_y = r.grid_y, static_.grid_z = r.grid_z;
  static_.material_names = r.material_names;
  static_.material_map = r.material_map;
  static_.tunnelling_gaps = r.tunnelling_gaps;
  ReflectanceResult header = r.reflectance.at(0);
  header.angle_scan = true;
  header.omegas.clear(), header.angles.clear(), header.k_parallel.clear();
  header.reflectance.clear(), header.transmittance.clear(), header.absorptance.clear();
  static_.reflectance = {header};
  have_static_ = true;
}

void AngleScan::store(std::size_t i, const RunResults& r) {
  const ReflectanceResult& row = r.reflectance.at(0);
  omega_[i] = row.omegas.at(0);
  angle_[i] = row.angles.at(0);
  k_parallel_[i] = row.k_parallel.at(0);
  reflectance_[i] = row.reflectance.at(0);
  transmittance_[i] = row.transmittance.at(0);
  absorptance_[i] = row.absorptance.at(0);
  steps_[i] = static_cast<double>(r.summary.steps);
  energy_fraction_[i] = r.summary.final_energy_fraction;
  finished_[i] = 1;
  // Every angle has the same grid, materials and gaps, so any run's will do.
  if (!have_static_) take_static_parts(r);
}

RunResults AngleScan::run(const std::function<void(const Progress&)>& progress,
                          const std::function<bool()>& between_steps) {
  using clock = std::chrono::steady_clock;
  const auto start = clock::now();
  const double earlier_wall = wall_seconds_;
  const auto wall = [&] { return earlier_wall + std::chrono::duration<double>(clock::now() - start).count(); };
  std::vector<std::size_t> todo;
  for (std::size_t i = 0; i < angles_.size(); ++i)
    if (finished_[i] == 0) todo.push_back(i);
  const std::size_t finished_before = finished_count();

  std::atomic<bool> stop{false};
  // Between two steps of any run: the caller's hook, by whichever thread finds the lock free (the
  // others go on at once); a `true` from it stops every run at its next step.
  const auto hook = [&]() -> bool {
    if (stop.load(std::memory_order_relaxed)) return true;
    if (!between_steps) return false;
    std::unique_lock lock(mutex_, std::try_to_lock);
    if (!lock.owns_lock()) return false;
    wall_seconds_ = wall();  // the counters a checkpoint taken now stores
    if (between_steps()) stop = true;
    return stop.load();
  };
  std::exception_ptr failure;
  const int n = static_cast<int>(todo.size());
#pragma omp parallel for schedule(dynamic, 1)
  for (int t = 0; t < n; ++t) {
    if (stop.load()) continue;  // an OpenMP loop cannot break: skip what is left
    try {
      BlochRun run(one_angle(scene_, angles_[todo[t]]));
      const RunResults r = run.run({}, hook);
      if (r.summary.stop_reason == "interrupted") continue;  // dropped: it runs again on resume
      std::lock_guard lock(mutex_);
      store(todo[t], r);
      if (progress) {
        const std::size_t done = finished_count();
        const double elapsed = std::chrono::duration<double>(clock::now() - start).count();
        Progress p;
        p.step = static_cast<long>(done);
        p.planned_steps = static_cast<long>(angles_.size());
        p.steps_per_second = (done - finished_before) / elapsed;
        p.eta_seconds = (angles_.size() - done) / p.steps_per_second;
        progress(p);
      }
    } catch (...) {
#pragma omp critical(angle_scan_failure)
      if (!failure) failure = std::current_exception();
      stop = true;
    }
  }
  wall_seconds_ = wall();
  if (failure) std::rethrow_exception(failure);
  stop_reason_ = finished_count() < angles_.size() ? "interrupted" : "";
  return results();
}

RunResults AngleScan::results() {
  if (!have_static_) {  // no run finished in this process: build one (not run) for the grid and materials
    BlochRun first(one_angle(scene_, angles_.front()));
    take_static_parts(first.results());
  }
  RunResults out = static_;
  ReflectanceResult& table = out.reflectance.front();
  long total_steps = 0;
  for (std::size_t i = 0; i < angles_.size(); ++i) {
    if (finished_[i] == 0) continue;
    table.omegas.push_back(omega_[i]);
    table.angles.push_back(angle_[i]);
    table.k_parallel.push_back(k_parallel_[i]);
    table.reflectance.push_back(reflectance_[i]);
    table.transmittance.push_back(transmittance_[i]);
    table.absorptance.push_back(absorptance_[i]);
    total_steps += static_cast<long>(steps_[i]);
  }
  RunSummary& s = out.summary;
  s.steps = total_steps;
  s.time_step = dt_;
  s.simulated_time = total_steps * dt_;
  s.wall_seconds = wall_seconds_;
  s.cell_updates_per_second = wall_seconds_ > 0 ? total_steps * static_cast<double>(grid_.cell_count()) / wall_seconds_ : 0;
  s.stop_reason = stop_reason_.empty() ? fmt::format("angle scan ({} runs)", angles_.size()) : stop_reason_;
  s.final_energy_fraction = energy_fraction_.front();  // the first angle's, as a run of it reports
  return out;
}

StateCounters AngleScan::state_counters() const {
  return {.step = static_cast<long>(finished_count()), .wall_seconds = wall_seconds_};
}

void AngleScan::restore_counters(const StateCounters& c) {
  wall_seconds_ = c.wall_seconds;
  stop_reason_.clear();
}

StateArrays AngleScan::state_arrays() {
  StateArrays s;
  s.add_vector("angle_scan/finished", finished_);
  s.add_vector("angle_scan/omega", omega_);
  s.add_vector("angle_scan/angle", angle_);
  s.add_vector("angle_scan/k_parallel", k_parallel_);
  s.add_vector("angle_scan/reflectance", reflectance_);
  s.add_vector("angle_scan/transmittance", transmittance_);
  s.add_vector("angle_scan/absorptance", absorptance_);
  s.add_vector("angle_scan/steps", steps_);
  s.add_vector("angle_scan/final_energy_fraction", energy_fraction_);
  return s;
}

RunResults run_angle_scan(const Scene& scene, const std::function<void(const Progress&)>& progress) {
  return AngleScan(scene).run(progress);
}

ModelSummary plan_angle_scan(const Scene& scene) {
  const std::vector<double>& angles = scene.bloch_waves.front().scan_angles;
  // Every angle planned: the pulse, and so the run's length, follows each angle's distance from
  // grazing incidence, so the ends of a scan alone over- or underestimate it several-fold.
  ModelSummary m = BlochRun::plan(one_angle(scene, angles.front()));
  for (std::size_t k = 1; k < angles.size(); ++k) m.steps += BlochRun::plan(one_angle(scene, angles[k])).steps;
  m.mesh_notes.push_back(fmt::format("angle scan: {} runs from {:.4g} to {:.4g} deg, {} at a time; steps below are "
                                     "for all runs together",
                                     angles.size(), angles.front() * 180 / constants::pi,
                                     angles.back() * 180 / constants::pi, omp_get_max_threads()));
  return m;
}

}  // namespace yeegap::solver
