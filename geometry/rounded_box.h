// Axis-aligned box whose edges and corners are rounded with one radius: the Minkowski sum of a
// smaller box and a ball, so its signed distance is the box's minus the radius, exact (the
// standard rounded-box distance, as in I. Quilez's catalogue of distance functions).
#pragma once

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Box of full edge lengths `size` centred at `center` with edges rounded by `rounding`
/// (0 <= rounding <= half the shortest edge; 0 is the sharp box). Exact distance.
ShapePtr make_rounded_box(Vec3 center, Vec3 size, double rounding);

}  // namespace yeegap::geometry
