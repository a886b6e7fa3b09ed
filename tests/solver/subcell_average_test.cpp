// Subcell averaging (solver/media/subcell_average.h): the mixed locations a slab face and a sphere make,
// the response of a mixed location against the anisotropic average of Farjadpour et al., Opt. Lett.
// 31, 2972 (2006), built from the scheme's own discrete permittivities (materials/
// discrete_permittivity.h), and a long run with averaged gold that stays bounded.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <cstring>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/discrete_permittivity.h"
#include "materials/library.h"
#include "solver/media/material_map.h"
#include "solver/engine/simulation.h"
#include "solver/engine/simulation_state.h"
#include "solver/media/subcell_average.h"
#include "resume_check.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;
using cplx = std::complex<double>;

constexpr double h = 1e-9;

Scene periodic_box(int n) { return testing::vacuum_box({n, n, n}, h, testing::all_edges(EdgeKind::periodic)); }

MaterialSpec material(const char* name, const materials::PoleSet& p) {
  MaterialSpec m;
  m.name = name;
  m.poles = p;
  return m;
}

TEST(SubcellAverage, SlabFaceInsideACellGivesItsFillAndNormalShare) {
  // Slab z < 0.3 nm in 1 nm cells: Ex at the node z = 0 has the box -0.5..0.5 nm, 80 % inside,
  // and lies along the face (no normal share); Ez at z = 0.5 nm has the box 0..1 nm, 30 % inside,
  // and lies along the normal (share 1).
  Scene s = periodic_box(4);
  s.domain.center = {0, 0, 0};
  materials::PoleSet glass;
  glass.eps_inf = 2.25;
  s.materials.push_back(material("glass", glass));
  s.bodies.push_back({geometry::make_slab(2, -10e-9, 0.3e-9), 1, {}});
  const Grid g = Grid::uniform(s.domain);
  const BlockLayout L = BlockLayout::of(g.n);
  MaterialIndex mi;
  fill_material_index(s, g, L, mi);
  const std::vector<MixedCell> cells = find_mixed_cells(s, g, L, mi);
  const int k0 = g.nearest_node(2, 0.0);
  int ex = 0, ez = 0;
  for (const MixedCell& c : cells) {
    EXPECT_EQ(c.inside, 1);
    EXPECT_EQ(c.outside, 0);
    if (c.component == Component::Ex) {
      ++ex;
      EXPECT_NEAR(c.fill, 0.8, 1e-12);
      EXPECT_NEAR(c.normal_share, 0.0, 1e-12);
      EXPECT_EQ(c.offset / L.sz - 1, k0);
    } else if (c.component == Component::Ez) {
      ++ez;
      EXPECT_NEAR(c.fill, 0.3, 1e-12);
      EXPECT_NEAR(c.normal_share, 1.0, 1e-9);
    }
  }
  EXPECT_EQ(ex, 16);  // one plane of 4 x 4 locations each
  EXPECT_EQ(ez, 16);
}

TEST(SubcellAverage, AFaceTwoSlabsShareOnANodeIsAveragedBetweenThemNotWithTheBackground) {
  // Glass (z < 0) and gold (0 <= z < 3 nm) touching at z = 0, a node: Ex there lies exactly on both
  // faces, strictly inside neither. The staircase gives it the later slab (not the background,
  // which would put a cell of it between the layers) and the averaging pairs gold with glass, half
  // and half. This once decided by round-off of the node coordinate and moved an SPR dip by 1 deg.
  Scene s = periodic_box(6);
  s.domain.center = {0, 0, 0};
  materials::PoleSet glass;
  glass.eps_inf = 2.25;
  s.materials.push_back(material("glass", glass));
  s.materials.push_back(material("gold", materials::find_material("Au")->poles));
  s.bodies.push_back({geometry::make_slab(2, -10e-9, 0.0), 1, {}});
  s.bodies.push_back({geometry::make_slab(2, 0.0, 3e-9), 2, {}});
  const Grid g = Grid::uniform(s.domain);
  const int k0 = g.nearest_node(2, 0.0);
  ASSERT_EQ(g.nodes[2][static_cast<std::size_t>(k0)], 0.0);  // exactly on the faces
  EXPECT_EQ(material_at(s, {0, 0, 0}), 2);
  EXPECT_EQ(material_at(s, {0, 0, 3e-9}), 0);   // one body's face alone stays outside it
  const BlockLayout L = BlockLayout::of(g.n);
  MaterialIndex mi;
  fill_material_index(s, g, L, mi);
  int ex = 0;
  for (const MixedCell& c : find_mixed_cells(s, g, L, mi)) {
    if (c.component != Component::Ex || c.offset / L.sz - 1 != k0) continue;
    ++ex;
    EXPECT_EQ(c.inside, 2);
    EXPECT_EQ(c.outside, 1);
    EXPECT_NEAR(c.fill, 0.5, 1e-12);
  }
  EXPECT_EQ(ex, 36);  // one plane of 6 x 6 locations
}

// Drives every mixed location of a small gold (or glass) sphere in water with the same curl pulse
// C(t), exactly as the bulk kernel would (E_k = ca E^n + cb C), and compares the DFT ratio E/D with
//   1/eps_eff = n_c^2 (f/eps_in + (1-f)/eps_out) + (1 - n_c^2) / (f eps_in + (1-f) eps_out),
// each eps the scheme's discrete permittivity at the same time step. Exact up to float round-off;
// tolerance 2e-3 relative (float fields summed over 1.5e5 steps). The off-diagonal terms between
// dielectrics (subcell_cross_terms.h) are switched off: they couple neighbours, which this drive
// leaves at zero, so they are checked on their own (subcell_cross_terms_test.cpp).
double worst_response_error(const materials::PoleSet& inside) {
  Scene s = periodic_box(6);
  s.domain.center = {0, 0, 0};
  materials::PoleSet water;
  water.eps_inf = 1.333 * 1.333;
  s.materials[0] = material("water", water);
  s.materials.push_back(material("inside", inside));
  s.bodies.push_back({geometry::make_sphere({0.2e-9, 0.1e-9, -0.15e-9}, 1.6e-9), 1, {}});
  s.domain.averaging_cross_terms = false;
  const Grid g = Grid::uniform(s.domain);
  const BlockLayout L = BlockLayout::of(g.n);
  MaterialIndex mi;
  fill_material_index(s, g, L, mi);
  const double dt = 1e-18;
  const ECoefficients ec = e_coefficients(s, dt);
  SubcellAverage avg(s, g, L, mi, ec, dt);
  EXPECT_GT(avg.size(), 20u);
  Fields f(L);
  const std::vector<double> lambdas{450e-9, 550e-9, 700e-9};
  const std::size_t n_cells = avg.size();
  std::vector<std::vector<cplx>> e_dft(n_cells, std::vector<cplx>(lambdas.size())), d_dft = e_dft;
  std::vector<double> d(n_cells, 0.0);
  const double t0 = 8e-15, tau = 2e-15, w0 = 2 * pi * c0 / 580e-9;
  // 150 fs: the slowest decay, the Drude current's 1/gamma of 12 fs (Rakic gold), has died out
  // (exp(-12)), so the DFTs hold the whole response.
  const int steps = 150000;
  for (int n = 0; n < steps; ++n) {
    avg.keep(f);
    const double t = (n + 0.5) * dt;
    const double curl = std::exp(-std::pow((t - t0) / tau, 2)) * std::sin(w0 * (t - t0));  // A/m^2, any scale
    for (std::size_t q = 0; q < n_cells; ++q) {
      const MixedCell& c = avg.cells()[q];
      const int m = mi.e[static_cast<int>(c.component)][c.offset];
      real& e = f.c[static_cast<int>(c.component)][c.offset];
      e = ec.ca[m] * e + ec.cb[m] * static_cast<real>(curl);
    }
    avg.apply(f);
    std::vector<cplx> phase;
    for (double l : lambdas) phase.push_back(std::polar(1.0, 2 * pi * c0 / l * (n + 1) * dt));
    for (std::size_t q = 0; q < n_cells; ++q) {
      const MixedCell& c = avg.cells()[q];
      d[q] += dt * curl / constants::eps0;  // D/eps0 at level n+1
      const double e = f.c[static_cast<int>(c.component)][c.offset];
      for (std::size_t w = 0; w < lambdas.size(); ++w) {
        e_dft[q][w] += e * phase[w];
        d_dft[q][w] += d[q] * phase[w];
      }
    }
  }
  double worst = 0;
  for (std::size_t w = 0; w < lambdas.size(); ++w) {
    const double omega = 2 * pi * c0 / lambdas[w];
    const cplx ei = materials::discrete_permittivity(inside, omega, dt);
    const cplx eo = materials::discrete_permittivity(water, omega, dt);
    for (std::size_t q = 0; q < n_cells; ++q) {
      const MixedCell& c = avg.cells()[q];
      const double fl = c.fill, sh = c.normal_share;
      const cplx expected = sh * (fl / ei + (1 - fl) / eo) + (1 - sh) / (fl * ei + (1 - fl) * eo);
      const cplx measured = e_dft[q][w] / d_dft[q][w];
      worst = std::max(worst, std::abs(measured / expected - 1.0));
    }
  }
  return worst;
}

TEST(SubcellAverage, MixedGoldLocationRespondsWithTheAnisotropicAverageOfDiscretePermittivities) {
  const double worst = worst_response_error(materials::find_material("Au")->poles);  // Rakic et al. 1998
  std::printf("gold/water mixed locations: worst |E/D / expected - 1| = %.2e\n", worst);
  EXPECT_LT(worst, 2e-3);
}

TEST(SubcellAverage, MixedCriticalPointGoldRespondsLikewise) {
  // Etchegoin et al., J. Chem. Phys. 125, 164705 (2006): critical points with an implicit E share.
  const materials::LibraryEntry* e = materials::find_material("Au_critical_points");
  ASSERT_NE(e, nullptr);
  const double worst = worst_response_error(e->poles);
  std::printf("critical-point gold/water mixed locations: worst error %.2e\n", worst);
  EXPECT_LT(worst, 2e-3);
}

TEST(SubcellAverage, MixedDielectricLocationHasTheFarjadpourPermittivity) {
  materials::PoleSet glass;
  glass.eps_inf = 4.0;
  const double worst = worst_response_error(glass);
  std::printf("glass/water mixed locations: worst error %.2e\n", worst);
  EXPECT_LT(worst, 1e-4);
}

TEST(SubcellAverage, GoldSphereWithAveragingStaysBoundedOverALongRun) {
  // A gold sphere in a closed periodic box, kicked by a dipole pulse: with no absorber the energy
  // can only fall (gold is lossy); an unstable mixed update would grow without bound.
  Scene s = periodic_box(16);
  s.domain.center = {0, 0, 0};
  s.materials.push_back(material("Au", materials::find_material("Au")->poles));
  s.bodies.push_back({geometry::make_sphere({0.3e-9, -0.2e-9, 0.1e-9}, 4.6e-9), 1, {}});
  DipoleSpec dip;
  dip.position = {6e-9, 0, 0};
  dip.direction = {1, 1, 0.5};
  dip.direction = (1 / norm(dip.direction)) * dip.direction;
  dip.waveform.omega_min = 2 * pi * c0 / 900e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 350e-9;
  s.dipoles.push_back(dip);
  s.domain.averaging = true;
  Simulation sim(s);
  EXPECT_GT(sim.summary().mixed_cells, 300);
  double peak = 0, last = 0;
  for (int n = 0; n < 30000; ++n) {
    sim.step();
    if (n % 500 == 0) last = sim.field_energy(), peak = std::max(peak, last);
  }
  std::printf("energy after 30000 steps: %.3e of its peak\n", last / peak);
  EXPECT_TRUE(std::isfinite(last));
  EXPECT_LT(last, peak);
}

TEST(SubcellAverage, ARunResumedFromItsStateArraysMatchesAnUninterruptedOneBitForBit) {
  // The mixed locations' branch fields and pole currents are part of the checkpoint state.
  Scene s = periodic_box(10);
  s.domain.center = {0, 0, 0};
  s.domain.averaging = true;
  s.materials.push_back(material("Au", materials::find_material("Au")->poles));
  s.bodies.push_back({geometry::make_sphere({0.3e-9, -0.2e-9, 0.1e-9}, 3.1e-9), 1, {}});
  DipoleSpec dip;
  dip.position = {4e-9, 0, 0};
  dip.direction = {0.6, 0.8, 0};
  dip.waveform.omega_min = 2 * pi * c0 / 900e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 350e-9;
  s.dipoles.push_back(dip);
  testing::expect_resumed_run_matches(s, 600, "subcell/");
}

TEST(SubcellAverage, SwitchedOffLeavesThePlainStaircase) {
  Scene s = periodic_box(8);
  s.domain.center = {0, 0, 0};
  materials::PoleSet glass;
  glass.eps_inf = 4.0;
  s.materials.push_back(material("glass", glass));
  s.bodies.push_back({geometry::make_sphere({0, 0, 0}, 2.7e-9), 1, {}});
  s.domain.averaging = false;
  EXPECT_EQ(Simulation(s).summary().mixed_cells, 0);
  s.domain.averaging = true;
  EXPECT_GT(Simulation(s).summary().mixed_cells, 50);
}

}  // namespace
}  // namespace yeegap::solver
