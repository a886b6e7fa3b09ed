// A finite periodic array of copies of one body: counts and pitch per axis, centred on the body's
// own position. The distance is the minimum over the copies (a union, set_operations.h), found by
// searching outward from the nearest copy until no farther copy's bounding box can be closer, so
// it costs a few evaluations whatever the count and equals the union's value exactly.
#pragma once

#include <array>

#include "geometry/shape.h"

namespace yeegap::geometry {

/// counts[a] >= 1 copies along axis a, spaced by pitch[a] (m, > 0 where counts[a] > 1), placed at
/// offsets (i - (counts[a] - 1) / 2) pitch[a], i = 0 .. counts[a] - 1. The body must be bounded
/// along every axis with more than one copy.
ShapePtr make_periodic_array(ShapePtr body, std::array<int, 3> counts, Vec3 pitch);

}  // namespace yeegap::geometry
