// Direction of a shape's surface normal near a point: the gradient of the signed distance by
// central differences, normalised. Subcell averaging (Farjadpour et al., Opt. Lett. 31, 2972
// (2006)) needs the normal of the interface that crosses a Yee cell; where the gradient vanishes
// (the centre of a sphere) there is no normal and a zero vector is returned.
#pragma once

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Unit outward normal of `shape` at p from the signed-distance gradient with difference step h (m),
/// or {0, 0, 0} where the differences cancel (no well-defined normal at p).
Vec3 surface_normal(const Shape& shape, const Vec3& p, double h);

}  // namespace yeegap::geometry
