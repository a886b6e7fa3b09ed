// Extruded polygon (see prism.h).
#include "geometry/prism.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

class Prism final : public Shape {
 public:
  Prism(int axis, Polygon outline, double from, double to)
      : axis_(axis), outline_(std::move(outline)), mid_(0.5 * (from + to)), half_(0.5 * (to - from)) {}
  double signed_distance(const Vec3& p) const override {
    const double w = outline_.signed_distance(p[(axis_ + 1) % 3], p[(axis_ + 2) % 3]);
    const double h = std::abs(p[axis_] - mid_) - half_;
    return std::hypot(std::max(w, 0.0), std::max(h, 0.0)) + std::min(std::max(w, h), 0.0);
  }
  Aabb bounds() const override {
    Aabb b;
    const int u = (axis_ + 1) % 3, v = (axis_ + 2) % 3;
    b.lo[u] = b.lo[v] = std::numeric_limits<double>::infinity();
    b.hi[u] = b.hi[v] = -std::numeric_limits<double>::infinity();
    for (const Point2& q : outline_.vertices()) {
      b.lo[u] = std::min(b.lo[u], q[0]);
      b.hi[u] = std::max(b.hi[u], q[0]);
      b.lo[v] = std::min(b.lo[v], q[1]);
      b.hi[v] = std::max(b.hi[v], q[1]);
    }
    b.lo[axis_] = mid_ - half_;
    b.hi[axis_] = mid_ + half_;
    return b;
  }

 private:
  int axis_;
  Polygon outline_;
  double mid_, half_;
};

}  // namespace

ShapePtr make_prism(int axis, const std::vector<Point2>& outline, double from, double to) {
  YG_CHECK(axis >= 0 && axis < 3 && to > from, "prism needs an axis 0..2 and to > from");
  return std::make_shared<Prism>(axis, Polygon(outline), from, to);
}

}  // namespace yeegap::geometry
