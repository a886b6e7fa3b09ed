// Small scene builders for solver tests: a vacuum box with chosen edges, sizes in cells.
#pragma once

#include "solver/scene.h"

namespace yeegap::solver::testing {

inline Scene vacuum_box(std::array<int, 3> cells, double step, std::array<EdgeKind, 6> edges) {
  Scene s;
  s.file = "test";
  s.domain.step = {step, step, step};
  for (int a = 0; a < 3; ++a) s.domain.size[a] = cells[a] * step;
  s.domain.edges = edges;
  MaterialSpec vacuum;
  vacuum.name = "vacuum";
  s.materials.push_back(vacuum);
  return s;
}

inline std::array<EdgeKind, 6> all_edges(EdgeKind k) { return {k, k, k, k, k, k}; }

/// Least-squares angular frequency of a sampled single sinusoid from the exact three-term
/// recurrence x[n+1] + x[n-1] = 2 cos(omega dt) x[n] (holds for any amplitude and phase).
inline double recurrence_omega(const std::vector<double>& x, double dt) {
  double num = 0, den = 0;
  for (std::size_t n = 1; n + 1 < x.size(); ++n) {
    num += x[n] * (x[n + 1] + x[n - 1]);
    den += 2 * x[n] * x[n];
  }
  return std::acos(num / den) / dt;
}

}  // namespace yeegap::solver::testing
