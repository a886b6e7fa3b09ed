// Mirror edges: a problem with two symmetry planes run in a quarter of the domain must give the
// whole-domain answer (the check: within 1e-4 relative). Image theory: a mirror_odd plane
// is an electric wall (tangential E odd), mirror_even a magnetic wall (tangential E even); e.g.
// Jin, The Finite Element Method in Electromagnetics, 2nd ed. (2002), sec. on symmetry planes
// (from memory); the symmetry of each case is derived in its comment.
#include <gtest/gtest.h>

#include <cmath>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

constexpr double d = 5e-9;

Scene sphere_scene(bool quarter) {
  Scene s = testing::vacuum_box({48, 48, 48}, d, testing::all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = 8;
  if (quarter) {
    // x, y in [0, 120 nm]: half the cells along x and y, low faces on the symmetry planes.
    s.domain.size = {24 * d, 24 * d, 48 * d};
    s.domain.center = {12 * d, 12 * d, 0};
    // E_inc along x is normal to the x = 0 plane and tangential to y = 0. Reflecting x -> -x maps
    // the scene onto itself with E -> -E: tangential E odd, an electric wall. Reflecting y -> -y
    // leaves it unchanged: tangential E even, a magnetic wall.
    s.domain.edges[0] = EdgeKind::mirror_odd;
    s.domain.edges[2] = EdgeKind::mirror_even;
  }
  MaterialSpec glass;
  glass.name = "n2";
  glass.poles.eps_inf = 4.0;
  s.materials.push_back(glass);
  s.bodies.push_back({geometry::make_sphere({0, 0, 0}, 40e-9), 1, {}});
  PlaneWaveSpec w;
  w.box = {{quarter ? 0 : -60e-9, quarter ? 0 : -60e-9, -60e-9}, {60e-9, 60e-9, 60e-9}};
  w.axis = 2;
  w.sign = +1;
  w.polarization = {1, 0, 0};
  w.waveform.omega_min = 2 * pi * c0 / 900e-9;
  w.waveform.omega_max = 2 * pi * c0 / 400e-9;
  s.plane_waves.push_back(w);
  CrossSectionSpec cs;
  cs.name = "sphere";
  cs.omegas = {2 * pi * c0 / 450e-9, 2 * pi * c0 / 600e-9, 2 * pi * c0 / 800e-9};
  s.cross_sections.push_back(cs);
  s.stop.after = 1500 * 0.99 * d / (c0 * std::sqrt(3.0));
  return s;
}

TEST(MirrorSymmetry, QuarterDomainSphereCrossSectionsMatchTheWholeDomain) {
  const RunResults full = Simulation(sphere_scene(false)).run();
  const RunResults quarter = Simulation(sphere_scene(true)).run();
  const auto& f = full.cross_sections[0];
  const auto& q = quarter.cross_sections[0];
  for (std::size_t k = 0; k < f.omegas.size(); ++k) {
    std::printf("%.0f nm: C_sca whole %.6e, quarter %.6e (rel %.1e)\n", 2 * pi * c0 / f.omegas[k] * 1e9, f.scattering[k],
                q.scattering[k], q.scattering[k] / f.scattering[k] - 1);
    EXPECT_NEAR(q.scattering[k] / f.scattering[k], 1.0, 1e-4);
    EXPECT_NEAR(q.extinction[k] / f.extinction[k], 1.0, 1e-4);
  }
}

Scene dipole_scene(bool quarter) {
  Scene s = testing::vacuum_box({40, 40, 40}, d, testing::all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = 8;
  if (quarter) {
    s.domain.size = {20 * d, 20 * d, 40 * d};
    s.domain.center = {10 * d, 10 * d, 0};
    // A z dipole on both planes is its own mirror image in x and in y: tangential E even.
    s.domain.edges[0] = EdgeKind::mirror_even;
    s.domain.edges[2] = EdgeKind::mirror_even;
  }
  DipoleSpec dip;
  dip.direction = {0, 0, 1};
  dip.waveform.omega_min = 2 * pi * c0 / 900e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 400e-9;
  s.dipoles.push_back(dip);
  FluxSpec box;
  box.name = "box";
  box.region = {{quarter ? 0 : -50e-9, quarter ? 0 : -50e-9, -50e-9}, {50e-9, 50e-9, 50e-9}};
  box.omegas = {2 * pi * c0 / 500e-9, 2 * pi * c0 / 700e-9};
  s.fluxes.push_back(box);
  s.stop.after = 1200 * 0.99 * d / (c0 * std::sqrt(3.0));
  return s;
}

TEST(MirrorSymmetry, QuarterDomainDipolePowerMatchesTheWholeDomain) {
  const RunResults full = Simulation(dipole_scene(false)).run();
  const RunResults quarter = Simulation(dipole_scene(true)).run();
  for (std::size_t k = 0; k < full.fluxes[0].power.size(); ++k) {
    const double ratio = quarter.fluxes[0].power[k] / full.fluxes[0].power[k];
    std::printf("dipole power quarter/whole: %.7f\n", ratio);
    EXPECT_NEAR(ratio, 1.0, 1e-4);
  }
}

}  // namespace
}  // namespace yeegap::solver
