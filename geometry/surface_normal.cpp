// Surface normal from the signed-distance gradient (see surface_normal.h).
#include "geometry/surface_normal.h"

#include "base/errors.h"

namespace yeegap::geometry {

Vec3 surface_normal(const Shape& shape, const Vec3& p, double h) {
  YG_CHECK(h > 0, "surface_normal needs a positive difference step");
  Vec3 g;
  for (int a = 0; a < 3; ++a) {
    Vec3 lo = p, hi = p;
    lo[a] -= h;
    hi[a] += h;
    g[a] = (shape.signed_distance(hi) - shape.signed_distance(lo)) / (2 * h);
  }
  // An exact distance has |grad| = 1 away from the medial axis, a distance bound a little less; a
  // vanishing difference means p sits where opposite surface directions cancel.
  const double len = norm(g);
  if (!(len > 1e-3)) return {0, 0, 0};
  return (1.0 / len) * g;
}

}  // namespace yeegap::geometry
