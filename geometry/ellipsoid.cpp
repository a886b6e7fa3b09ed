// Exact point-to-ellipsoid distance by bisection on the Lagrange multiplier (Eberly 2013, see
// ellipsoid.h). Trap: points on a symmetry plane (a coordinate exactly zero) need their own branch,
// because there the nearest point may leave the plane's axis; Eberly's case split handles it.
#include "geometry/ellipsoid.h"

#include <algorithm>
#include <array>
#include <cmath>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

// Enough halvings to shrink any double bracket to adjacent values (Eberly bounds it by the
// exponent range); the loop also stops as soon as the midpoint no longer moves.
constexpr int max_bisections = 1100;

double robust_length(double a, double b) { return std::hypot(a, b); }
double robust_length(double a, double b, double c) { return std::hypot(std::hypot(a, b), c); }

// Root s of sum_i (r_i z_i / (s + r_i))^2 = 1 for two terms, r1 = 1 (Eberly's GetRoot, 2D).
double root2(double r0, double z0, double z1, double g) {
  const double n0 = r0 * z0;
  double s0 = z1 - 1, s1 = g < 0 ? 0 : robust_length(n0, z1) - 1, s = 0;
  for (int i = 0; i < max_bisections; ++i) {
    s = 0.5 * (s0 + s1);
    if (s == s0 || s == s1) break;
    const double a = n0 / (s + r0), b = z1 / (s + 1);
    const double f = a * a + b * b - 1;
    if (f > 0) s0 = s;
    else if (f < 0) s1 = s;
    else break;
  }
  return s;
}

// The same for three terms, r2 = 1 (Eberly's GetRoot, 3D).
double root3(double r0, double r1, double z0, double z1, double z2, double g) {
  const double n0 = r0 * z0, n1 = r1 * z1;
  double s0 = z2 - 1, s1 = g < 0 ? 0 : robust_length(n0, n1, z2) - 1, s = 0;
  for (int i = 0; i < max_bisections; ++i) {
    s = 0.5 * (s0 + s1);
    if (s == s0 || s == s1) break;
    const double a = n0 / (s + r0), b = n1 / (s + r1), c = z2 / (s + 1);
    const double f = a * a + b * b + c * c - 1;
    if (f > 0) s0 = s;
    else if (f < 0) s1 = s;
    else break;
  }
  return s;
}

// Distance from (y0, y1), y >= 0, to the ellipse with semi-axes e0 >= e1 > 0.
double ellipse_distance(double e0, double e1, double y0, double y1) {
  if (y1 > 0) {
    if (y0 > 0) {
      const double z0 = y0 / e0, z1 = y1 / e1, g = z0 * z0 + z1 * z1 - 1;
      if (g == 0) return 0;
      const double r0 = (e0 / e1) * (e0 / e1);
      const double s = root2(r0, z0, z1, g);
      const double x0 = r0 * y0 / (s + r0), x1 = y1 / (s + 1);
      return std::hypot(x0 - y0, x1 - y1);
    }
    return std::abs(y1 - e1);
  }
  // On the major axis: inside the evolute the nearest point leaves the axis.
  const double numer0 = e0 * y0, denom0 = e0 * e0 - e1 * e1;
  if (numer0 < denom0) {
    const double xde0 = numer0 / denom0;
    const double x0 = e0 * xde0, x1 = e1 * std::sqrt(std::max(0.0, 1 - xde0 * xde0));
    return std::hypot(x0 - y0, x1);
  }
  return std::abs(y0 - e0);
}

class Ellipsoid final : public Shape {
 public:
  Ellipsoid(Vec3 c, Vec3 e) : c_(c), e_(e) {
    // Sort the axes once so that e0 >= e1 >= e2, as the algorithm requires.
    order_ = {0, 1, 2};
    std::sort(order_.begin(), order_.end(), [&](int a, int b) { return e_[a] > e_[b]; });
  }
  double signed_distance(const Vec3& p) const override {
    const Vec3 d = p - c_;
    double inside = 0;
    for (int a = 0; a < 3; ++a) inside += (d[a] / e_[a]) * (d[a] / e_[a]);
    const double dist = ellipsoid_distance_sorted(e_[order_[0]], e_[order_[1]], e_[order_[2]],
                                                  std::abs(d[order_[0]]), std::abs(d[order_[1]]),
                                                  std::abs(d[order_[2]]));
    return inside < 1 ? -dist : dist;
  }
  Aabb bounds() const override { return {c_ - e_, c_ + e_}; }

 private:
  Vec3 c_, e_;
  std::array<int, 3> order_{};
};

}  // namespace

double ellipsoid_distance_sorted(double e0, double e1, double e2, double y0, double y1, double y2) {
  if (y2 > 0) {
    if (y1 > 0) {
      if (y0 > 0) {
        const double z0 = y0 / e0, z1 = y1 / e1, z2 = y2 / e2;
        const double g = z0 * z0 + z1 * z1 + z2 * z2 - 1;
        if (g == 0) return 0;
        const double r0 = (e0 / e2) * (e0 / e2), r1 = (e1 / e2) * (e1 / e2);
        const double s = root3(r0, r1, z0, z1, z2, g);
        const double x0 = r0 * y0 / (s + r0), x1 = r1 * y1 / (s + r1), x2 = y2 / (s + 1);
        return robust_length(x0 - y0, x1 - y1, x2 - y2);
      }
      return ellipse_distance(e1, e2, y1, y2);  // y0 = 0: the nearest point stays in that plane
    }
    if (y0 > 0) return ellipse_distance(e0, e2, y0, y2);  // y1 = 0
    return std::abs(y2 - e2);                            // on the minor axis
  }
  // y2 = 0: inside the region bounded by the evolute, the nearest point leaves the plane.
  const double denom0 = e0 * e0 - e2 * e2, denom1 = e1 * e1 - e2 * e2;
  const double numer0 = e0 * y0, numer1 = e1 * y1;
  if (numer0 < denom0 && numer1 < denom1) {
    const double xde0 = numer0 / denom0, xde1 = numer1 / denom1;
    const double discr = 1 - xde0 * xde0 - xde1 * xde1;
    if (discr > 0) {
      const double x0 = e0 * xde0, x1 = e1 * xde1, x2 = e2 * std::sqrt(discr);
      return robust_length(x0 - y0, x1 - y1, x2);
    }
  }
  return ellipse_distance(e0, e1, y0, y1);
}

ShapePtr make_ellipsoid(Vec3 center, Vec3 semi_axes) {
  YG_CHECK(semi_axes.x > 0 && semi_axes.y > 0 && semi_axes.z > 0, "ellipsoid semi-axes must be positive");
  return std::make_shared<Ellipsoid>(center, semi_axes);
}

}  // namespace yeegap::geometry
