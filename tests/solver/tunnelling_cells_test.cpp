// Tunnelling-gap cells: which E locations of a two-sphere gap become gap medium, with which width
// l = d_A + d_B, and the damping each gets. For two spheres of radius R whose centres are 2R + s
// apart, the width at a point on the axis is exactly s (the two signed distances add up to the
// centre-to-centre distance minus 2R), and off axis it grows; gamma_g(l) is the materials/ gap
// model (Esteban et al., Nat. Commun. 3, 825 (2012); physics.md 1.2-1.3).
#include <gtest/gtest.h>

#include <cmath>

#include "geometry/shapes.h"
#include "materials/tunnelling_model.h"
#include "materials/tunnelling_metals.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

constexpr double d = 0.1e-9;       // cells
constexpr double radius = 2e-9;
constexpr double gap = 0.35e-9;    // surface to surface, on the x axis

Scene dimer(bool quantum, double gap_width = gap) {
  Scene s = testing::vacuum_box({80, 40, 40}, d, testing::all_edges(EdgeKind::metal));
  MaterialSpec metal;
  metal.name = "metal";
  const materials::TunnellingMetal au = *materials::find_tunnelling_metal("Au");
  metal.poles.drude.push_back({au.plasma_frequency, au.damping});
  s.materials.push_back(metal);
  const double cx = radius + gap_width / 2;
  s.bodies.push_back({geometry::make_sphere({-cx, 0, 0}, radius), 1, {}});
  s.bodies.push_back({geometry::make_sphere({cx, 0, 0}, radius), 1, {}});
  TunnellingSpec t;
  t.pairs = {{0, 1}};
  t.quantum = quantum;
  t.model = materials::make_tunnelling_model(au, materials::BarrierKind::exponential_fit);
  s.tunnelling.push_back(t);
  s.stop.after = 1e-18;
  return s;
}

TEST(TunnellingCells, DimerGapCellsCarryTheLocalWidthAndTheModelDamping) {
  const Scene s = dimer(true);
  Simulation sim(s);
  const RunResults r = sim.results();
  ASSERT_EQ(r.tunnelling_gaps.size(), 1u);
  const TunnellingGap& g = r.tunnelling_gaps[0];
  EXPECT_TRUE(g.quantum);
  EXPECT_GT(g.cells, 0);
  // The narrowest E location sits near the axis; its width cannot be below the true gap and is
  // within a cell's curvature correction of it (sagitta of a half-cell offset: (d/2)^2 / R).
  EXPECT_GE(g.smallest_width, gap * (1 - 1e-12));
  EXPECT_LT(g.smallest_width, gap + 2 * (d * d) / radius);
  EXPECT_DOUBLE_EQ(g.cutoff, s.tunnelling[0].model.cutoff_width);

  // Each gap cell's damping is gamma_g of its own width (table interpolation within 1e-3).
  const int gap_material = 2;  // appended after vacuum (0) and metal (1)
  const auto cells = sim.dispersive().cells(gap_material);
  ASSERT_EQ(static_cast<long>(cells.size()), g.cells);
  const auto& model = s.tunnelling[0].model;
  const auto gammas = sim.dispersive().drude_damping(gap_material, 0);
  ASSERT_EQ(gammas.size(), cells.size());
  for (std::size_t q = 0; q < cells.size(); ++q) {
    const Vec3 p = yee_position(sim.grid(), cells[q].component, cells[q].i, cells[q].j, cells[q].k);
    const double l = s.bodies[0].shape->signed_distance(p) + s.bodies[1].shape->signed_distance(p);
    ASSERT_GT(l, 0);
    ASSERT_LT(l, g.cutoff);
    EXPECT_NEAR(gammas[q] / materials::gap_damping(model, l), 1.0, 1e-3) << "cell " << q << " width " << l;
  }
}

TEST(TunnellingCells, ClassicalRunFindsTheSameGapButLeavesItEmpty) {
  const Scene quantum = dimer(true), classical = dimer(false);
  const RunResults q = Simulation(quantum).results();
  Simulation sim(classical);
  const RunResults c = sim.results();
  ASSERT_EQ(c.tunnelling_gaps.size(), 1u);
  EXPECT_FALSE(c.tunnelling_gaps[0].quantum);
  EXPECT_EQ(c.tunnelling_gaps[0].cells, q.tunnelling_gaps[0].cells);
  EXPECT_DOUBLE_EQ(c.tunnelling_gaps[0].smallest_width, q.tunnelling_gaps[0].smallest_width);
  EXPECT_EQ(c.material_names.size(), 2u) << "no gap material in a classical run";
}

TEST(TunnellingCells, QuantumCorrectedGapWiderThanTheCutoffBuildsWithNoGapCells) {
  // A sweep of gap widths crosses the cut-off: beyond it the quantum-corrected run has no gap
  // cells at all and must build and run like the classical one.
  const Scene s = dimer(true, 0.8e-9);
  ASSERT_GT(0.8e-9, s.tunnelling[0].model.cutoff_width);
  Simulation sim(s);
  const RunResults r = sim.run();
  ASSERT_EQ(r.tunnelling_gaps.size(), 1u);
  EXPECT_EQ(r.tunnelling_gaps[0].cells, 0);
  EXPECT_TRUE(sim.dispersive().cells(2).empty());
}

}  // namespace
}  // namespace yeegap::solver
