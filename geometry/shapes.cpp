// Signed-distance functions of sphere, box, slab and cylinder (see shapes.h).
#include "geometry/shapes.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

constexpr double inf = std::numeric_limits<double>::infinity();

class Sphere final : public Shape {
 public:
  Sphere(Vec3 c, double r) : c_(c), r_(r) {}
  double signed_distance(const Vec3& p) const override { return norm(p - c_) - r_; }
  Aabb bounds() const override { return {c_ - Vec3{r_, r_, r_}, c_ + Vec3{r_, r_, r_}}; }

 private:
  Vec3 c_;
  double r_;
};

class Box final : public Shape {
 public:
  Box(Vec3 c, Vec3 size) : c_(c), half_(0.5 * size) {}
  double signed_distance(const Vec3& p) const override {
    // q = |p - c| - half per axis; outside part is the length of max(q, 0), inside part max(q).
    Vec3 q;
    for (int a = 0; a < 3; ++a) q[a] = std::abs(p[a] - c_[a]) - half_[a];
    const Vec3 outside{std::max(q.x, 0.0), std::max(q.y, 0.0), std::max(q.z, 0.0)};
    return norm(outside) + std::min(std::max(q.x, std::max(q.y, q.z)), 0.0);
  }
  Aabb bounds() const override { return {c_ - half_, c_ + half_}; }

 private:
  Vec3 c_, half_;
};

class Slab final : public Shape {
 public:
  Slab(int axis, double lo, double hi) : axis_(axis), lo_(lo), hi_(hi) {}
  double signed_distance(const Vec3& p) const override { return std::max(lo_ - p[axis_], p[axis_] - hi_); }
  Aabb bounds() const override {
    Aabb b{{-inf, -inf, -inf}, {inf, inf, inf}};
    b.lo[axis_] = lo_;
    b.hi[axis_] = hi_;
    return b;
  }

 private:
  int axis_;
  double lo_, hi_;
};

class Cylinder final : public Shape {
 public:
  Cylinder(Vec3 c, Vec3 axis, double r, double len) : c_(c), u_((1.0 / norm(axis)) * axis), r_(r), h_(0.5 * len) {}
  double signed_distance(const Vec3& p) const override {
    const Vec3 d = p - c_;
    const double along = dot(d, u_);
    const double radial = norm(d - along * u_);
    const double qr = radial - r_, qa = std::abs(along) - h_;
    const double out = std::hypot(std::max(qr, 0.0), std::max(qa, 0.0));
    return out + std::min(std::max(qr, qa), 0.0);
  }
  Aabb bounds() const override {
    // Extent along each axis of a capped cylinder: h |u_a| + r sqrt(1 - u_a^2).
    Vec3 e;
    for (int a = 0; a < 3; ++a) e[a] = h_ * std::abs(u_[a]) + r_ * std::sqrt(std::max(0.0, 1.0 - u_[a] * u_[a]));
    return {c_ - e, c_ + e};
  }

 private:
  Vec3 c_, u_;
  double r_, h_;
};

}  // namespace

ShapePtr make_sphere(Vec3 center, double radius) {
  YG_CHECK(radius > 0, "sphere radius must be positive");
  return std::make_shared<Sphere>(center, radius);
}
ShapePtr make_box(Vec3 center, Vec3 size) {
  YG_CHECK(size.x > 0 && size.y > 0 && size.z > 0, "box size must be positive");
  return std::make_shared<Box>(center, size);
}
ShapePtr make_slab(int axis, double lo, double hi) {
  YG_CHECK(axis >= 0 && axis < 3 && hi > lo, "slab needs an axis 0..2 and hi > lo");
  return std::make_shared<Slab>(axis, lo, hi);
}
ShapePtr make_cylinder(Vec3 center, Vec3 axis, double radius, double length) {
  YG_CHECK(norm(axis) > 0 && radius > 0 && length > 0, "cylinder needs an axis, radius > 0 and length > 0");
  return std::make_shared<Cylinder>(center, axis, radius, length);
}

}  // namespace yeegap::geometry
