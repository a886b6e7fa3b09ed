// The basic bodies as signed-distance functions (Inigo-Quilez-style exact SDFs for box and capped
// cylinder; textbook for sphere and slab). All lengths in metres.
#pragma once

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Sphere of `radius` around `center`. Exact distance.
ShapePtr make_sphere(Vec3 center, double radius);
/// Axis-aligned box with full edge lengths `size`, centred at `center`. Exact distance.
ShapePtr make_box(Vec3 center, Vec3 size);
/// Layer between planes axis = lo and axis = hi, unbounded along the other two axes. Exact distance.
ShapePtr make_slab(int axis, double lo, double hi);
/// Solid circular cylinder: `center` of its middle, unit `axis` direction, `radius`, full `length`.
/// Exact distance.
ShapePtr make_cylinder(Vec3 center, Vec3 axis, double radius, double length);

}  // namespace yeegap::geometry
