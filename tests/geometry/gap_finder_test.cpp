// Gap finder: exact for two spheres (centre distance minus radii, nearest points on the centre
// line), a sphere over a flat substrate, an ellipsoid's tip facing a box, overlaps and far pairs.
#include "geometry/gap_finder.h"

#include <cmath>

#include <gtest/gtest.h>

#include "geometry/ellipsoid.h"
#include "geometry/shapes.h"

namespace yeegap::geometry {
namespace {

constexpr double nm = 1e-9;

GapSearch search_in(double half, double max_width) {
  GapSearch s;
  s.region = {{-half, -half, -half}, {half, half, half}};
  s.max_width = max_width;
  return s;
}

TEST(GapFinder, TwoSpheresGiveTheExactGapAndNearestPoints) {
  // Unequal spheres on a tilted line: gap = |c2 - c1| - r1 - r2.
  const Vec3 c1{-30 * nm, 5 * nm, 2 * nm}, c2{28 * nm, -7 * nm, 11 * nm};
  const double r1 = 30 * nm, d = norm(c2 - c1), gap = 0.8 * nm, r2 = d - r1 - gap;
  const auto a = make_sphere(c1, r1), b = make_sphere(c2, r2);
  const auto found = find_gap(*a, *b, search_in(100 * nm, 5 * nm));
  ASSERT_TRUE(found.has_value());
  const Vec3 u = (1.0 / d) * (c2 - c1);
  EXPECT_NEAR(found->width, gap, 1e-9 * gap);
  // The width is stationary at the nearest points (it grows as the square of a sideways shift), so
  // their position is pinned down less tightly than the width: 1e-5 nm here.
  EXPECT_LT(norm(found->point_a - (c1 + r1 * u)), 1e-5 * nm);
  EXPECT_LT(norm(found->point_b - (c2 - r2 * u)), 1e-5 * nm);
}

TEST(GapFinder, DimerOfFortyNanometreSpheresWithHalfNanometreGap) {
  const double R = 40 * nm, g = 0.5 * nm;
  const auto found = find_gaps({make_sphere({-(R + g / 2), 0, 0}, R), make_sphere({R + g / 2, 0, 0}, R)},
                               search_in(150 * nm, 4 * nm));
  ASSERT_EQ(found.size(), 1u);
  EXPECT_EQ(found[0].body_a, 0);
  EXPECT_EQ(found[0].body_b, 1);
  EXPECT_NEAR(found[0].width, g, 1e-9 * g);
  EXPECT_NEAR(found[0].middle().x, 0.0, 1e-5 * nm);
  EXPECT_NEAR(found[0].point_a.x, -g / 2, 1e-5 * nm);
}

TEST(GapFinder, SphereOverSubstrate) {
  // A 30 nm sphere 1.5 nm above a substrate slab whose top is z = 0 (unbounded across: the search
  // region bounds it).
  const auto slab = make_slab(2, -50 * nm, 0);
  const auto sphere = make_sphere({3 * nm, -2 * nm, 31.5 * nm}, 30 * nm);
  const auto found = find_gap(*sphere, *slab, search_in(100 * nm, 5 * nm));
  ASSERT_TRUE(found.has_value());
  EXPECT_NEAR(found->width, 1.5 * nm, 1e-9 * nm);
  EXPECT_NEAR(found->point_b.z, 0.0, 1e-6 * nm);
  EXPECT_NEAR(found->point_b.x, 3 * nm, 1e-4 * nm);
}

TEST(GapFinder, EllipsoidTipFacingABox) {
  // Ellipsoid (3, 1, 1) nm along x; box face at x = 3.2 nm: the tip (3, 0, 0) is the nearest point.
  const auto e = make_ellipsoid({0, 0, 0}, {3 * nm, 1 * nm, 1 * nm});
  const auto box = make_box({5.2 * nm, 0, 0}, {4 * nm, 4 * nm, 4 * nm});
  const auto found = find_gap(*e, *box, search_in(10 * nm, 1 * nm));
  ASSERT_TRUE(found.has_value());
  EXPECT_NEAR(found->width, 0.2 * nm, 1e-9 * nm);
  EXPECT_NEAR(found->point_a.x, 3 * nm, 1e-4 * nm);
  EXPECT_NEAR(std::hypot(found->point_a.y, found->point_a.z), 0.0, 1e-3 * nm);
}

TEST(GapFinder, FarApartGivesNothingAndOverlapIsNotAGap) {
  const auto a = make_sphere({-20 * nm, 0, 0}, 10 * nm), b = make_sphere({20 * nm, 0, 0}, 10 * nm);
  EXPECT_FALSE(find_gap(*a, *b, search_in(50 * nm, 5 * nm)).has_value());  // 20 nm apart
  EXPECT_TRUE(find_gap(*a, *b, search_in(50 * nm, 25 * nm)).has_value());
  const auto c = make_sphere({-5 * nm, 0, 0}, 10 * nm), d = make_sphere({5 * nm, 0, 0}, 10 * nm);
  const auto overlap = find_gap(*c, *d, search_in(50 * nm, 5 * nm));
  ASSERT_TRUE(overlap.has_value());
  EXPECT_LT(overlap->width, 0.0);
  EXPECT_TRUE(find_gaps({c, d}, search_in(50 * nm, 5 * nm)).empty());
}

TEST(GapFinder, RefinementPutsTheGapFacesOnInterfacesAcrossOnly) {
  Gap g;
  g.width = 0.5 * nm;
  g.point_a = {-0.25 * nm, 1 * nm, 2 * nm};
  g.point_b = {0.25 * nm, 1 * nm, 2 * nm};
  MeshRequest q;
  add_gap_refinement(q, g, 4);
  ASSERT_EQ(q.zones.size(), 1u);
  EXPECT_NEAR(q.zones[0].step.x, 0.125 * nm, 1e-24);
  EXPECT_TRUE(std::isinf(q.zones[0].step.y));
  EXPECT_TRUE(std::isinf(q.zones[0].step.z));
  EXPECT_EQ(q.gap_interfaces[0].size(), 2u);
  EXPECT_TRUE(q.gap_interfaces[1].empty());
}

}  // namespace
}  // namespace yeegap::geometry
