// Set operations (see set_operations.h). Why these are lower bounds: inside body A only, the way out
// of A u B is at least as far as the way out of A, so |min(dA, dB)| = -dA <= the true distance;
// the other cases follow the same way (every point that leaves the set has left one of its parts).
#include "geometry/set_operations.h"

#include <algorithm>
#include <limits>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

constexpr double inf = std::numeric_limits<double>::infinity();

class Union final : public Shape {
 public:
  explicit Union(std::vector<ShapePtr> b) : bodies_(std::move(b)) {}
  double signed_distance(const Vec3& p) const override {
    double d = inf;
    for (const auto& b : bodies_) d = std::min(d, b->signed_distance(p));
    return d;
  }
  Aabb bounds() const override {
    Aabb out{{inf, inf, inf}, {-inf, -inf, -inf}};
    for (const auto& b : bodies_) {
      const Aabb x = b->bounds();
      for (int a = 0; a < 3; ++a) {
        out.lo[a] = std::min(out.lo[a], x.lo[a]);
        out.hi[a] = std::max(out.hi[a], x.hi[a]);
      }
    }
    return out;
  }

 private:
  std::vector<ShapePtr> bodies_;
};

class Intersection final : public Shape {
 public:
  explicit Intersection(std::vector<ShapePtr> b) : bodies_(std::move(b)) {}
  double signed_distance(const Vec3& p) const override {
    double d = -inf;
    for (const auto& b : bodies_) d = std::max(d, b->signed_distance(p));
    return d;
  }
  Aabb bounds() const override {
    Aabb out{{-inf, -inf, -inf}, {inf, inf, inf}};
    for (const auto& b : bodies_) {
      const Aabb x = b->bounds();
      for (int a = 0; a < 3; ++a) {
        out.lo[a] = std::max(out.lo[a], x.lo[a]);
        out.hi[a] = std::min(out.hi[a], x.hi[a]);
      }
    }
    return out;
  }

 private:
  std::vector<ShapePtr> bodies_;
};

class Difference final : public Shape {
 public:
  Difference(ShapePtr body, ShapePtr cut) : body_(std::move(body)), cut_(std::move(cut)) {}
  double signed_distance(const Vec3& p) const override {
    return std::max(body_->signed_distance(p), -cut_->signed_distance(p));
  }
  Aabb bounds() const override { return body_->bounds(); }  // cutting never grows a body

 private:
  ShapePtr body_, cut_;
};

void check_all(const std::vector<ShapePtr>& bodies, const char* what) {
  YG_CHECK(!bodies.empty(), std::string(what) + " needs at least one body");
  for (const auto& b : bodies) YG_CHECK(b != nullptr, std::string(what) + " got an empty body");
}

}  // namespace

ShapePtr make_union(std::vector<ShapePtr> bodies) {
  check_all(bodies, "union");
  if (bodies.size() == 1) return bodies.front();
  return std::make_shared<Union>(std::move(bodies));
}

ShapePtr make_intersection(std::vector<ShapePtr> bodies) {
  check_all(bodies, "intersection");
  if (bodies.size() == 1) return bodies.front();
  return std::make_shared<Intersection>(std::move(bodies));
}

ShapePtr make_difference(ShapePtr body, ShapePtr cut) {
  YG_CHECK(body != nullptr && cut != nullptr, "difference needs two bodies");
  return std::make_shared<Difference>(std::move(body), std::move(cut));
}

}  // namespace yeegap::geometry
