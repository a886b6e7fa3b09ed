// One TFSF run of a dielectric sphere (index 2, radius 50 nm, in air, a quarter domain) at a chosen
// number of cells per radius, averaged or not: the RMS relative error of its scattering over 400-900
// nm against Mie theory (Bohren & Huffman 1983, ch. 4). 16 absorbing cells: 8 left a floor of
// 0.2-0.3 % that grew in finer cells (docs/measurements.md).
#pragma once

#include <cmath>
#include <cstdio>
#include <vector>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/mie_sphere.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver::testing {

inline double dielectric_sphere_rms_error(double cells_per_radius, bool averaging, bool cross_terms = true) {
  using constants::c0;
  using constants::pi;
  constexpr double radius = 50e-9;
  const double d = radius / cells_per_radius;
  const double margin = std::max(15e-9, 3 * d);
  const int box_cells = static_cast<int>(std::ceil((radius + margin) / d));
  const int absorber = 16, half = std::max(box_cells + 4 + absorber, 2 * absorber + 2);  // the check wants 2 layers + 2
  Scene s = vacuum_box({half, half, 2 * half}, d, all_edges(EdgeKind::cpml));
  s.domain.center = {half * d / 2, half * d / 2, 0};
  s.domain.edges[0] = EdgeKind::mirror_odd;
  s.domain.edges[2] = EdgeKind::mirror_even;
  s.domain.cpml.cells = absorber;
  s.domain.averaging = averaging;
  s.domain.averaging_cross_terms = cross_terms;
  MaterialSpec glass;
  glass.name = "n2";
  glass.poles.eps_inf = 4.0;
  s.materials.push_back(glass);
  // Off the grid's symmetry points along z (a quarter of a cell), as a sphere placed at random would be.
  s.bodies.push_back({geometry::make_sphere({0, 0, 0.25 * d}, radius), 1, {}});
  PlaneWaveSpec w;
  const double b = box_cells * d;
  w.box = {{0, 0, -b}, {b, b, b}};
  w.axis = 2;
  w.sign = +1;
  w.polarization = {1, 0, 0};
  w.waveform.omega_min = 2 * pi * c0 / 900e-9;
  w.waveform.omega_max = 2 * pi * c0 / 400e-9;
  s.plane_waves.push_back(w);
  CrossSectionSpec cs;
  cs.name = "sphere";
  for (int q = 0; q <= 20; ++q) cs.omegas.push_back(2 * pi * c0 / (400e-9 + 25e-9 * q));
  s.cross_sections.push_back(cs);
  s.stop.energy_below = 1e-7;
  Simulation sim(s);
  const RunResults r = sim.run();
  const CrossSectionResult& x = r.cross_sections.at(0);
  double sum2 = 0;
  for (std::size_t q = 0; q < x.omegas.size(); ++q) {
    const double lambda = 2 * pi * c0 / x.omegas[q];
    const double rel = x.scattering[q] / materials::mie_sphere_cross_sections(radius, lambda, {4.0, 0.0}).scattering - 1;
    sum2 += rel * rel;
  }
  const double rms = std::sqrt(sum2 / x.omegas.size());
  std::printf("n = 2 sphere, R/cell %5.2f, averaging %-13s: C_sca RMS error %.3f %% (%ld steps)\n", cells_per_radius,
              averaging ? (cross_terms ? "on" : "diagonal only") : "off", 100 * rms, r.summary.steps);
  std::fflush(stdout);
  return rms;
}

}  // namespace yeegap::solver::testing
