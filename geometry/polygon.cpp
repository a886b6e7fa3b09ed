// 2D polygon distance (see polygon.h). The edge loop computes both the nearest-edge distance and
// the crossing parity in one pass; the self-intersection check is O(n^2), fine for outlines.
#include "geometry/polygon.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

double cross2(Point2 o, Point2 a, Point2 b) { return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]); }

// Do the closed segments ab and cd share a point? Orientation tests, with the collinear cases.
bool segments_touch(Point2 a, Point2 b, Point2 c, Point2 d) {
  const double d1 = cross2(c, d, a), d2 = cross2(c, d, b), d3 = cross2(a, b, c), d4 = cross2(a, b, d);
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
  auto on_segment = [](Point2 p, Point2 q, Point2 r) {  // r on pq, given collinear
    return std::min(p[0], q[0]) <= r[0] && r[0] <= std::max(p[0], q[0]) && std::min(p[1], q[1]) <= r[1] &&
           r[1] <= std::max(p[1], q[1]);
  };
  return (d1 == 0 && on_segment(c, d, a)) || (d2 == 0 && on_segment(c, d, b)) || (d3 == 0 && on_segment(a, b, c)) ||
         (d4 == 0 && on_segment(a, b, d));
}

double signed_area(const std::vector<Point2>& v) {
  double s = 0;
  for (std::size_t i = 0, n = v.size(); i < n; ++i) {
    const Point2 a = v[i], b = v[(i + 1) % n];
    s += a[0] * b[1] - b[0] * a[1];
  }
  return 0.5 * s;
}

}  // namespace

std::string polygon_problem(const std::vector<Point2>& v) {
  const std::size_t n = v.size();
  if (n < 3) return fmt::format("an outline needs at least 3 points, got {}", n);
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = i + 1; j < n; ++j)
      if (v[i] == v[j]) return fmt::format("points {} and {} are the same", i, j);
  for (std::size_t i = 0; i < n; ++i)
    for (std::size_t j = i + 1; j < n; ++j) {
      // Neighbouring edges share a vertex by construction; they only fail if they fold back.
      const bool adjacent = j == i + 1 || (i == 0 && j == n - 1);
      const Point2 a = v[i], b = v[(i + 1) % n], c = v[j], d = v[(j + 1) % n];
      if (adjacent) {
        const Point2 shared = j == i + 1 ? b : a, far1 = j == i + 1 ? a : b, far2 = j == i + 1 ? d : c;
        // Folding back: the far ends lie on the same ray from the shared vertex.
        const double cr = cross2(shared, far1, far2);
        const double dt = (far1[0] - shared[0]) * (far2[0] - shared[0]) + (far1[1] - shared[1]) * (far2[1] - shared[1]);
        if (cr == 0 && dt > 0) return fmt::format("edges {} and {} fold back onto each other", i, j);
        continue;
      }
      if (segments_touch(a, b, c, d)) return fmt::format("edges {} and {} cross or touch (edge k joins point k to the next)", i, j);
    }
  if (!(std::abs(signed_area(v)) > 0)) return "the outline encloses no area";
  return {};
}

Polygon::Polygon(std::vector<Point2> vertices) : v_(std::move(vertices)) {
  const std::string problem = polygon_problem(v_);
  YG_CHECK(problem.empty(), problem);
}

double Polygon::area() const { return std::abs(signed_area(v_)); }

double Polygon::signed_distance(double u, double v) const {
  double d2 = std::numeric_limits<double>::infinity();
  bool inside = false;
  for (std::size_t i = 0, n = v_.size(), j = n - 1; i < n; j = i++) {
    const Point2 a = v_[j], b = v_[i];
    const double ex = b[0] - a[0], ey = b[1] - a[1], wx = u - a[0], wy = v - a[1];
    const double t = std::clamp((wx * ex + wy * ey) / (ex * ex + ey * ey), 0.0, 1.0);
    const double dx = wx - t * ex, dy = wy - t * ey;
    d2 = std::min(d2, dx * dx + dy * dy);
    // Even-odd rule: count edges crossing the horizontal ray to +u (half-open in v, so a vertex on
    // the ray counts once).
    if ((a[1] > v) != (b[1] > v) && u < a[0] + (v - a[1]) * ex / ey) inside = !inside;
  }
  return inside ? -std::sqrt(d2) : std::sqrt(d2);
}

}  // namespace yeegap::geometry
