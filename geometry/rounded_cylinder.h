// Circular cylinder whose two rim edges are rounded with a torus of radius `rounding`; with
// rounding = radius and length >= 2 radius the ends are hemispheres (a capsule). Exact distance:
// a solid of revolution with a convex meridian section has the 2D distance of that section, and
// the section is a rectangle rounded at its corners (a rounded rectangle's exact 2D distance).
#pragma once

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Cylinder with the middle of its axis at `center`, unit `axis` direction (normalised here),
/// `radius`, full `length` (end to end, including the rounding) and rim rounding radius
/// 0 <= rounding <= min(radius, length / 2). Exact distance.
ShapePtr make_rounded_cylinder(Vec3 center, Vec3 axis, double radius, double length, double rounding);

}  // namespace yeegap::geometry
