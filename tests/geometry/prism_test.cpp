// Polygon outlines and prisms: distances at points worked out by hand, convex and concave outlines,
// refused outlines, and the exactness checks of sdf_checks.h.
#include "geometry/prism.h"

#include <cmath>

#include <gtest/gtest.h>

#include "sdf_checks.h"

namespace yeegap::geometry {
namespace {

const std::vector<Point2> square = {{-1, -1}, {1, -1}, {1, 1}, {-1, 1}};
// An L: the unit square's notch at the top right is missing.
const std::vector<Point2> ell = {{0, 0}, {2, 0}, {2, 1}, {1, 1}, {1, 2}, {0, 2}};

TEST(Polygon, DistancesAtHandWorkedPoints) {
  const Polygon p(square);
  EXPECT_NEAR(p.signed_distance(0, 0), -1.0, 1e-15);
  EXPECT_NEAR(p.signed_distance(3, 0), 2.0, 1e-15);
  EXPECT_NEAR(p.signed_distance(2, 2), std::sqrt(2.0), 1e-15);
  EXPECT_NEAR(p.signed_distance(0.5, 0.9), -0.1, 1e-15);
  EXPECT_NEAR(p.area(), 4.0, 1e-15);
}

TEST(Polygon, ConcaveNotchIsOutside) {
  const Polygon p(ell);
  EXPECT_GT(p.signed_distance(1.5, 1.5), 0.0);                      // in the notch
  EXPECT_NEAR(p.signed_distance(1.5, 1.5), 0.5, 1e-15);            // to the notch's edges
  EXPECT_NEAR(p.signed_distance(1.8, 1.2), 0.2, 1e-15);
  EXPECT_NEAR(p.signed_distance(0.5, 1.5), -0.5, 1e-15);
  EXPECT_NEAR(p.signed_distance(1.5, 0.5), -0.5, 1e-15);
  EXPECT_NEAR(p.area(), 3.0, 1e-15);
}

TEST(Polygon, EitherVertexOrderGivesTheSameDistance) {
  std::vector<Point2> reversed(ell.rbegin(), ell.rend());
  const Polygon a(ell), b(reversed);
  for (const Vec3& q : test::random_points({{-1, -1, 0}, {3, 3, 0}}, 300, 2))
    EXPECT_DOUBLE_EQ(a.signed_distance(q.x, q.y), b.signed_distance(q.x, q.y));
}

TEST(Polygon, RefusesOutlinesThatAreNotSimple) {
  EXPECT_TRUE(polygon_problem(ell).empty());
  EXPECT_NE(polygon_problem({{0, 0}, {1, 0}}).find("at least 3"), std::string::npos);
  // A figure eight (the usual mistake when a bowtie is drawn as one outline): edges 0 and 2 cross.
  EXPECT_NE(polygon_problem({{0, 0}, {2, 2}, {2, 0}, {0, 2}}).find("edges 0 and 2"), std::string::npos);
  EXPECT_FALSE(polygon_problem({{0, 0}, {1, 0}, {2, 0}}).empty());  // all on one line
  EXPECT_NE(polygon_problem({{0, 0}, {1, 0}, {1, 1}, {1, 0}}).find("same"), std::string::npos);
}

TEST(Prism, DistancesAtHandWorkedPoints) {
  const auto s = make_prism(2, square, 0, 2);  // a 2 x 2 x 2 cube centred at (0, 0, 1)
  EXPECT_NEAR(s->signed_distance({0, 0, 1}), -1.0, 1e-15);
  EXPECT_NEAR(s->signed_distance({0, 0, 2.5}), 0.5, 1e-15);
  EXPECT_NEAR(s->signed_distance({3, 0, 1}), 2.0, 1e-15);
  EXPECT_NEAR(s->signed_distance({2, 2, 3}), std::sqrt(3.0), 1e-15);
  const Aabb b = s->bounds();
  EXPECT_EQ(b.lo.x, -1);
  EXPECT_EQ(b.hi.y, 1);
  EXPECT_EQ(b.lo.z, 0);
  EXPECT_EQ(b.hi.z, 2);
}

TEST(Prism, OutlineAxesFollowTheCyclicOrder) {
  // Along x the outline is (y, z): the L's notch sits at y, z in (1, 2).
  const auto s = make_prism(0, ell, -1, 1);
  EXPECT_GT(s->signed_distance({0, 1.5, 1.5}), 0.0);
  EXPECT_LT(s->signed_distance({0, 0.5, 1.5}), 0.0);
  EXPECT_LT(s->signed_distance({0, 1.5, 0.5}), 0.0);
  const auto t = make_prism(1, ell, -1, 1);  // along y the outline is (z, x)
  EXPECT_LT(t->signed_distance({1.5, 0, 0.5}), 0.0);
  EXPECT_GT(t->signed_distance({1.5, 0, 1.5}), 0.0);
}

TEST(Prism, ConcaveIsAnExactDistance) {
  test::expect_exact_distance(*make_prism(2, ell, -0.5, 0.7), {{-1, -1, -2}, {3, 3, 2}}, 1e-6);
}

}  // namespace
}  // namespace yeegap::geometry
