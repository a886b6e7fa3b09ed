// One 2D run of an infinite dielectric cylinder (index 2, radius 50 nm, in air, axis along the
// invariant z, centre half a cell off the nodes) lit by a plane wave, with or without subcell
// averaging: the RMS relative error of its scattering cross section at 400-900 nm against the
// series solution (Bohren & Huffman, Absorption and Scattering of Light by Small Particles, Wiley
// 1983, ch. 8; materials/mie_cylinder.h).
#pragma once

#include <cmath>
#include <cstdio>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/mie_cylinder.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver::testing {

/// `shift` moves the centre by that fraction of a cell along x and y (0.5: half a cell off the nodes);
/// `cross_terms` false keeps only the diagonal of the averaged tensor (for comparisons).
inline double dielectric_cylinder_rms_error(materials::CylinderPolarization pol, double cells_per_radius,
                                            bool averaging, double shift = 0.5, bool cross_terms = true) {
  using constants::c0;
  using constants::pi;
  const double radius = 50e-9, d = radius / cells_per_radius;
  const int n = static_cast<int>(std::ceil(140e-9 / d)) + 34;  // 65 nm box, 3 free cells, 12-cell absorbers
  Scene s = vacuum_box({n, n, 1}, d,
                       {EdgeKind::cpml, EdgeKind::cpml, EdgeKind::cpml, EdgeKind::cpml,
                        EdgeKind::periodic, EdgeKind::periodic});
  s.domain.cpml.cells = 12;
  s.domain.averaging = averaging;
  s.domain.averaging_cross_terms = cross_terms;
  MaterialSpec glass;
  glass.name = "n2";
  glass.poles.eps_inf = 4.0;
  s.materials.push_back(glass);
  s.bodies.push_back({geometry::make_cylinder({shift * d, shift * d, 0}, {0, 0, 1}, radius, 1.0), 1, {}});
  PlaneWaveSpec w;
  w.box = {{-65e-9, -65e-9, -1}, {65e-9, 65e-9, 1}};
  w.axis = 0;
  w.sign = +1;
  w.polarization = pol == materials::CylinderPolarization::tm ? Vec3{0, 0, 1} : Vec3{0, 1, 0};
  w.waveform.omega_min = 2 * pi * c0 / 900e-9;
  w.waveform.omega_max = 2 * pi * c0 / 400e-9;
  s.plane_waves.push_back(w);
  CrossSectionSpec cs;
  cs.name = "cylinder";
  for (int q = 0; q <= 10; ++q) cs.omegas.push_back(2 * pi * c0 / (400e-9 + 50e-9 * q));
  s.cross_sections.push_back(cs);
  s.stop.energy_below = 1e-7;
  const RunResults r = Simulation(s).run();
  const CrossSectionResult& x = r.cross_sections.at(0);
  double sum2 = 0;
  for (std::size_t q = 0; q < x.omegas.size(); ++q) {
    const double lambda = 2 * pi * c0 / x.omegas[q];
    const double rel =
        x.scattering[q] / materials::mie_cylinder_cross_sections(radius, lambda, {4.0, 0.0}, pol).scattering - 1;
    sum2 += rel * rel;
  }
  const double rms = std::sqrt(sum2 / x.omegas.size());
  std::printf("%s, %5.2f cells per radius, shift %.2f, averaging %-13s: RMS %.3f %%\n",
              pol == materials::CylinderPolarization::tm ? "TM" : "TE", cells_per_radius, shift,
              averaging ? (cross_terms ? "on" : "diagonal only") : "off", 100 * rms);
  std::fflush(stdout);
  return rms;
}

}  // namespace yeegap::solver::testing
