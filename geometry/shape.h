// A body's shape as a signed-distance function: negative inside, positive outside, zero on the
// surface, in metres. Exact distances where the shape allows (sphere, box, slab, cylinder); where
// only a bound is cheap (ellipsoid) the sign is exact and the magnitude is documented per shape.
#pragma once

#include <memory>

#include "base/vec3.h"

namespace yeegap::geometry {

/// Axis-aligned bounding box, metres. A slab is unbounded along two axes (+-infinity).
struct Aabb {
  Vec3 lo, hi;
};

class Shape {
 public:
  virtual ~Shape() = default;
  /// Signed distance from p to the surface (m): < 0 inside, > 0 outside.
  virtual double signed_distance(const Vec3& p) const = 0;
  /// A box that contains the whole body.
  virtual Aabb bounds() const = 0;
  bool contains(const Vec3& p) const { return signed_distance(p) < 0.0; }
};

using ShapePtr = std::shared_ptr<const Shape>;

}  // namespace yeegap::geometry
