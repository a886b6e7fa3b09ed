// Off-diagonal averaging terms at metal interfaces (subcell_dispersive_cross_terms.h): the D->E operator
// is symmetric (with passive parts, the condition for a stable update: Werner & Cary, J. Comput. Phys.
// 226, 1085 (2007)), also on a graded mesh; a face parallel to the grid gets exactly the diagonal; a
// resumed run matches bit for bit. Long closed-box runs: subcell_dispersive_energy_validation_test.cpp.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstring>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/library.h"
#include "solver/media/material_map.h"
#include "solver/engine/mesh_plan.h"
#include "solver/media/mixed_cells.h"
#include "solver/engine/simulation.h"
#include "solver/engine/simulation_state.h"
#include "solver/media/subcell_average.h"
#include "solver/media/subcell_dispersive_cross_terms.h"
#include "metal_sphere_box.h"
#include "resume_check.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using testing::kick;
using testing::metal_sphere_box;

// Kicks D at every `stride`-th site from rest and compares V_p E_p (kick at q) with V_q E_q (kick at p),
// V a location's own box volume (the energy's weights: on equal cells the plain coupling).
struct Symmetry {
  double largest = 0, worst = 0;
  int coupled_pairs = 0;
};
Symmetry weighted_symmetry(const Scene& s, const Grid& g, std::size_t stride) {
  const BlockLayout L = BlockLayout::of(g.n);
  MaterialIndex mi;
  fill_material_index(s, g, L, mi);
  const double dt = 0.99 * g.courant_limit();
  const std::vector<MixedCell> mixed = find_mixed_cells(s, g, L, mi);
  SubcellDispersiveCrossTerms terms(s, g, L, mi, mixed, 1, 0, dt, 1 / (0.99 * 0.99));
  EXPECT_FALSE(terms.empty());
  const std::size_t n = terms.sites().size();
  std::vector<std::size_t> identity(n);
  std::vector<double> volume(n);
  for (std::size_t q = 0; q < n; ++q) {
    identity[q] = q;
    const auto idx = L.index_of(terms.sites()[q].offset);
    const geometry::Aabb box = averaging_box(g, terms.sites()[q].component, idx[0], idx[1], idx[2]);
    volume[q] = (box.hi.x - box.lo.x) * (box.hi.y - box.lo.y) * (box.hi.z - box.lo.z);
  }
  terms.bind(identity);
  auto response = [&](std::size_t q) {
    SubcellDispersiveCrossTerms fresh = terms;  // from rest each time
    Fields f(L);
    std::vector<real> increment(n, real(0));
    increment[q] = 1;
    fresh.add(increment, f);
    std::vector<double> e(n);
    for (std::size_t p = 0; p < n; ++p) e[p] = f.c[static_cast<int>(terms.sites()[p].component)][terms.sites()[p].offset];
    return e;
  };
  Symmetry out;
  for (std::size_t q = 0; q < n; q += stride) {
    const std::vector<double> from_q = response(q);
    for (std::size_t p = 0; p < n; ++p) {
      if (p == q || from_q[p] == 0) continue;
      const double there = volume[p] * from_q[p], back = volume[q] * response(p)[q];
      out.largest = std::max(out.largest, std::abs(there));
      out.worst = std::max(out.worst, std::abs(there - back));
      if (terms.sites()[p].component != terms.sites()[q].component) ++out.coupled_pairs;
    }
  }
  std::printf("%zu sites, %zu triples, %d coupled pairs probed, largest %.3e, worst asymmetry %.1e of it\n", n,
              terms.triples(), out.coupled_pairs, out.largest, out.worst / out.largest);
  return out;
}

TEST(SubcellDispersiveCrossTerms, AKickOfDdMovesEcAsAKickOfDcMovesEd) {
  const Scene s = metal_sphere_box(14, materials::find_material("Au")->poles, 4.3);
  const Symmetry sym = weighted_symmetry(s, Grid::uniform(s.domain), 7);
  EXPECT_GT(sym.coupled_pairs, 100);
  EXPECT_GT(sym.largest, 0);
  EXPECT_LT(sym.worst, 1e-6 * sym.largest);
}

TEST(SubcellDispersiveCrossTerms, OnAGradedMeshTheCouplingIsSymmetricInTheEnergysWeights) {
  // Half the sphere in a zone of 0.5 nm cells, the rest 1 nm, graded in between.
  Scene s = metal_sphere_box(14, materials::find_material("Au")->poles, 4.3);
  s.domain.refine.push_back({{{-1, -1, -1}, {1, 1, 0.4e-9}}, {0.5e-9, 0.5e-9, 0.5e-9}});
  const Grid g = plan_mesh(s).grid;
  double smallest = 1, largest = 0;
  for (int a = 0; a < 3; ++a)
    for (int i = 0; i < g.n[a]; ++i) smallest = std::min(smallest, g.primal(a, i)), largest = std::max(largest, g.primal(a, i));
  ASSERT_LT(smallest, 0.6 * largest);  // the mesh is graded
  const Symmetry sym = weighted_symmetry(s, g, 31);
  EXPECT_GT(sym.coupled_pairs, 100);
  EXPECT_LT(sym.worst, 1e-6 * sym.largest);
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
    if (cross) {
      EXPECT_FALSE(sim.subcell_average()->dispersive_cross_terms().empty());
    }
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

TEST(SubcellDispersiveCrossTerms, ARunResumedFromItsStateArraysMatchesAnUninterruptedOneBitForBit) {
  Scene s = metal_sphere_box(10, materials::find_material("Au")->poles, 3.1);
  s.dipoles.push_back(kick({3.5e-9, 0.5e-9, 0}));
  testing::expect_resumed_run_matches(s, 300, "dispersive_cross");
}

}  // namespace
}  // namespace yeegap::solver
