// A simple closed polygon in a plane, as a 2D signed-distance function: the distance to the nearest
// edge (exact), negative inside by the even-odd crossing rule, which for a simple polygon is the
// inside test. The outline of a prism (prism.h): bowties, grating teeth, slits.
#pragma once

#include <array>
#include <string>
#include <vector>

namespace yeegap::geometry {

using Point2 = std::array<double, 2>;

class Polygon {
 public:
  /// Vertices in order (either orientation); the last joins the first. Must be simple (see
  /// polygon_problem); checked here.
  explicit Polygon(std::vector<Point2> vertices);
  /// Signed distance of (u, v) to the outline: < 0 inside. Exact.
  double signed_distance(double u, double v) const;
  /// Area (positive, whatever the vertex order).
  double area() const;
  const std::vector<Point2>& vertices() const { return v_; }

 private:
  std::vector<Point2> v_;
};

/// Why these vertices make no simple polygon (fewer than 3, repeated point, zero area, two edges
/// that cross or touch), naming the vertices or edges (counted from 0); empty when fine.
std::string polygon_problem(const std::vector<Point2>& vertices);

}  // namespace yeegap::geometry
