// Angle scan (see angle_scan.h).
#include "solver/angle_scan.h"

#include <omp.h>

#include <chrono>
#include <exception>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "solver/bloch_run.h"

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

// One table of the orders of every angle's run, row i the i-th angle (each run has one row).
DiffractionOrdersResult merge_orders(const std::vector<DiffractionOrdersResult>& runs) {
  DiffractionOrdersResult out = runs.front();
  out.angle_scan = true;
  out.omegas.clear(), out.incidence_angles.clear(), out.reflected_sum.clear(), out.transmitted_sum.clear();
  out.row.clear(), out.side.clear(), out.order_b.clear(), out.order_c.clear();
  out.direction.clear(), out.angle.clear(), out.efficiency.clear();
  for (std::size_t i = 0; i < runs.size(); ++i) {
    const DiffractionOrdersResult& r = runs[i];
    out.omegas.push_back(r.omegas.at(0));
    out.incidence_angles.push_back(r.incidence_angles.at(0));
    out.reflected_sum.push_back(r.reflected_sum.at(0));
    out.transmitted_sum.push_back(r.transmitted_sum.at(0));
    for (std::size_t e = 0; e < r.row.size(); ++e) {
      out.row.push_back(static_cast<int>(i));
      out.side.push_back(r.side[e]);
      out.order_b.push_back(r.order_b[e]);
      out.order_c.push_back(r.order_c[e]);
      out.direction.push_back(r.direction[e]);
      out.angle.push_back(r.angle[e]);
      out.efficiency.push_back(r.efficiency[e]);
    }
  }
  return out;
}

}  // namespace

RunResults run_angle_scan(const Scene& scene, const std::function<void(const Progress&)>& progress) {
  YG_CHECK(scene.bloch_waves.size() == 1 && !scene.bloch_waves.front().scan_angles.empty(),
           "an angle scan needs one plane_wave with angles");
  const std::vector<double>& angles = scene.bloch_waves.front().scan_angles;
  const int n = static_cast<int>(angles.size());
  // Refuse what cannot run before any thread starts: every angle's scene is prepared here.
  for (double a : angles) (void)BlochRun::prepare(one_angle(scene, a));

  using clock = std::chrono::steady_clock;
  const auto start = clock::now();
  std::vector<ReflectanceResult> rows(n);
  std::vector<DiffractionOrdersResult> orders(n);
  std::vector<long> steps(n, 0);
  RunResults first;
  std::exception_ptr failure;
  int done = 0;
#pragma omp parallel for schedule(dynamic, 1)
  for (int i = 0; i < n; ++i) {
    try {
      BlochRun run(one_angle(scene, angles[i]));
      RunResults r = run.run();
      rows[i] = r.reflectance.at(0);
      if (!r.orders.empty()) orders[i] = r.orders.front();
      steps[i] = r.summary.steps;
      if (i == 0) first = std::move(r);
    } catch (...) {
#pragma omp critical(angle_scan_failure)
      if (!failure) failure = std::current_exception();
    }
#pragma omp critical(angle_scan_progress)
    {
      ++done;
      if (progress) {
        Progress p;
        p.step = done;
        p.planned_steps = n;
        const double elapsed = std::chrono::duration<double>(clock::now() - start).count();
        p.steps_per_second = done / elapsed;
        p.eta_seconds = (n - done) / p.steps_per_second;
        progress(p);
      }
    }
  }
  if (failure) std::rethrow_exception(failure);

  RunResults out = std::move(first);
  out.fluxes.clear();
  out.field_maps.clear();
  out.probes.clear();
  ReflectanceResult table = rows.front();
  table.angle_scan = true;
  table.omegas.clear(), table.angles.clear(), table.k_parallel.clear();
  table.reflectance.clear(), table.transmittance.clear(), table.absorptance.clear();
  long total_steps = 0;
  for (int i = 0; i < n; ++i) {
    table.omegas.push_back(rows[i].omegas.at(0));
    table.angles.push_back(rows[i].angles.at(0));
    table.k_parallel.push_back(rows[i].k_parallel.at(0));
    table.reflectance.push_back(rows[i].reflectance.at(0));
    table.transmittance.push_back(rows[i].transmittance.at(0));
    table.absorptance.push_back(rows[i].absorptance.at(0));
    total_steps += steps[i];
  }
  out.reflectance = {table};
  if (!scene.orders.empty()) out.orders = {merge_orders(orders)};
  out.summary.steps = total_steps;
  out.summary.wall_seconds = std::chrono::duration<double>(clock::now() - start).count();
  out.summary.simulated_time = total_steps * out.summary.time_step;
  out.summary.stop_reason = fmt::format("angle scan ({} runs)", n);
  return out;
}

ModelSummary plan_angle_scan(const Scene& scene) {
  const std::vector<double>& angles = scene.bloch_waves.front().scan_angles;
  ModelSummary m = BlochRun::plan(one_angle(scene, angles.front()));
  const ModelSummary last = BlochRun::plan(one_angle(scene, angles.back()));
  m.steps = std::max(m.steps, last.steps) * static_cast<long>(angles.size());
  m.mesh_notes.push_back(fmt::format("angle scan: {} runs from {:.4g} to {:.4g} deg, {} at a time; steps below are "
                                     "for all runs together",
                                     angles.size(), angles.front() * 180 / constants::pi,
                                     angles.back() * 180 / constants::pi, omp_get_max_threads()));
  return m;
}

}  // namespace yeegap::solver
