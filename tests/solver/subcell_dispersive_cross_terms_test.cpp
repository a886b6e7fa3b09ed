// Off-diagonal averaging terms at metal interfaces (solver/subcell_dispersive_cross_terms.h): the
// D->E operator is symmetric (the response of E_c to a kick of D_d equals that of E_d to a kick of
// D_c; with passive parts, the condition for a stable update, Werner & Cary, J. Comput. Phys. 226,
// 1085 (2007), abstract); a face parallel to the grid gets exactly the diagonal average; metal
// spheres in a closed box, nearly lossless and with the time-step cap at work, stay bounded over 1e5
// steps; a resumed run matches bit for bit.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstring>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/library.h"
#include "solver/material_map.h"
#include "solver/mixed_cells.h"
#include "solver/simulation.h"
#include "solver/simulation_state.h"
#include "solver/subcell_average.h"
#include "solver/subcell_dispersive_cross_terms.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

Scene metal_sphere_box(int n, const materials::PoleSet& metal, double radius_cells) {
  Scene s = testing::vacuum_box({n, n, n}, 1e-9, testing::all_edges(EdgeKind::periodic));
  s.domain.center = {0, 0, 0};
  s.domain.averaging = true;
  s.materials[0].name = "water";
  s.materials[0].poles.eps_inf = 1.333 * 1.333;
  MaterialSpec m;
  m.name = "metal";
  m.poles = metal;
  s.materials.push_back(m);
  s.bodies.push_back({geometry::make_sphere({0.23e-9, -0.31e-9, 0.17e-9}, radius_cells * 1e-9), 1, {}});
  return s;
}

DipoleSpec kick(Vec3 at) {
  DipoleSpec dip;
  dip.position = at;
  dip.direction = {0.6, 0.64, 0.48};
  dip.waveform.omega_min = 2 * pi * c0 / 900e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 300e-9;
  return dip;
}

TEST(SubcellDispersiveCrossTerms, AKickOfDdMovesEcAsAKickOfDcMovesEd) {
  const Scene s = metal_sphere_box(14, materials::find_material("Au")->poles, 4.3);
  const Grid g = Grid::uniform(s.domain);
  const BlockLayout L = BlockLayout::of(g.n);
  MaterialIndex mi;
  fill_material_index(s, g, L, mi);
  const double dt = 0.99 * g.courant_limit();
  const std::vector<MixedCell> mixed = find_mixed_cells(s, g, L, mi);
  SubcellDispersiveCrossTerms terms(s, g, L, mi, mixed, 1, 0, dt, 1 / (0.99 * 0.99));
  ASSERT_FALSE(terms.empty());
  const std::size_t n = terms.sites().size();
  std::vector<std::size_t> identity(n);
  for (std::size_t q = 0; q < n; ++q) identity[q] = q;
  terms.bind(identity);
  // Response of every site to a unit kick of D at site q, from rest (a fresh copy each time).
  auto response = [&](std::size_t q) {
    SubcellDispersiveCrossTerms fresh = terms;
    Fields f(L);
    std::vector<real> increment(n, real(0));
    increment[q] = 1;
    fresh.add(increment, f);
    std::vector<double> e(n);
    for (std::size_t p = 0; p < n; ++p) e[p] = f.c[static_cast<int>(terms.sites()[p].component)][terms.sites()[p].offset];
    return e;
  };
  double largest = 0, worst = 0;
  int coupled_pairs = 0;
  for (std::size_t q = 0; q < n; q += 7) {
    const std::vector<double> from_q = response(q);
    for (std::size_t p = 0; p < n; ++p) {
      if (p == q || from_q[p] == 0) continue;
      const double back = response(p)[q];
      largest = std::max(largest, std::abs(from_q[p]));
      worst = std::max(worst, std::abs(from_q[p] - back));
      if (terms.sites()[p].component != terms.sites()[q].component) ++coupled_pairs;
    }
  }
  std::printf("%zu sites, %zu triples, %d coupled pairs probed, largest %.3e, worst asymmetry %.1e\n", n,
              terms.triples(), coupled_pairs, largest, worst);
  EXPECT_GT(coupled_pairs, 100);
  EXPECT_GT(largest, 1e-2);
  EXPECT_LT(worst, 1e-6 * largest);
}

TEST(SubcellDispersiveCrossTerms, AFaceParallelToTheGridGetsExactlyTheDiagonalAverage) {
  // A gold slab across a periodic box, its faces inside cells: the triples must reproduce the
  // diagonal average exactly (each location's own fill along and across the face), so a run with
  // them equals one without, up to float round-off.
  auto run = [](bool cross) {
    Scene s = testing::vacuum_box({6, 6, 24}, 1e-9, testing::all_edges(EdgeKind::periodic));
    s.domain.center = {0, 0, 0};
    s.domain.averaging = true;
    s.domain.averaging_cross_terms = cross;
    MaterialSpec au;
    au.name = "Au";
    au.poles = materials::find_material("Au")->poles;
    s.materials.push_back(au);
    s.bodies.push_back({geometry::make_slab(2, -3.3e-9, 4.6e-9), 1, {}});
    s.dipoles.push_back(kick({0.2e-9, 0.1e-9, 8.5e-9}));
    Simulation sim(s);
    if (cross) EXPECT_FALSE(sim.subcell_average()->dispersive_cross_terms().empty());
    for (int k = 0; k < 3000; ++k) sim.step();
    return std::array<std::vector<real>, 3>{
        std::vector<real>(sim.fields().c[0].begin(), sim.fields().c[0].end()),
        std::vector<real>(sim.fields().c[1].begin(), sim.fields().c[1].end()),
        std::vector<real>(sim.fields().c[2].begin(), sim.fields().c[2].end())};
  };
  const auto with = run(true), without = run(false);
  double largest = 0, worst = 0;
  for (int c = 0; c < 3; ++c)
    for (std::size_t i = 0; i < with[c].size(); ++i) {
      largest = std::max(largest, static_cast<double>(std::abs(without[c][i])));
      worst = std::max(worst, static_cast<double>(std::abs(with[c][i] - without[c][i])));
    }
  std::printf("flat gold faces: largest E %.3e, largest difference with the triples %.1e\n", largest, worst);
  EXPECT_GT(largest, 0);
  EXPECT_LT(worst, 1e-4 * largest);
}

// A closed periodic box: the energy a dipole pulse leaves can only slosh around and fall; an update
// that is not passive would grow it exponentially (the coupling of a trial did, 1e14-fold between
// steps 5e4 and 1e5 with this nearly lossless Drude metal). Largest energy of the last 1e4 steps over
// that shortly after the pulse.
double energy_growth(const materials::PoleSet& metal, double courant, std::size_t* drawn_in) {
  Scene s = metal_sphere_box(12, metal, 3.6);
  s.domain.courant_safety = courant;
  s.dipoles.push_back(kick({4.5e-9, 0.5e-9, 0}));
  Simulation sim(s);
  *drawn_in = 0;
  std::size_t triples = 0;
  for (const SubcellDispersiveCrossTerms& t : sim.subcell_average()->dispersive_cross_terms())
    *drawn_in += t.drawn_in(), triples += t.triples();
  EXPECT_GT(triples, 500u);
  double early = 0, late = 0;
  constexpr int steps = 100000;
  for (int n = 0; n < steps; ++n) {
    sim.step();
    if (n >= 2000 && n < 3000 && n % 50 == 0) early = std::max(early, sim.field_energy());
    if (n >= steps - 10000 && n % 50 == 0) late = std::max(late, sim.field_energy());
  }
  std::printf("courant %.3f: %zu of %zu triples drawn in, late/early energy %.3e\n", courant, *drawn_in, triples,
              late / early);
  return late / early;
}

TEST(SubcellDispersiveCrossTerms, NearlyLosslessMetalSpheresKeepTheirEnergyBoundedOverALongRun) {
  // Drude metal with a plasma frequency of silver's order and a damping 100 times below a real
  // metal's (values of our own making), in water.
  materials::PoleSet drude;
  drude.eps_inf = 1.0;
  drude.drude.push_back({1.37e16, 1e12});
  std::size_t drawn = 0;
  const double loose = energy_growth(drude, 0.9, &drawn);
  EXPECT_TRUE(std::isfinite(loose));
  EXPECT_LT(loose, 2.0);
  // At the Courant limit with eps_inf 1 the series fills of some triples must be drawn in.
  const double tight = energy_growth(drude, 0.999, &drawn);
  EXPECT_GT(drawn, 0u);
  EXPECT_TRUE(std::isfinite(tight));
  EXPECT_LT(tight, 2.0);
  // Critical-point gold (an implicit E share in its update), Etchegoin et al., J. Chem. Phys. 125,
  // 164705 (2006): lossy, so the energy falls.
  const double gold = energy_growth(materials::find_material("Au_critical_points")->poles, 0.99, &drawn);
  EXPECT_LT(gold, 1.0);
}

TEST(SubcellDispersiveCrossTerms, ARunResumedFromItsStateArraysMatchesAnUninterruptedOneBitForBit) {
  Scene s = metal_sphere_box(10, materials::find_material("Au")->poles, 3.1);
  s.dipoles.push_back(kick({3.5e-9, 0.5e-9, 0}));
  Simulation whole(s), first(s), resumed(s);
  for (int n = 0; n < 300; ++n) whole.step(), first.step();
  const std::vector<StateArray> from = first.state_arrays().list(), to = resumed.state_arrays().list();
  ASSERT_EQ(from.size(), to.size());
  bool has_cross = false;
  for (std::size_t a = 0; a < from.size(); ++a) {
    ASSERT_EQ(from[a].name, to[a].name);
    ASSERT_EQ(from[a].bytes(), to[a].bytes());
    std::memcpy(to[a].data, from[a].data, from[a].bytes());
    has_cross = has_cross || from[a].name.find("dispersive_cross") != std::string::npos;
  }
  EXPECT_TRUE(has_cross);
  resumed.restore_counters(first.state_counters());
  for (int n = 0; n < 300; ++n) whole.step(), resumed.step();
  for (int c = 0; c < 6; ++c)
    EXPECT_EQ(std::memcmp(whole.fields().c[c].data(), resumed.fields().c[c].data(), whole.fields().c[c].size() * sizeof(real)), 0)
        << component_names[c];
}

}  // namespace
}  // namespace yeegap::solver
