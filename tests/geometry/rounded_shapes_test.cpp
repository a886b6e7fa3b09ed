// Rounded box, rounded cylinder (capsule) and rounded cone: distances at points worked out by hand,
// the sign against plain inside tests, and the exactness checks of sdf_checks.h.
#include <cmath>

#include <gtest/gtest.h>

#include "geometry/cone.h"
#include "geometry/rounded_box.h"
#include "geometry/rounded_cylinder.h"
#include "sdf_checks.h"

namespace yeegap::geometry {
namespace {

TEST(RoundedBox, DistancesAtHandWorkedPoints) {
  const auto s = make_rounded_box({0, 0, 0}, {4, 2, 2}, 0.5);
  EXPECT_NEAR(s->signed_distance({3, 0, 0}), 1.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({0, 0, 0}), -1.0, 1e-12);
  // Beside a rounded edge: the inner box's edge (1.5, 0.5, z) is sqrt(1.5^2 + 1.5^2) away, minus 0.5.
  EXPECT_NEAR(s->signed_distance({3, 2, 0}), std::sqrt(4.5) - 0.5, 1e-12);
  // The sharp corner (2, 1, 1) lies outside the rounded one: sqrt(3 * 0.5^2) - 0.5 away.
  EXPECT_NEAR(s->signed_distance({2, 1, 1}), std::sqrt(0.75) - 0.5, 1e-12);
}

TEST(RoundedBox, ZeroRoundingIsTheSharpBox) {
  const auto s = make_rounded_box({0, 0, 0}, {4, 2, 2}, 0);
  EXPECT_NEAR(s->signed_distance({2, 1, 1}), 0.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({3, 2, 2}), std::sqrt(3.0), 1e-12);
}

TEST(RoundedBox, IsAnExactDistance) {
  test::expect_exact_distance(*make_rounded_box({0.2, 0, 0}, {4, 2, 1.2}, 0.3), {{-4, -3, -3}, {4, 3, 3}}, 1e-6);
}

TEST(RoundedCylinder, DistancesAtHandWorkedPoints) {
  const auto s = make_rounded_cylinder({0, 0, 0}, {0, 0, 1}, 1, 4, 0.25);
  EXPECT_NEAR(s->signed_distance({0, 0, 3}), 1.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({2, 0, 0}), 1.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({0, 0, 0}), -1.0, 1e-12);
  // Beyond the rim: the rounding torus runs through (r, z) = (0.75, 1.75).
  EXPECT_NEAR(s->signed_distance({2, 0, 3}), std::hypot(1.25, 1.25) - 0.25, 1e-12);
}

TEST(RoundedCylinder, FullRoundingIsACapsule) {
  // radius 1, length 4: hemispheres of radius 1 centred at z = +-1 on a cylinder between them.
  const auto s = make_rounded_cylinder({0, 0, 0}, {0, 0, 1}, 1, 4, 1);
  for (const Vec3& p : test::random_points({{-3, -3, -4}, {3, 3, 4}}, 500, 4)) {
    const double zc = std::clamp(p.z, -1.0, 1.0);
    EXPECT_NEAR(s->signed_distance(p), norm(p - Vec3{0, 0, zc}) - 1, 1e-12);
  }
}

TEST(RoundedCylinder, TiltedIsAnExactDistance) {
  test::expect_exact_distance(*make_rounded_cylinder({0, 0, 0}, {1, 1, 0.5}, 1, 5, 0.4), {{-4, -4, -4}, {4, 4, 4}},
                              1e-6);
}

TEST(Cone, SharpConeDistancesAtHandWorkedPoints) {
  // Base radius 3 at z = 0, apex at z = 4: the flank is the line 4 r + 3 z = 12.
  const auto s = make_cone({0, 0, 0}, {0, 0, 1}, 4, 3, 0);
  EXPECT_NEAR(s->signed_distance({0, 0, 4}), 0.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({0, 0, 6}), 2.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({0, 0, -1}), 1.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({3, 0, 4}), 12.0 / 5.0, 1e-12);      // foot (1.08, 2.56) on the flank
  EXPECT_NEAR(s->signed_distance({0, 1.5, 0.5}), -0.5, 1e-12);  // base 0.5 away, flank (12-6-1.5)/5 = 0.9
  EXPECT_NEAR(s->signed_distance({0, 2, 1}), -0.2, 1e-12);      // flank (12-8-3)/5 = 0.2, base 1
}

TEST(Cone, RoundedTipDistancesAtHandWorkedPoints) {
  // Length 10 to the top of a cap of radius 1, so the cap's centre is at z = 9.
  const auto s = make_cone({0, 0, 0}, {0, 0, 1}, 10, 4, 1);
  EXPECT_NEAR(s->signed_distance({0, 0, 12}), 2.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({0, 0, 9}), -1.0, 1e-12);  // the cap's centre
  EXPECT_NEAR(s->signed_distance({0, 0, 1}), -1.0, 1e-12);  // nearest the base
  // Along the cap's normal at 30 degrees from the axis, inside the cap's arc (the flank meets
  // the cap at about 71 degrees from the axis here).
  const double a = 30.0 * M_PI / 180;
  EXPECT_NEAR(s->signed_distance({3 * std::sin(a), 0, 9 + 3 * std::cos(a)}), 2.0, 1e-12);
}

TEST(Cone, RefusesACapThatDoesNotFit) {
  EXPECT_TRUE(cone_problem(10, 4, 1).empty());
  EXPECT_TRUE(cone_problem(1, 4, 0.9).empty());   // a squat dome: still a cone
  EXPECT_FALSE(cone_problem(10, 4, 4).empty());   // tip as wide as the base
  EXPECT_FALSE(cone_problem(1, 4, 1.5).empty());  // cap taller than the cone
}

TEST(Cone, SignMatchesTheSectionInsideTest) {
  // Sharp cone: inside iff 0 <= z and 4 r + 3 z <= 12.
  const auto s = make_cone({0, 0, 0}, {0, 0, 1}, 4, 3, 0);
  for (const Vec3& p : test::random_points({{-4, -4, -1}, {4, 4, 5}}, 3000, 8)) {
    const double r = std::hypot(p.x, p.y);
    EXPECT_EQ(s->signed_distance(p) < 0, p.z >= 0 && 4 * r + 3 * p.z <= 12);
  }
}

TEST(Cone, TiltedRoundedIsAnExactDistance) {
  test::expect_exact_distance(*make_cone({0.5, 0, -2}, {0.3, -0.2, 1}, 6, 2.5, 0.6), {{-4, -4, -4}, {5, 4, 6}}, 1e-6);
}

}  // namespace
}  // namespace yeegap::geometry
