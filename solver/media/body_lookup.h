// Which body holds a point, fast for scenes of hundreds of bodies: the bodies' boxes are cached and
// sorted into bins over the grid's extent, so a point tests only the bodies whose box reaches its
// bin (a 20 x 20 array of spheres: about 4 instead of 400). Same answer as testing every body in
// turn: the last body containing the point wins; a point on a face two bodies share goes to the later.
#pragma once

#include <array>
#include <vector>

#include "geometry/shape.h"
#include "solver/scene.h"

namespace yeegap::solver {

class BodyLookup {
 public:
  /// Bins over `region` (the grid's extent); points outside it test every body.
  BodyLookup(const Scene& s, const geometry::Aabb& region);

  /// Material index at p: the last body containing p, else the background.
  int material_at(const Vec3& p) const;

 private:
  const std::vector<int>& candidates(const Vec3& p) const;

  const Scene& scene_;
  std::vector<geometry::Aabb> boxes_;
  geometry::Aabb region_;
  std::array<int, 3> bins_{1, 1, 1};
  std::vector<std::vector<int>> bin_bodies_;  // per bin: body indices, last body first
  std::vector<int> all_bodies_;               // last body first
};

/// The same for one point without building a lookup (no allocation: for loops over a few points).
int material_at_any(const Scene& s, const Vec3& p);

}  // namespace yeegap::solver
