// Integration weights over a surface of the Yee grid, shared by the flux and far-field recorders:
// a component on nodes is integrated by the trapezoid rule (half of each neighbouring cell inside
// the range), one staggered half a cell by the midpoint rule (the whole cell).
#pragma once

#include <vector>

#include "solver/engine/grid.h"

namespace yeegap::solver {

/// Trapezoid weights of nodes first..last on axis a, m.
inline std::vector<double> node_weights(const Grid& g, int a, int first, int last) {
  std::vector<double> w;
  for (int i = first; i <= last; ++i)
    w.push_back((i > first ? 0.5 * g.primal(a, i - 1) : 0.0) + (i < last ? 0.5 * g.primal(a, i) : 0.0));
  return w;
}

/// Midpoint weights of cells first..last-1 on axis a, m.
inline std::vector<double> cell_weights(const Grid& g, int a, int first, int last) {
  std::vector<double> w;
  for (int i = first; i < last; ++i) w.push_back(g.primal(a, i));
  return w;
}

}  // namespace yeegap::solver
