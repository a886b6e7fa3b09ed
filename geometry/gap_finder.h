// Gap finder: the narrowest surface-to-surface distance between two bodies and where it is, so the mesh
// can put cells across it. Samples d_A + d_B where both bodies are near (never below the gap, equal to
// it between the nearest points), then minimises d_B over A's surface by projected gradient steps with
// a line search. Exact for bodies with exact distances; one gap per pair, the narrowest.
#pragma once

#include <optional>
#include <vector>

#include "geometry/graded_mesh.h"
#include "geometry/shape.h"

namespace yeegap::geometry {

struct Gap {
  int body_a = 0, body_b = 0;  // indices in the list searched
  double width = 0;            // m; <= 0 when the bodies touch or overlap
  Vec3 point_a, point_b;       // the nearest points on A and on B
  Vec3 middle() const { return 0.5 * (point_a + point_b); }
};

struct GapSearch {
  double max_width = 0;        // m: wider gaps are not reported
  Aabb region;                 // where to look (the domain): bounds unbounded bodies
  int samples_per_axis = 16;   // first sampling of d_A + d_B
  int seeds = 8;               // best samples refined locally
};

/// The narrowest gap narrower than search.max_width between a and b, or nothing. Overlapping or
/// touching bodies give a gap of width <= 0.
std::optional<Gap> find_gap(const Shape& a, const Shape& b, const GapSearch& search);

/// find_gap for every pair of bodies; overlapping pairs are left out.
std::vector<Gap> find_gaps(const std::vector<ShapePtr>& bodies, const GapSearch& search);

/// Adds what a gap needs to a mesh request: on every axis along which the gap spans more than a
/// fifth of its width, a zone over the gap's extent with `cells_across` cells across the gap as
/// measured along that axis (width / |cos|: never finer than width / cells_across), and the two
/// nearest points' coordinates as gap interfaces (cell edges on the gap's faces, merged where
/// neighbouring gaps put them within half a cell of each other).
void add_gap_refinement(MeshRequest& request, const Gap& gap, int cells_across);

}  // namespace yeegap::geometry
