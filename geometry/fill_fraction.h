// Fraction of a grid cell that a body fills, by adaptive subdivision of the cell (an octree on the
// signed distance): a sub-box the surface cannot cross, because |d| at its centre is at least half
// its diagonal, counts as wholly in or out; this relies on |d| never exceeding the true distance,
// which every shape here guarantees (exact, or a lower bound). At the finest level the sub-box
// counts as the slab fraction clamp(1/2 - d/h, 0, 1), h its mean edge: exact for a plane parallel
// to a face, and unbiased on average for tilted planes, so curved surfaces converge quickly.
#pragma once

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Volume fraction in [0, 1] of the box `cell` inside `shape`. `levels` halvings at most
/// (default 3: down to 1/8 of the cell per axis, at most 512 finest sub-boxes).
double fill_fraction(const Shape& shape, const Aabb& cell, int levels = 3);

}  // namespace yeegap::geometry
