// The run's grid from a scene: exactly the uniform grid when nothing asks for grading, slab faces
// on cell edges, refine zones and detected gaps honoured, and the absorbers' actual thickness.
#include "solver/engine/mesh_plan.h"

#include <algorithm>
#include <cmath>

#include <gtest/gtest.h>

#include "geometry/shapes.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

constexpr double nm = 1e-9;

bool is_node(const std::vector<double>& v, double x) {
  return std::any_of(v.begin(), v.end(), [&](double n) { return std::abs(n - x) < 1e-6 * nm; });
}

TEST(MeshPlan, WithoutGradingItIsTheUniformGrid) {
  Scene s = testing::vacuum_box({40, 30, 20}, 5 * nm, testing::all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = 8;
  s.bodies.push_back({geometry::make_sphere({0, 0, 0}, 30 * nm), 0, {}});   // box extremes: optional only
  s.bodies.push_back({geometry::make_slab(2, -20 * nm, 10 * nm), 0, {}});   // faces on the grid
  const MeshPlan p = plan_mesh(s);
  const Grid u = Grid::uniform(s.domain);
  for (int a = 0; a < 3; ++a) {
    ASSERT_EQ(p.grid.n[a], u.n[a]);
    for (int i = 0; i <= u.n[a]; ++i) EXPECT_NEAR(p.grid.nodes[a][i], u.nodes[a][i], 1e-12 * nm);
  }
  EXPECT_TRUE(p.gaps.empty());
  EXPECT_NEAR(absorber_thickness(p.grid, 5, 8), 40 * nm, 1e-12 * nm);
}

TEST(MeshPlan, OffGridSlabFacesBecomeCellEdgesOnARefinedAxis) {
  Scene s = testing::vacuum_box({40, 30, 40}, 5 * nm, testing::all_edges(EdgeKind::cpml));
  s.bodies.push_back({geometry::make_slab(2, -12.3 * nm, 7.9 * nm), 0, {}});
  // Unrefined: the faces stay between nodes (a staircased layer keeps its thickness that way).
  EXPECT_FALSE(is_node(plan_mesh(s).grid.nodes[2], -12.3 * nm));
  s.domain.refine.push_back({{{-100 * nm, -75 * nm, 20 * nm}, {100 * nm, 75 * nm, 30 * nm}}, {5 * nm, 5 * nm, 1 * nm}});
  const MeshPlan p = plan_mesh(s);
  EXPECT_TRUE(is_node(p.grid.nodes[2], -12.3 * nm));
  EXPECT_TRUE(is_node(p.grid.nodes[2], 7.9 * nm));
  EXPECT_EQ(p.grid.n[0], 40);  // other axes untouched
}

TEST(MeshPlan, GapBetweenSpheresGetsItsCellsAcross) {
  Scene s = testing::vacuum_box({60, 40, 40}, 5 * nm, testing::all_edges(EdgeKind::cpml));
  s.bodies.push_back({geometry::make_sphere({-20.5 * nm, 0, 0}, 20 * nm), 0, {}});
  s.bodies.push_back({geometry::make_sphere({20.5 * nm, 0, 0}, 20 * nm), 0, {}});
  s.domain.gap_cells = 5;
  const MeshPlan p = plan_mesh(s);
  ASSERT_EQ(p.gaps.size(), 1u);
  EXPECT_NEAR(p.gaps[0].width, 1 * nm, 1e-9 * nm);
  const auto& x = p.grid.nodes[0];
  const long across = std::count_if(x.begin(), x.end(), [](double v) { return v > -0.5 * nm + 1e-15 && v < 0.5 * nm - 1e-15; }) + 1;
  EXPECT_EQ(across, 5);
  EXPECT_NEAR(p.grid.min_spacing(0), 0.2 * nm, 1e-9 * nm);
  // Off by the user: no gap zone, the uniform grid.
  s.domain.gap_cells = 0;
  EXPECT_EQ(plan_mesh(s).grid.n[0], 60);
}

TEST(MeshPlan, RefineZoneAndTouchingBodies) {
  Scene s = testing::vacuum_box({40, 40, 40}, 5 * nm, testing::all_edges(EdgeKind::cpml));
  s.domain.refine.push_back({{{-10 * nm, -10 * nm, -10 * nm}, {10 * nm, 10 * nm, 10 * nm}}, {1 * nm, 2 * nm, 5 * nm}});
  // Two stacked slabs share a face: touching, not a gap.
  s.bodies.push_back({geometry::make_slab(2, -30 * nm, 0), 0, {}});
  s.bodies.push_back({geometry::make_slab(2, 0, 30 * nm), 0, {}});
  const MeshPlan p = plan_mesh(s);
  EXPECT_TRUE(p.gaps.empty());
  EXPECT_NEAR(p.grid.min_spacing(0), 1 * nm, 1e-6 * nm);
  EXPECT_NEAR(p.grid.min_spacing(1), 2 * nm, 1e-6 * nm);
  EXPECT_EQ(p.grid.n[2], 40);
  for (int a = 0; a < 3; ++a)
    for (int i = 0; i + 1 < p.grid.n[a]; ++i) {
      const double r = p.grid.primal(a, i + 1) / p.grid.primal(a, i);
      EXPECT_LE(std::max(r, 1 / r), 1.2 * (1 + 1e-9));
    }
}

TEST(MeshPlan, ThinLayerOfAStackIsNotAGapButAJunctionBetweenMetalFilmsIs) {
  // Glass / 2 nm adhesion layer / gold on 1 nm cells: the glass and gold slabs are 2 nm apart, but
  // that is a layer of the stack, not a gap: no zone (it would halve the step of a film run).
  Scene s = testing::vacuum_box({20, 1, 200}, 1 * nm, testing::all_edges(EdgeKind::cpml));
  MaterialSpec glass, metal;
  glass.name = "glass";
  glass.poles.eps_inf = 2.3;
  metal.name = "metal";
  metal.poles.drude.push_back({1.37e16, 1e14});
  s.materials.push_back(glass);  // 1
  s.materials.push_back(metal);  // 2
  s.bodies.push_back({geometry::make_slab(2, -100 * nm, -2.3 * nm), 1, {}});
  s.bodies.push_back({geometry::make_slab(2, -2.3 * nm, -0.3 * nm), 2, {}});
  s.bodies.push_back({geometry::make_slab(2, -0.3 * nm, 47.7 * nm), 2, {}});
  const MeshPlan p = plan_mesh(s);
  EXPECT_TRUE(p.gaps.empty());
  EXPECT_EQ(p.grid.n[2], 200);  // the uniform grid
  EXPECT_TRUE(std::any_of(p.notes.begin(), p.notes.end(),
                          [](const std::string& n) { return n.find("layer of a stack") != std::string::npos; }));
  // A bounded body over the film still gets its gap (a particle on a mirror).
  Scene q = s;
  q.bodies.push_back({geometry::make_sphere({0, 0, 48.7 * nm + 20 * nm}, 20 * nm), 2, {}});
  const MeshPlan pq = plan_mesh(q);
  ASSERT_EQ(pq.gaps.size(), 1u);
  EXPECT_NEAR(pq.gaps[0].width, 1 * nm, 1e-6 * nm);
  // Two metal films 1 nm apart (a metal-insulator-metal junction) are a gap: 4 cells across.
  Scene m = s;
  m.bodies.push_back({geometry::make_slab(2, 48.7 * nm, 90 * nm), 2, {}});
  const MeshPlan pm = plan_mesh(m);
  ASSERT_EQ(pm.gaps.size(), 1u);
  EXPECT_NEAR(pm.gaps[0].width, 1 * nm, 1e-6 * nm);
  EXPECT_NEAR(pm.grid.min_spacing(2), 0.25 * nm, 1e-6 * nm);
}

// An n x n array of 10 nm spheres 2 nm apart (22 nm pitch) on 5 nm cells: 2n(n-1) gaps of 2 nm and
// 2(n-1)^2 diagonal ones of 11.1 nm (both below gap_cells x 5 nm = 20 nm). Neighbouring gaps find the
// same faces up to rounding; before those were merged, the 3 x 3 array got cells of 1.1e-7 nm.
Scene sphere_array(int n) {
  const double pitch = 22 * nm, extent = n * pitch + 60 * nm;
  Scene s = testing::vacuum_box({static_cast<int>(extent / (5 * nm)), static_cast<int>(extent / (5 * nm)), 20}, 5 * nm,
                                testing::all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = 8;
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j)
      s.bodies.push_back({geometry::make_sphere({(i - 0.5 * (n - 1)) * pitch, (j - 0.5 * (n - 1)) * pitch, 0}, 10 * nm), 0, {}});
  return s;
}

TEST(MeshPlan, AnArrayOfNarrowGapsGetsASaneGrid) {
  for (int n : {3, 10}) {
    const MeshPlan p = plan_mesh(sphere_array(n));
    ASSERT_EQ(p.gaps.size(), static_cast<std::size_t>(2 * n * (n - 1) + 2 * (n - 1) * (n - 1))) << n;
    int straight = 0;
    for (const auto& g : p.gaps) {
      if (std::abs(g.width - 2 * nm) < 1e-6 * nm) ++straight;
      else EXPECT_NEAR(g.width, (22 * std::sqrt(2.0) - 20) * nm, 1e-6 * nm);
    }
    EXPECT_EQ(straight, 2 * n * (n - 1));
    // The bound: no cell below a tenth of the narrowest gap; and each 2 nm gap keeps
    // gap_cells (4) cells across it (at most 0.5 nm each, within the grading's rounding).
    for (int a = 0; a < 2; ++a) {
      EXPECT_GE(p.grid.min_spacing(a), 0.2 * nm) << n << " axis " << a;
      EXPECT_LE(p.grid.min_spacing(a), 0.5 * nm * 1.001) << n << " axis " << a;
    }
    EXPECT_EQ(p.grid.n[2], 20);  // the array lies in one plane: nothing to refine along z
  }
}

// A gap narrower than an atom is refined as asked, and noted.
TEST(MeshPlan, SubAtomicGapIsNoted) {
  Scene s = testing::vacuum_box({40, 30, 30}, 5 * nm, testing::all_edges(EdgeKind::cpml));
  s.bodies.push_back({geometry::make_sphere({-20.025 * nm, 0, 0}, 20 * nm), 0, {}});
  s.bodies.push_back({geometry::make_sphere({20.025 * nm, 0, 0}, 20 * nm), 0, {}});
  const MeshPlan p = plan_mesh(s);
  ASSERT_EQ(p.gaps.size(), 1u);
  EXPECT_NEAR(p.gaps[0].width, 0.05 * nm, 1e-6 * nm);
  EXPECT_TRUE(std::any_of(p.notes.begin(), p.notes.end(),
                          [](const std::string& n) { return n.find("less than an atom") != std::string::npos; }));
}

}  // namespace
}  // namespace yeegap::solver
