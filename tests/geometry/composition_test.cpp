// Moves, turns, set operations and periodic arrays: inside tests against the parts, distances kept
// exact by rigid motions, lower bounds for set operations, and arrays equal to the union of copies.
#include <cmath>

#include <gtest/gtest.h>

#include "base/constants.h"
#include "geometry/periodic_array.h"
#include "geometry/rounded_box.h"
#include "geometry/set_operations.h"
#include "geometry/shapes.h"
#include "geometry/transforms.h"
#include "sdf_checks.h"

namespace yeegap::geometry {
namespace {

using constants::pi;

TEST(Transforms, MovedSphereIsTheSphereAtTheNewCentre) {
  const auto s = make_moved(make_sphere({0, 0, 0}, 1), {2, -1, 0.5});
  for (const Vec3& p : test::random_points({{-2, -4, -3}, {5, 3, 3}}, 200, 1))
    EXPECT_NEAR(s->signed_distance(p), norm(p - Vec3{2, -1, 0.5}) - 1, 1e-14);
  EXPECT_EQ(s->bounds().lo.x, 1);
  EXPECT_EQ(s->bounds().hi.z, 1.5);
}

TEST(Transforms, QuarterTurnAboutZMapsXOntoY) {
  // A 4 x 2 x 2 box turned by +90 degrees about z has its long side along y.
  const auto s = make_turned(make_box({0, 0, 0}, {4, 2, 2}), {0, 0, 1}, pi / 2, {0, 0, 0});
  EXPECT_LT(s->signed_distance({0, 1.5, 0}), 0.0);
  EXPECT_NEAR(s->signed_distance({1.5, 0, 0}), 0.5, 1e-12);
  const Aabb b = s->bounds();
  EXPECT_NEAR(b.lo.x, -1, 1e-12);
  EXPECT_NEAR(b.hi.y, 2, 1e-12);
}

TEST(Transforms, TurnIsRightHandedAboutThePivot) {
  // The point (2, 0, 0) turned by +90 degrees about z through (1, 0, 0) goes to (1, 1, 0).
  const auto s = make_turned(make_sphere({2, 0, 0}, 0.1), {0, 0, 1}, pi / 2, {1, 0, 0});
  EXPECT_NEAR(s->signed_distance({1, 1, 0}), -0.1, 1e-12);
}

TEST(Transforms, TurnedBodyKeepsAnExactDistance) {
  const auto s = make_moved(make_turned(make_rounded_box({0, 0, 0}, {3, 1.5, 1}, 0.2), {1, 2, -0.5}, 0.7, {0, 0, 0}),
                            {0.3, 0, -0.2});
  test::expect_exact_distance(*s, {{-3, -3, -3}, {3, 3, 3}}, 1e-6);
  // The turned bounds contain the body: every inside point lies within them.
  const Aabb b = s->bounds();
  for (const Vec3& p : test::random_points({{-3, -3, -3}, {3, 3, 3}}, 5000, 3))
    if (s->signed_distance(p) < 0) {
      for (int a = 0; a < 3; ++a) EXPECT_TRUE(p[a] >= b.lo[a] && p[a] <= b.hi[a]);
    }
}

TEST(Transforms, TurnedSlabStaysUnboundedAcross) {
  const auto s = make_turned(make_slab(2, -1, 1), {0, 0, 1}, 0.3, {0, 0, 0});  // turning about its normal
  const Aabb b = s->bounds();
  EXPECT_TRUE(std::isinf(b.lo.x) && std::isinf(b.hi.y));
  EXPECT_NEAR(b.lo.z, -1, 1e-12);
  EXPECT_NEAR(b.hi.z, 1, 1e-12);
}

TEST(SetOperations, InsideFollowsTheParts) {
  const auto a = make_sphere({-0.5, 0, 0}, 1), b = make_box({0.5, 0, 0}, {1.5, 1.5, 1.5});
  const auto u = make_union({a, b}), i = make_intersection({a, b}), d = make_difference(a, b);
  for (const Vec3& p : test::random_points({{-2, -2, -2}, {2, 2, 2}}, 3000, 5)) {
    const bool in_a = a->contains(p), in_b = b->contains(p);
    EXPECT_EQ(u->contains(p), in_a || in_b);
    EXPECT_EQ(i->contains(p), in_a && in_b);
    EXPECT_EQ(d->contains(p), in_a && !in_b);
  }
}

TEST(SetOperations, UnionIsExactOutsideAndABoundInside) {
  const auto u = make_union({make_sphere({-0.6, 0, 0}, 1), make_sphere({0.6, 0, 0}, 1)});
  // Outside: the nearer sphere's distance. Inside the overlap at the origin: the true distance
  // to the waist circle (radius sqrt(1 - 0.36) = 0.8) is 0.8, the union's value only -0.4.
  EXPECT_NEAR(u->signed_distance({3, 0, 0}), 1.4, 1e-15);
  EXPECT_NEAR(u->signed_distance({0, 0, 0}), -0.4, 1e-15);
  test::expect_distance_bound(*u, {{-2, -2, -2}, {2, 2, 2}}, 1e-6);
}

TEST(SetOperations, DifferenceIsABoundWithExactSign) {
  // A spherical shell: radius 1 minus radius 0.6.
  const auto shell = make_difference(make_sphere({0, 0, 0}, 1), make_sphere({0, 0, 0}, 0.6));
  EXPECT_NEAR(shell->signed_distance({0, 0, 0}), 0.6, 1e-15);
  EXPECT_NEAR(shell->signed_distance({0.8, 0, 0}), -0.2, 1e-15);
  EXPECT_NEAR(shell->signed_distance({2, 0, 0}), 1.0, 1e-15);
  // A box with a cylindrical hole: the value near the hole's rim underestimates the distance.
  const auto holed = make_difference(make_box({0, 0, 0}, {2, 2, 1}), make_cylinder({0, 0, 0}, {0, 0, 1}, 0.4, 2));
  test::expect_distance_bound(*holed, {{-1.5, -1.5, -1}, {1.5, 1.5, 1}}, 1e-6);
}

TEST(PeriodicArray, EqualsTheUnionOfAllCopies) {
  const auto body = make_rounded_box({0.2, 0, 0}, {1.2, 0.8, 0.5}, 0.1);
  const std::array<int, 3> n = {4, 3, 1};
  const Vec3 pitch{1.5, 2.0, 0};
  const auto array = make_periodic_array(body, n, pitch);
  std::vector<ShapePtr> copies;
  for (int j = 0; j < n[1]; ++j)
    for (int i = 0; i < n[0]; ++i)
      copies.push_back(make_moved(body, {(i - 1.5) * pitch.x, (j - 1.0) * pitch.y, 0}));
  const auto all = make_union(copies);
  for (const Vec3& p : test::random_points({{-6, -5, -2}, {6, 5, 2}}, 3000, 6))
    EXPECT_NEAR(array->signed_distance(p), all->signed_distance(p), 1e-14);
  const Aabb b = array->bounds(), u = all->bounds();
  for (int a = 0; a < 3; ++a) {
    EXPECT_NEAR(b.lo[a], u.lo[a], 1e-12);
    EXPECT_NEAR(b.hi[a], u.hi[a], 1e-12);
  }
}

TEST(PeriodicArray, OverlappingCopiesStillMatchTheUnion) {
  // Pitch shorter than the body: copies overlap, so the nearest copy is not always the nearest
  // index; the outward search must still find the minimum.
  const auto body = make_cylinder({0, 0, 0}, {1, 0.2, 0}, 0.3, 3.0);
  const auto array = make_periodic_array(body, {7, 1, 1}, {0.8, 0, 0});
  std::vector<ShapePtr> copies;
  for (int i = 0; i < 7; ++i) copies.push_back(make_moved(body, {(i - 3) * 0.8, 0, 0}));
  const auto all = make_union(copies);
  // Equal up to rounding of the copy offsets (computed in two ways).
  for (const Vec3& p : test::random_points({{-6, -2, -2}, {6, 2, 2}}, 3000, 7))
    EXPECT_NEAR(array->signed_distance(p), all->signed_distance(p), 1e-14);
}

}  // namespace
}  // namespace yeegap::geometry
