// A prism: a simple polygon outline extruded along x, y or z between two planes. Exact distance:
// the 2D outline distance w and the axial distance h combine as for a box,
// |max(w, 0), max(h, 0)| + min(max(w, h), 0), which is exact for a right extrusion.
#pragma once

#include <vector>

#include "geometry/polygon.h"
#include "geometry/shape.h"

namespace yeegap::geometry {

/// Outline coordinates (m) are in the plane across `axis`, in cyclic order: for axis z they are
/// (x, y), for axis x (y, z), for axis y (z, x). The prism spans `from` < `to` along `axis`.
ShapePtr make_prism(int axis, const std::vector<Point2>& outline, double from, double to);

}  // namespace yeegap::geometry
