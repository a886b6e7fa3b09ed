// Axis-aligned ellipsoid as a signed-distance function with the exact distance, found by the robust
// bisection of D. Eberly, "Distance from a Point to an Ellipse, an Ellipsoid, or a Hyperellipsoid"
// (Geometric Tools, 2013): the nearest surface point solves a one-dimensional monotone equation in
// a Lagrange multiplier. Turn it with make_turned (transforms.h) for other orientations.
#pragma once

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Ellipsoid centred at `center` with semi-axes `semi_axes` (m, all > 0) along x, y, z.
/// Sign exact; magnitude exact to the bisection's precision (a few ulps of the largest semi-axis),
/// so unlike the cheap scaled-sphere estimates it is neither an over- nor an under-estimate.
ShapePtr make_ellipsoid(Vec3 center, Vec3 semi_axes);

/// Unsigned distance from the point y (y_i >= 0) to the ellipsoid with semi-axes e0 >= e1 >= e2 > 0
/// centred at the origin (Eberly 2013, section 3). Exposed for tests.
double ellipsoid_distance_sorted(double e0, double e1, double e2, double y0, double y1, double y2);

}  // namespace yeegap::geometry
