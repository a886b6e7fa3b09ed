// The tensor-product Yee grid: node coordinates per axis (non-uniform allowed), primal and dual
// spacings, and which axes are invariant (one cell, periodic). Yee positions on cell (i,j,k):
// Ex (i+1/2, j, k), Ey (i, j+1/2, k), Ez (i, j, k+1/2), Hx (i, j+1/2, k+1/2), Hy (i+1/2, j, k+1/2),
// Hz (i+1/2, j+1/2, k) (Yee 1966; Taflove & Hagness 2005, ch. 3).
#pragma once

#include <array>
#include <vector>

#include "base/vec3.h"
#include "solver/scene.h"

namespace yeegap::solver {

struct Grid {
  std::array<int, 3> n{};                      // cells per axis
  std::array<std::vector<double>, 3> nodes;    // n+1 node coordinates per axis, m
  std::array<bool, 3> periodic{};              // periodic (both faces) per axis
  std::array<bool, 3> mirror_low{};            // a symmetry plane at the low face per axis

  /// Builds a uniform grid covering the domain with cells of (at most) the requested step.
  static Grid uniform(const DomainSpec& domain);
  /// A grid from node coordinates per axis (strictly increasing, at least two per axis), as the
  /// graded mesh builder makes them (solver/engine/mesh_plan.h); periodic and mirror faces as in uniform().
  static Grid from_nodes(std::array<std::vector<double>, 3> nodes, const DomainSpec& domain);

  long long cell_count() const { return 1LL * n[0] * n[1] * n[2]; }
  /// Primal spacing of cell i on axis a: nodes[a][i+1] - nodes[a][i].
  double primal(int a, int i) const;
  /// Dual spacing at node i on axis a: distance between the centres of cells i-1 and i (wraps on
  /// periodic axes; half a cell at a bounded face).
  double dual(int a, int i) const;
  /// Coordinate of Yee position index i on axis a, staggered (half = true) or on a node.
  double position(int a, int i, bool half) const;
  /// True when axis a is one periodic cell: nothing varies along it (2D and 1D problems).
  bool invariant(int a) const { return n[a] == 1 && periodic[a]; }
  /// Smallest primal spacing over the axes that are not invariant, per axis.
  double min_spacing(int a) const;
  /// Courant limit 1 / (c sqrt(sum 1/d_min^2)) over the non-invariant axes (physics.md 3.2).
  double courant_limit() const;
  /// Index of the node nearest to x on axis a (clamped to [0, n]).
  int nearest_node(int a, double x) const;
  /// Index of the cell containing x on axis a (clamped to [0, n-1]).
  int cell_of(int a, double x) const;
};

/// Hard limits on the grid (RunError beyond them): an axis in an int with room for halos and index
/// arithmetic, and the whole grid well inside 64-bit array sizes (2^40 cells: 26 TB of fields).
inline constexpr double max_cells_per_axis = 1 << 24;
inline constexpr double max_cells_total = 1099511627776.0;
/// Throws RunError when cell counts per axis (as doubles, before any integer conversion) exceed them.
void check_grid_size(const std::array<double, 3>& cells);

/// Whether a field component sits half a cell off the nodes along axis a.
constexpr bool staggered(Component c, int a) {
  switch (c) {
    case Component::Ex: return a == 0;
    case Component::Ey: return a == 1;
    case Component::Ez: return a == 2;
    case Component::Hx: return a != 0;
    case Component::Hy: return a != 1;
    case Component::Hz: return a != 2;
  }
  return false;
}
constexpr bool is_electric(Component c) { return static_cast<int>(c) < 3; }
constexpr int axis_of(Component c) { return static_cast<int>(c) % 3; }

/// Physical position of component c at index (i, j, k).
Vec3 yee_position(const Grid& g, Component c, int i, int j, int k);

}  // namespace yeegap::solver
