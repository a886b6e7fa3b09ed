// Rounded box (see rounded_box.h): exact distance of the inner box, minus the rounding radius.
#include "geometry/rounded_box.h"

#include <algorithm>
#include <cmath>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

class RoundedBox final : public Shape {
 public:
  RoundedBox(Vec3 c, Vec3 size, double r) : c_(c), half_(0.5 * size), r_(r) {}
  double signed_distance(const Vec3& p) const override {
    // Distance to the inner box (half-sizes reduced by r) is exact; offsetting a convex set's exact
    // distance by -r gives the exact distance of its r-neighbourhood.
    Vec3 q;
    for (int a = 0; a < 3; ++a) q[a] = std::abs(p[a] - c_[a]) - (half_[a] - r_);
    const Vec3 outside{std::max(q.x, 0.0), std::max(q.y, 0.0), std::max(q.z, 0.0)};
    return norm(outside) + std::min(std::max(q.x, std::max(q.y, q.z)), 0.0) - r_;
  }
  Aabb bounds() const override { return {c_ - half_, c_ + half_}; }

 private:
  Vec3 c_, half_;
  double r_;
};

}  // namespace

ShapePtr make_rounded_box(Vec3 center, Vec3 size, double rounding) {
  YG_CHECK(size.x > 0 && size.y > 0 && size.z > 0, "box size must be positive");
  YG_CHECK(rounding >= 0 && 2 * rounding <= std::min({size.x, size.y, size.z}),
           "box rounding must lie between 0 and half the shortest edge");
  return std::make_shared<RoundedBox>(center, size, rounding);
}

}  // namespace yeegap::geometry
