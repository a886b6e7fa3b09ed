// Shared checks for signed-distance functions, used by the geometry tests.
//  - exact_at: from a point p, step |d(p)| along the numerical gradient; for an exact distance the
//    foot lies on the surface (d = 0 there), which shows the true distance is at most |d(p)|.
//  - lower_bound_against: no surface point found so far is nearer to p than |d(p)|.
//  - lipschitz: |d(p) - d(q)| <= |p - q|, which every distance function must obey.
#pragma once

#include <cmath>
#include <random>
#include <vector>

#include <gtest/gtest.h>

#include "geometry/shape.h"

namespace yeegap::geometry::test {

inline Vec3 gradient(const Shape& s, const Vec3& p, double h) {
  Vec3 g;
  for (int a = 0; a < 3; ++a) {
    Vec3 lo = p, hi = p;
    lo[a] -= h;
    hi[a] += h;
    g[a] = (s.signed_distance(hi) - s.signed_distance(lo)) / (2 * h);
  }
  return g;
}

/// The foot of p on the surface, found by one step of |d| along the unit gradient.
inline Vec3 foot(const Shape& s, const Vec3& p, double h) {
  const Vec3 g = gradient(s, p, h);
  return p - (s.signed_distance(p) / norm(g)) * g;
}

inline std::vector<Vec3> random_points(const Aabb& box, int count, unsigned seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::vector<Vec3> out;
  for (int i = 0; i < count; ++i) {
    Vec3 p;
    for (int a = 0; a < 3; ++a) p[a] = box.lo[a] + u(rng) * (box.hi[a] - box.lo[a]);
    out.push_back(p);
  }
  return out;
}

/// Asserts that s is an exact distance over random points of `box`: each foot lies on the surface
/// within `tol`, and no foot of any point is nearer to another point than its |d| (minus `tol`).
inline void expect_exact_distance(const Shape& s, const Aabb& box, double tol, int count = 400, unsigned seed = 7) {
  const double h = 1e-7 * norm(box.hi - box.lo);
  const auto pts = random_points(box, count, seed);
  std::vector<Vec3> feet;
  for (const Vec3& p : pts) {
    const Vec3 f = foot(s, p, h);
    EXPECT_NEAR(s.signed_distance(f), 0.0, tol) << "foot of (" << p.x << ", " << p.y << ", " << p.z << ")";
    feet.push_back(f);
  }
  for (const Vec3& p : pts) {
    const double d = std::abs(s.signed_distance(p));
    double nearest = INFINITY;
    for (const Vec3& f : feet) nearest = std::min(nearest, norm(p - f));
    EXPECT_LE(d, nearest + tol) << "at (" << p.x << ", " << p.y << ", " << p.z << ")";
  }
}

/// Asserts |d| is a lower bound of the distance to the surface points reached from random points
/// (feet refined by a few projection steps, since a bound's single step may fall short), and
/// (with `lipschitz`) that d is 1-Lipschitz, as min/max of distances are.
inline void expect_distance_bound(const Shape& s, const Aabb& box, double tol, int count = 400, unsigned seed = 11,
                                  bool lipschitz = true) {
  const double h = 1e-7 * norm(box.hi - box.lo);
  const auto pts = random_points(box, count, seed);
  std::vector<Vec3> surface;
  for (const Vec3& p : pts) {
    Vec3 f = p;
    for (int it = 0; it < 50 && std::abs(s.signed_distance(f)) > 0.1 * tol; ++it) f = foot(s, f, h);
    if (std::abs(s.signed_distance(f)) <= 0.1 * tol) surface.push_back(f);
  }
  ASSERT_GT(surface.size(), pts.size() / 2) << "projection found too few surface points";
  for (const Vec3& p : pts) {
    const double d = std::abs(s.signed_distance(p));
    double nearest = INFINITY;
    for (const Vec3& f : surface) nearest = std::min(nearest, norm(p - f));
    EXPECT_LE(d, nearest + tol) << "at (" << p.x << ", " << p.y << ", " << p.z << ")";
  }
  for (std::size_t i = 0; lipschitz && i + 1 < pts.size(); i += 2)
    EXPECT_LE(std::abs(s.signed_distance(pts[i]) - s.signed_distance(pts[i + 1])), norm(pts[i] - pts[i + 1]) + tol);
}

}  // namespace yeegap::geometry::test
