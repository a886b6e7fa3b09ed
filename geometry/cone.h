// A cone or tip with a rounded apex: a flat circular base, a straight flank, and a spherical cap
// of radius `tip_radius` tangent to the flank (the convex hull of the base disc and the apex ball).
// Exact distance: the meridian section is convex and symmetric about the axis, so the 3D distance
// is the 2D distance to that section's boundary (base segment, flank segment, cap arc).
#pragma once

#include <string>

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Cone with its base disc centred at `base`, unit `axis` pointing from the base to the tip
/// (normalised here), `length` from the base to the top of the cap, `base_radius`, and apex
/// rounding `tip_radius` (0 = sharp). Requires 0 <= tip_radius < base_radius and tip_radius < length.
/// Exact distance.
ShapePtr make_cone(Vec3 base, Vec3 axis, double length, double base_radius, double tip_radius);

/// Why these sizes make no cone (empty when they do); the scene reader reports it at the body.
std::string cone_problem(double length, double base_radius, double tip_radius);

}  // namespace yeegap::geometry
