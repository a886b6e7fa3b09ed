// Ellipsoid distance: values at points worked out by hand, agreement with a brute-force search over
// the surface, and the exactness checks of sdf_checks.h.
#include "geometry/ellipsoid.h"

#include <cmath>

#include <gtest/gtest.h>

#include "base/constants.h"
#include "sdf_checks.h"

namespace yeegap::geometry {
namespace {

// Nearest surface point by brute force: a fine (theta, phi) sweep, then a finer one around the best.
double brute_distance(Vec3 e, Vec3 p) {
  using constants::pi;
  double best = INFINITY, bt = 0, bp = 0;
  auto at = [&](double t, double f) {
    const Vec3 s{e.x * std::sin(t) * std::cos(f), e.y * std::sin(t) * std::sin(f), e.z * std::cos(t)};
    return norm(s - p);
  };
  for (int i = 0; i <= 400; ++i)
    for (int j = 0; j < 800; ++j) {
      const double t = pi * i / 400, f = 2 * pi * j / 800, d = at(t, f);
      if (d < best) best = d, bt = t, bp = f;
    }
  double span = pi / 400;
  for (int round = 0; round < 30; ++round, span *= 0.5)
    for (int i = -10; i <= 10; ++i)
      for (int j = -10; j <= 10; ++j) {
        const double t = bt + span * i / 10, f = bp + span * j / 10, d = at(t, f);
        if (d < best) best = d, bt = t, bp = f;
      }
  return best;
}

TEST(Ellipsoid, DistancesAtHandWorkedPoints) {
  const auto s = make_ellipsoid({0, 0, 0}, {3, 2, 1});
  EXPECT_NEAR(s->signed_distance({5, 0, 0}), 2.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({0, 3.5, 0}), 1.5, 1e-12);
  EXPECT_NEAR(s->signed_distance({0, 0, -4}), 3.0, 1e-12);
  EXPECT_NEAR(s->signed_distance({0, 0, 0}), -1.0, 1e-12);  // the nearest point is a pole of the shortest axis
  EXPECT_NEAR(s->signed_distance({0, 0, 1}), 0.0, 1e-12);
  // On the long axis inside: the nearest point leaves the axis. For the section ellipse (3, 1),
  // minimising (3 cos t - 2)^2 + sin^2 t gives cos t = 3/4, so d^2 = (1/4)^2 + 7/16 = 1/2.
  EXPECT_NEAR(s->signed_distance({2, 0, 0}), -std::sqrt(0.5), 1e-12);
}

TEST(Ellipsoid, EqualAxesGiveTheSphereDistance) {
  const auto s = make_ellipsoid({1, -2, 0.5}, {2, 2, 2});
  for (const Vec3& p : test::random_points({{-5, -5, -5}, {5, 5, 5}}, 200, 3))
    EXPECT_NEAR(s->signed_distance(p), norm(p - Vec3{1, -2, 0.5}) - 2, 1e-12);
}

TEST(Ellipsoid, AgreesWithBruteForceSurfaceSearch) {
  const Vec3 e{3, 2, 1};
  const auto s = make_ellipsoid({0, 0, 0}, e);
  for (const Vec3& p : test::random_points({{-4, -3, -2}, {4, 3, 2}}, 25, 5))
    EXPECT_NEAR(std::abs(s->signed_distance(p)), brute_distance(e, p), 1e-9);
}

TEST(Ellipsoid, SignMatchesTheQuadraticForm) {
  const Vec3 c{0.5, 0, -1}, e{1, 4, 2};
  const auto s = make_ellipsoid(c, e);
  for (const Vec3& p : test::random_points({{-4, -5, -4}, {4, 5, 4}}, 2000, 9)) {
    const Vec3 d = p - c;
    const double q = (d.x / e.x) * (d.x / e.x) + (d.y / e.y) * (d.y / e.y) + (d.z / e.z) * (d.z / e.z);
    EXPECT_EQ(s->signed_distance(p) < 0, q < 1);
  }
}

TEST(Ellipsoid, IsAnExactDistance) {
  test::expect_exact_distance(*make_ellipsoid({0, 0, 0}, {3, 1.5, 0.7}), {{-5, -3, -2}, {5, 3, 2}}, 1e-6);
}

}  // namespace
}  // namespace yeegap::geometry
