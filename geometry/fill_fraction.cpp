// Adaptive fill fraction (see fill_fraction.h).
#include "geometry/fill_fraction.h"

#include <algorithm>
#include <cmath>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

double fraction(const Shape& s, const Vec3& lo, const Vec3& hi, int levels_left) {
  const Vec3 c = 0.5 * (lo + hi), size = hi - lo;
  const double d = s.signed_distance(c);
  const double half_diagonal = 0.5 * norm(size);
  if (d >= half_diagonal) return 0.0;
  if (-d >= half_diagonal) return 1.0;
  if (levels_left == 0) {
    const double h = (size.x + size.y + size.z) / 3.0;
    return std::clamp(0.5 - d / h, 0.0, 1.0);
  }
  double sum = 0;
  for (int k = 0; k < 2; ++k)
    for (int j = 0; j < 2; ++j)
      for (int i = 0; i < 2; ++i) {
        const Vec3 l{i ? c.x : lo.x, j ? c.y : lo.y, k ? c.z : lo.z};
        const Vec3 h{i ? hi.x : c.x, j ? hi.y : c.y, k ? hi.z : c.z};
        sum += fraction(s, l, h, levels_left - 1);
      }
  return sum / 8.0;
}

}  // namespace

double fill_fraction(const Shape& shape, const Aabb& cell, int levels) {
  YG_CHECK(levels >= 0 && levels <= 10, "fill_fraction levels must lie in 0..10");
  for (int a = 0; a < 3; ++a) YG_CHECK(cell.hi[a] > cell.lo[a], "fill_fraction needs a cell of positive size");
  return fraction(shape, cell.lo, cell.hi, levels);
}

}  // namespace yeegap::geometry
