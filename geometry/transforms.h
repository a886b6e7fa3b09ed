// Rigid motions of a body: a shift (move) and a rotation about an axis by an angle (turn, Rodrigues'
// formula). Both keep distances, so an exact signed distance stays exact: d'(p) = d(M^-1 p).
#pragma once

#include "geometry/shape.h"

namespace yeegap::geometry {

/// The body shifted by `offset` (m).
ShapePtr make_moved(ShapePtr body, Vec3 offset);

/// The body turned by `angle` (radians, right-handed about `axis`, normalised here) about the line
/// through `pivot` along `axis`.
ShapePtr make_turned(ShapePtr body, Vec3 axis, double angle, Vec3 pivot);

/// The rotation of `v` about the unit axis `u` by `angle` (right-handed), Rodrigues' formula.
Vec3 rotate(Vec3 v, Vec3 u, double angle);

/// The bounding box's centre, or 0 along an axis where the box is unbounded (a slab): the default
/// pivot of a turn.
Vec3 bounds_center(const Aabb& b);

}  // namespace yeegap::geometry
