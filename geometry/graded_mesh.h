// Graded tensor-product mesh: nodes per axis with finer cells in refine zones, cell edges on given
// interfaces, uniform absorbing layers, neighbours differing by at most `ratio` (default 1.2, common
// practice). Cells equidistribute 1/S(x), S the largest cell allowed at x; a jump left over gets a
// zone at the smaller cell and a rebuild (docs/physics.md 3.1).
#pragma once

#include <array>
#include <string>
#include <vector>

#include "geometry/shape.h"

namespace yeegap::geometry {

/// A box with a finer cell size inside it; per axis, a step of 0 or infinity leaves that axis
/// alone (a gap needs fine cells only across it). The refinement acts on whole slabs of the
/// tensor grid: along axis a, every cell between box.lo[a] and box.hi[a] is at most step[a],
/// except in the absorbing layers, whose cells stay uniform (a zone reaching into a layer makes the
/// layer's cells smaller, within the ratio of the interior's, and the mesh notes it).
struct RefineZone {
  Aabb box;
  Vec3 step;
};

struct MeshRequest {
  Aabb domain;                                       // m, including the absorbing layers
  Vec3 base_step;                                    // m, the largest cell per axis
  std::vector<RefineZone> zones;
  std::array<std::vector<double>, 3> interfaces;     // coordinates that must be cell edges (slab
                                                     // faces, gap faces); those inside an absorber are dropped
  std::array<std::vector<double>, 3> optional_interfaces;  // made cell edges only where that forces
                                                     // no extra refinement (body box extremes)
  std::array<std::vector<double>, 3> gap_interfaces; // gap faces: cell edges, except that one within
                                                     // half an allowed cell of another edge merges into it
  std::array<int, 6> absorber_cells{};               // per face x-, x+, y-, y+, z-, z+; 0 = none
  std::array<bool, 3> periodic{};                    // the last cell neighbours the first
  double ratio = 1.2;                                // largest allowed neighbour-cell ratio, > 1
};

struct GradedMesh {
  std::array<std::vector<double>, 3> nodes;          // n + 1 coordinates per axis, m
  std::array<double, 6> absorber_step{};             // m, the uniform cell of each absorbing layer (0 = none)
  std::array<double, 3> min_step{}, max_step{};      // m, per axis
  std::array<bool, 3> periodic{};
  std::vector<std::string> notes;                    // interfaces dropped and why, for `check`

  std::array<int, 3> cells() const;
  long long cell_count() const;
  double smallest_cell() const;
  /// Largest ratio of neighbouring cells over all axes (periodic axes wrap).
  double largest_ratio() const;
};

/// Builds the mesh. An axis with no zone finer than its base step is exactly uniform, with
/// round(size / base) cells (as a plain uniform grid), and its interfaces are left where they fall;
/// on a refined axis every interface outside the absorbers is a node. Throws RunError if the layers
/// leave no room or the grading cannot be met.
GradedMesh build_graded_mesh(const MeshRequest& request);

/// One axis of the above.
struct AxisRequest {
  double lo = 0, hi = 0, base = 0, ratio = 1.2;
  struct Zone {
    double from, to, step;
  };
  std::vector<Zone> zones;
  std::vector<double> interfaces, optional_interfaces, gap_interfaces;
  int absorber_lo = 0, absorber_hi = 0;
  bool periodic = false;
};
struct AxisMesh {
  std::vector<double> nodes;
  double absorber_step_lo = 0, absorber_step_hi = 0;
  std::vector<std::string> notes;
};
AxisMesh build_axis(const AxisRequest& request);

}  // namespace yeegap::geometry
