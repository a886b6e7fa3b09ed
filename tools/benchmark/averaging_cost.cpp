// Gold-sphere box for the cost of subcell averaging (see averaging_cost.h): a cube of `cells` cells
// of 1 nm, periodic, water as a constant index, a sphere of Rakic gold (library "Au": one Drude and
// five Lorentz poles) of radius cells/3, kicked by a dipole pulse. Demo sizes of our own.
#include "tools/benchmark/averaging_cost.h"

#include <chrono>
#include <vector>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/library.h"
#include "solver/engine/simulation.h"
#include "tools/benchmark/timing.h"

namespace yeegap::benchmark {

namespace {

constexpr double cell_size = 1e-9;  // m
constexpr int warmup_steps = 20;

solver::Scene gold_sphere_box(int cells, double radius, bool averaging, bool cross_terms) {
  solver::Scene s;
  s.file = "benchmark";
  s.title = "gold sphere in water for the averaging-cost benchmark";
  s.domain.step = {cell_size, cell_size, cell_size};
  s.domain.size = {cells * cell_size, cells * cell_size, cells * cell_size};
  s.domain.edges.fill(solver::EdgeKind::periodic);
  s.domain.averaging = averaging;
  s.domain.averaging_cross_terms = cross_terms;
  s.materials.resize(2);
  s.materials[0].name = "water";
  s.materials[0].poles.eps_inf = 1.333 * 1.333;
  s.materials[1].name = "Au";
  s.materials[1].poles = materials::find_material("Au")->poles;
  // Off the nodes, so the surface cuts cells in every way.
  const Vec3 centre = s.domain.center + Vec3{0.23 * cell_size, -0.31 * cell_size, 0.17 * cell_size};
  s.bodies.push_back({geometry::make_sphere(centre, radius), 1, {}});
  solver::DipoleSpec d;
  d.position = centre + Vec3{radius + 3 * cell_size, 0.2 * cell_size, 0.1 * cell_size};
  d.direction = {0.6, 0.64, 0.48};
  d.waveform.omega_min = 2 * constants::pi * constants::c0 / 900e-9;
  d.waveform.omega_max = 2 * constants::pi * constants::c0 / 400e-9;
  s.dipoles.push_back(d);
  s.stop.max_steps = 1;  // step() is called directly
  return s;
}

}  // namespace

AveragingCost measure_averaging_cost(int cells, int steps, int batches) {
  AveragingCost cost;
  cost.cells = cells;
  cost.radius_cells = cells / 3;
  const double radius = cost.radius_cells * cell_size;
  solver::Simulation plain(gold_sphere_box(cells, radius, false, false));
  solver::Simulation diagonal(gold_sphere_box(cells, radius, true, false));
  solver::Simulation full(gold_sphere_box(cells, radius, true, true));
  cost.averaged_locations = full.summary().mixed_cells;
  std::vector<solver::Simulation*> runs{&plain, &diagonal, &full};
  for (solver::Simulation* r : runs)
    for (int n = 0; n < warmup_steps; ++n) r->step();
  // Batches of the three alternate, so all see the same spells of load from other work.
  std::vector<std::vector<double>> rates(3);
  const double updates = static_cast<double>(cells) * cells * cells * steps;
  for (int b = 0; b < batches; ++b)
    for (std::size_t k = 0; k < runs.size(); ++k) {
      const auto t0 = std::chrono::steady_clock::now();
      for (int n = 0; n < steps; ++n) runs[k]->step();
      rates[k].push_back(updates / seconds_since(t0) / 1e6);
    }
  cost.staircase = spread_of(rates[0]).best;
  cost.diagonal = spread_of(rates[1]).best;
  cost.full = spread_of(rates[2]).best;
  return cost;
}

}  // namespace yeegap::benchmark
