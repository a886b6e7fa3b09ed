// Rounded cylinder (see rounded_cylinder.h), evaluated in the (radial, axial) meridian plane.
#include "geometry/rounded_cylinder.h"

#include <algorithm>
#include <cmath>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

class RoundedCylinder final : public Shape {
 public:
  RoundedCylinder(Vec3 c, Vec3 axis, double r, double len, double rounding)
      : c_(c), u_((1.0 / norm(axis)) * axis), r_(r), h_(0.5 * len), e_(rounding) {}
  double signed_distance(const Vec3& p) const override {
    const Vec3 d = p - c_;
    const double along = dot(d, u_);
    const double radial = norm(d - along * u_);
    // Rounded rectangle of half-sizes (r, h) with corner radius e: the exact distance of the
    // inner rectangle (r - e, h - e) minus e.
    const double qr = radial - (r_ - e_), qa = std::abs(along) - (h_ - e_);
    return std::hypot(std::max(qr, 0.0), std::max(qa, 0.0)) + std::min(std::max(qr, qa), 0.0) - e_;
  }
  Aabb bounds() const override {
    // The rounded cylinder lies inside the sharp one: extent h |u_a| + r sqrt(1 - u_a^2).
    Vec3 e;
    for (int a = 0; a < 3; ++a) e[a] = h_ * std::abs(u_[a]) + r_ * std::sqrt(std::max(0.0, 1.0 - u_[a] * u_[a]));
    return {c_ - e, c_ + e};
  }

 private:
  Vec3 c_, u_;
  double r_, h_, e_;
};

}  // namespace

ShapePtr make_rounded_cylinder(Vec3 center, Vec3 axis, double radius, double length, double rounding) {
  YG_CHECK(norm(axis) > 0 && radius > 0 && length > 0, "cylinder needs an axis, radius > 0 and length > 0");
  YG_CHECK(rounding >= 0 && rounding <= radius && 2 * rounding <= length,
           "cylinder rounding must lie between 0 and min(radius, length / 2)");
  return std::make_shared<RoundedCylinder>(center, axis, radius, length, rounding);
}

}  // namespace yeegap::geometry
