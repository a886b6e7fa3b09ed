// Fraction of a cell a body fills, by adaptive subdivision on the signed distance: a sub-box with |d|
// at its centre of at least half its diagonal is wholly in or out (sound since no shape's |d| exceeds
// the true distance). At the finest level the slab fraction clamp(1/2 - d/h, 0, 1), h the mean edge:
// exact for a face-parallel plane, unbiased on average for tilted ones.
#pragma once

#include "geometry/shape.h"

namespace yeegap::geometry {

/// Volume fraction in [0, 1] of the box `cell` inside `shape`. `levels` halvings at most
/// (default 3: down to 1/8 of the cell per axis, at most 512 finest sub-boxes).
double fill_fraction(const Shape& shape, const Aabb& cell, int levels = 3);

}  // namespace yeegap::geometry
