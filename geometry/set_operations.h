// Union, intersection and difference of bodies by min/max of their signed distances (Ricci 1973's
// constructive solid geometry on implicit functions). The sign is exact. The magnitude is a lower
// bound on the true distance, exact outside a union and inside an intersection, an underestimate
// elsewhere (inside a union where two bodies overlap, near the cut of a difference). A lower bound
// is what voxelisation needs: a region farther from the point than |d| is never crossed.
#pragma once

#include <vector>

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Points in any of the bodies: min of the distances.
ShapePtr make_union(std::vector<ShapePtr> bodies);
/// Points in all of the bodies: max of the distances.
ShapePtr make_intersection(std::vector<ShapePtr> bodies);
/// Points in `body` and not in `cut`: max(d_body, -d_cut).
ShapePtr make_difference(ShapePtr body, ShapePtr cut);

}  // namespace yeegap::geometry
