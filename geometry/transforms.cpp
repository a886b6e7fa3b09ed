// Moved and turned bodies (see transforms.h). Bounds of a turned body: each world axis spans the sum
// of the rotated box's half-extents |R_ij| h_j, which contains every point of the box; an unbounded
// inner axis keeps the world axis unbounded unless the rotation does not mix it in (|R_ij| ~ 0).
#include "geometry/transforms.h"

#include <cmath>
#include <limits>

#include "base/errors.h"

namespace yeegap::geometry {

Vec3 rotate(Vec3 v, Vec3 u, double angle) {
  const double c = std::cos(angle), s = std::sin(angle);
  return c * v + s * cross(u, v) + ((1 - c) * dot(u, v)) * u;
}

Vec3 bounds_center(const Aabb& b) {
  Vec3 c;
  for (int a = 0; a < 3; ++a) c[a] = std::isfinite(b.lo[a]) && std::isfinite(b.hi[a]) ? 0.5 * (b.lo[a] + b.hi[a]) : 0.0;
  return c;
}

namespace {

constexpr double inf = std::numeric_limits<double>::infinity();

class Moved final : public Shape {
 public:
  Moved(ShapePtr body, Vec3 offset) : body_(std::move(body)), offset_(offset) {}
  double signed_distance(const Vec3& p) const override { return body_->signed_distance(p - offset_); }
  Aabb bounds() const override {
    const Aabb b = body_->bounds();
    return {b.lo + offset_, b.hi + offset_};
  }

 private:
  ShapePtr body_;
  Vec3 offset_;
};

class Turned final : public Shape {
 public:
  Turned(ShapePtr body, Vec3 axis, double angle, Vec3 pivot)
      : body_(std::move(body)), u_((1.0 / norm(axis)) * axis), angle_(angle), pivot_(pivot) {}
  double signed_distance(const Vec3& p) const override {
    return body_->signed_distance(pivot_ + rotate(p - pivot_, u_, -angle_));  // inverse rotation
  }
  Aabb bounds() const override {
    const Aabb b = body_->bounds();
    // Matrix columns: images of the unit vectors.
    Vec3 col[3];
    for (int j = 0; j < 3; ++j) {
      Vec3 e;
      e[j] = 1;
      col[j] = rotate(e, u_, angle_);
    }
    Aabb out;
    for (int i = 0; i < 3; ++i) {
      double lo = pivot_[i], hi = pivot_[i];
      for (int j = 0; j < 3; ++j) {
        const double r = col[j][i];
        if (std::abs(r) < 1e-12) continue;  // this inner axis does not reach world axis i
        const double a = r * (b.lo[j] - pivot_[j]), c = r * (b.hi[j] - pivot_[j]);
        lo += std::min(a, c);
        hi += std::max(a, c);
      }
      out.lo[i] = std::isnan(lo) ? -inf : lo;
      out.hi[i] = std::isnan(hi) ? inf : hi;
    }
    return out;
  }

 private:
  ShapePtr body_;
  Vec3 u_;
  double angle_;
  Vec3 pivot_;
};

}  // namespace

ShapePtr make_moved(ShapePtr body, Vec3 offset) {
  YG_CHECK(body != nullptr, "move needs a body");
  return std::make_shared<Moved>(std::move(body), offset);
}

ShapePtr make_turned(ShapePtr body, Vec3 axis, double angle, Vec3 pivot) {
  YG_CHECK(body != nullptr && norm(axis) > 0, "turn needs a body and an axis");
  return std::make_shared<Turned>(std::move(body), axis, angle, pivot);
}

}  // namespace yeegap::geometry
