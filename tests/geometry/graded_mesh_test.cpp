// Graded mesh builder: uniform when nothing is refined, the neighbour-ratio bound (1.2, common
// practice, physics.md 3.1), interfaces on nodes, uniform absorbing layers, zone steps respected,
// and the done-criterion: a 40 nm sphere dimer with a 0.5 nm gap needs at least 50x fewer
// cells graded than uniform at the gap's step, with at least 4 cells across the gap.
#include "geometry/graded_mesh.h"

#include <cmath>
#include <cstdio>

#include <gtest/gtest.h>

#include "geometry/gap_finder.h"
#include "geometry/shapes.h"

namespace yeegap::geometry {
namespace {

constexpr double nm = 1e-9;

bool is_node(const std::vector<double>& v, double x, double tol) {
  return std::any_of(v.begin(), v.end(), [&](double n) { return std::abs(n - x) <= tol; });
}

double worst_ratio(const std::vector<double>& v, bool periodic) {
  double w = 1;
  const std::size_t n = v.size() - 1;
  for (std::size_t i = 0; i < (periodic ? n : n - 1); ++i) {
    const double a = v[i + 1] - v[i], b = v[(i + 1) % n + 1] - v[(i + 1) % n];
    w = std::max(w, std::max(a, b) / std::min(a, b));
  }
  return w;
}

TEST(GradedMesh, AxisWithoutRefinementIsTheUniformGrid) {
  AxisRequest r;
  r.lo = -200 * nm, r.hi = 203 * nm, r.base = 5 * nm;
  r.absorber_lo = r.absorber_hi = 12;
  r.interfaces = {1.7 * nm};                 // off the grid, but nothing refines this axis
  r.zones = {{-10 * nm, 10 * nm, 6 * nm}};   // not finer than the base: no refinement
  const AxisMesh m = build_axis(r);
  ASSERT_EQ(m.nodes.size(), 82u);  // round(403 / 5) = 81 cells
  for (std::size_t i = 0; i < m.nodes.size(); ++i) EXPECT_NEAR(m.nodes[i], -200 * nm + i * 403.0 / 81 * nm, 1e-20);
  EXPECT_NEAR(m.absorber_step_lo, 403.0 / 81 * nm, 1e-20);
  EXPECT_FALSE(is_node(m.nodes, 1.7 * nm, 1e-3 * nm));  // left between nodes: the layer keeps its thickness
}

// Gap faces: the two faces of a gap stay nodes; a face that a neighbouring gap found again up to
// rounding (1e-16 m off) merges into the first instead of forcing a cell of 1e-16 m; a required
// interface (a slab face) wins over a gap face within half a cell of it.
TEST(GradedMesh, GapFacesWithinHalfACellMerge) {
  AxisRequest r;
  r.lo = -100 * nm, r.hi = 100 * nm, r.base = 5 * nm;
  r.absorber_lo = r.absorber_hi = 8;
  r.zones = {{-1 * nm, 1 * nm, 0.5 * nm}, {20 * nm, 22 * nm, 0.5 * nm}};
  r.gap_interfaces = {-1 * nm, 1 * nm, 1 * nm + 1e-16, -1 * nm - 3e-17, 20 * nm, 22 * nm + 0.1 * nm};
  r.interfaces = {22 * nm};
  const AxisMesh m = build_axis(r);
  EXPECT_TRUE(is_node(m.nodes, -1 * nm, 1e-6 * nm));  // one of the twins, 3e-17 m apart
  EXPECT_TRUE(is_node(m.nodes, 1 * nm, 1e-6 * nm));
  EXPECT_TRUE(is_node(m.nodes, 20 * nm, 1e-9 * nm));
  EXPECT_TRUE(is_node(m.nodes, 22 * nm, 1e-12 * nm));
  EXPECT_FALSE(is_node(m.nodes, 22.1 * nm, 1e-3 * nm));
  double smallest = 1;
  for (std::size_t i = 0; i + 1 < m.nodes.size(); ++i) smallest = std::min(smallest, m.nodes[i + 1] - m.nodes[i]);
  EXPECT_GT(smallest, 0.4 * nm);  // 4 cells of 0.5 nm across each 2 nm gap, within the rounding
  EXPECT_LE(worst_ratio(m.nodes, false), 1.2 * (1 + 1e-9));
}

TEST(GradedMesh, OffGridInterfaceBecomesANodeWithinTheRatio) {
  AxisRequest r;
  r.lo = -200 * nm, r.hi = 200 * nm, r.base = 5 * nm;
  r.absorber_lo = r.absorber_hi = 12;
  r.interfaces = {1.7 * nm, 2.9 * nm};  // a 1.2 nm film off the 5 nm grid, on a refined axis
  r.zones = {{50 * nm, 60 * nm, 2 * nm}};
  const AxisMesh m = build_axis(r);
  EXPECT_TRUE(is_node(m.nodes, 1.7 * nm, 1e-9 * nm));
  EXPECT_TRUE(is_node(m.nodes, 2.9 * nm, 1e-9 * nm));
  EXPECT_LE(worst_ratio(m.nodes, false), 1.2 * (1 + 1e-9));
  // Absorbers untouched: 12 cells of exactly 5 nm at each end.
  for (int i = 0; i < 12; ++i) {
    EXPECT_NEAR(m.nodes[i + 1] - m.nodes[i], 5 * nm, 1e-12 * nm);
    const std::size_t j = m.nodes.size() - 2 - i;
    EXPECT_NEAR(m.nodes[j + 1] - m.nodes[j], 5 * nm, 1e-12 * nm);
  }
}

TEST(GradedMesh, ManyRequestsKeepEveryRule) {
  // A spread of zones, interfaces, ratios and edges; each result must keep every rule.
  struct Case {
    std::vector<AxisRequest::Zone> zones;
    std::vector<double> interfaces;
    int absorber;
    bool periodic;
    double ratio;
  };
  const std::vector<Case> cases = {
      {{{-10, 10, 1}}, {}, 12, false, 1.2},
      {{{-1, 1, 0.1}, {30, 31, 0.5}}, {0.37, -0.61, 30.2}, 12, false, 1.2},
      {{{-0.25, 0.25, 0.125}}, {-0.25, 0.25}, 10, false, 1.1},
      {{{40, 60, 0.3}}, {-95.5}, 0, true, 1.2},   // zone near the wrap of a periodic axis
      {{{-100, -80, 0.5}}, {}, 8, false, 1.3},    // zone touching the absorber
      {{{-50, -40, 2}}, {0.3, 0.31, 0.32}, 12, false, 1.2},  // three close interfaces: a thin film
  };
  for (std::size_t c = 0; c < cases.size(); ++c) {
    SCOPED_TRACE(c);
    AxisRequest r;
    r.lo = -100, r.hi = 100, r.base = 5, r.ratio = cases[c].ratio;
    r.zones = cases[c].zones;
    r.interfaces = cases[c].interfaces;
    r.absorber_lo = r.absorber_hi = cases[c].absorber;
    r.periodic = cases[c].periodic;
    const AxisMesh m = build_axis(r);
    const auto& v = m.nodes;
    EXPECT_EQ(v.front(), -100);
    EXPECT_EQ(v.back(), 100);
    EXPECT_LE(worst_ratio(v, r.periodic), r.ratio * (1 + 1e-9));
    for (double x : r.interfaces) EXPECT_TRUE(is_node(v, x, 1e-9)) << x;
    for (std::size_t i = 0; i + 1 < v.size(); ++i) {
      const double h = v[i + 1] - v[i];
      EXPECT_GT(h, 0);
      EXPECT_LE(h, r.base * (1 + 1e-9));
      const bool in_absorber = static_cast<int>(i) < r.absorber_lo || i + r.absorber_hi >= v.size() - 1;
      for (const auto& z : r.zones) {  // an interior cell wholly inside a zone is at most its step
        if (!in_absorber && v[i] >= z.from && v[i + 1] <= z.to) {
          EXPECT_LE(h, z.step * (1 + 1e-9)) << "zone " << z.from;
        }
      }
    }
    for (int i = 0; i + 1 < r.absorber_lo; ++i) {  // uniform absorbing layers
      EXPECT_NEAR(v[i + 1] - v[i], m.absorber_step_lo, 1e-12);
      const std::size_t j = v.size() - 2 - i;
      EXPECT_NEAR(v[j + 1] - v[j], m.absorber_step_hi, 1e-12);
    }
  }
}

TEST(GradedMesh, InterfaceInsideAnAbsorberIsDroppedWithANote) {
  AxisRequest r;
  r.lo = -100, r.hi = 100, r.base = 5;
  r.absorber_lo = r.absorber_hi = 12;
  r.interfaces = {-97.3};
  r.zones = {{-1, 1, 0.5}};
  const AxisMesh m = build_axis(r);
  EXPECT_FALSE(is_node(m.nodes, -97.3, 1e-9));
  ASSERT_EQ(m.notes.size(), 1u);
  EXPECT_NE(m.notes[0].find("absorbing layer"), std::string::npos);
}

TEST(GradedMesh, SphereDimerWithHalfNanometreGapIsFiftyTimesSmallerThanUniform) {
  // Issue done-criterion. Gold-like dimer: radius 40 nm, gap 0.5 nm along x; a 300 x 200 x 200 nm
  // domain with 5 nm base cells, 12-cell absorbers, 1 nm cells around the particles, and the gap
  // found and refined automatically to 4 cells across.
  const double R = 40 * nm, g = 0.5 * nm;
  const std::vector<ShapePtr> bodies = {make_sphere({-(R + g / 2), 0, 0}, R), make_sphere({R + g / 2, 0, 0}, R)};
  MeshRequest q;
  q.domain = {{-150 * nm, -100 * nm, -100 * nm}, {150 * nm, 100 * nm, 100 * nm}};
  q.base_step = {5 * nm, 5 * nm, 5 * nm};
  q.absorber_cells = {12, 12, 12, 12, 12, 12};
  q.zones.push_back({{{-82 * nm, -42 * nm, -42 * nm}, {82 * nm, 42 * nm, 42 * nm}}, {1 * nm, 1 * nm, 1 * nm}});
  GapSearch search;
  search.max_width = 4 * 1 * nm;  // a gap narrower than 4 of the zone's cells needs its own
  search.region = q.domain;
  const auto gaps = find_gaps(bodies, search);
  ASSERT_EQ(gaps.size(), 1u);
  EXPECT_NEAR(gaps[0].width, g, 1e-6 * g);
  add_gap_refinement(q, gaps[0], 4);
  const GradedMesh m = build_graded_mesh(q);

  const double gap_step = g / 4;
  const double uniform = (300 * nm / gap_step) * (200 * nm / gap_step) * (200 * nm / gap_step);
  const double factor = uniform / static_cast<double>(m.cell_count());
  std::printf("dimer: graded %d x %d x %d = %lld cells, uniform at %.4g nm: %.3g cells, %.0fx fewer; smallest %.4g nm\n",
              m.cells()[0], m.cells()[1], m.cells()[2], m.cell_count(), gap_step / nm, uniform, factor,
              m.smallest_cell() / nm);
  EXPECT_GE(factor, 50.0);
  // At least 4 cells across the gap, whose faces are nodes.
  const auto& x = m.nodes[0];
  EXPECT_TRUE(is_node(x, -g / 2, 1e-6 * g));
  EXPECT_TRUE(is_node(x, g / 2, 1e-6 * g));
  const long across = std::count_if(x.begin(), x.end(), [&](double v) { return v > -g / 2 + 1e-6 * g && v < g / 2 - 1e-6 * g; }) + 1;
  EXPECT_GE(across, 4);
  EXPECT_LE(m.largest_ratio(), 1.2 * (1 + 1e-9));
  EXPECT_NEAR(m.smallest_cell(), gap_step, 1e-6 * gap_step);
}

}  // namespace
}  // namespace yeegap::geometry
