// Grid geometry helpers (see grid.h).
#include "solver/engine/grid.h"

#include <algorithm>
#include <cmath>

#include "base/constants.h"
#include "base/errors.h"

#include <fmt/format.h>

namespace yeegap::solver {

void check_grid_size(const std::array<double, 3>& cells) {
  // Counts are formed in double first, so a domain of metres at a nanometre step is caught here and
  // never wraps an int (each axis) or the 64-bit array size (the product).
  for (int a = 0; a < 3; ++a)
    if (!(cells[a] <= max_cells_per_axis))
      throw RunError(fmt::format("domain: {:.4g} cells along {}, more than the {} one axis may hold; check the units "
                                 "of domain.size and domain.step",
                                 cells[a], "xyz"[a], max_cells_per_axis));
  const double total = cells[0] * cells[1] * cells[2];
  if (!(total <= max_cells_total))
    throw RunError(fmt::format("domain: {:.4g} x {:.4g} x {:.4g} = {:.4g} cells, more than the {:.4g} one run may hold "
                               "(about {:.3g} TB of fields); check the units of domain.size and domain.step, or refine "
                               "only where needed (domain.refine)",
                               cells[0], cells[1], cells[2], total, max_cells_total,
                               total * 6 * sizeof(float) / 1e12));
}

Grid Grid::uniform(const DomainSpec& d) {
  Grid g;
  std::array<double, 3> counts{};
  for (int a = 0; a < 3; ++a) {
    YG_CHECK(d.size[a] > 0 && d.step[a] > 0, "domain size and step must be positive");
    counts[a] = std::max(1.0, std::round(d.size[a] / d.step[a]));
  }
  check_grid_size(counts);
  for (int a = 0; a < 3; ++a) {
    // Round the cell count to the nearest integer so the requested size is kept exactly and the
    // step changes by at most half a cell over the whole axis.
    const int cells = static_cast<int>(counts[a]);
    g.n[a] = cells;
    g.periodic[a] = d.edges[2 * a] == EdgeKind::periodic;
    g.mirror_low[a] = is_mirror(d.edges[2 * a]);
    const double lo = d.center[a] - 0.5 * d.size[a];
    const double h = d.size[a] / cells;
    g.nodes[a].resize(cells + 1);
    for (int i = 0; i <= cells; ++i) g.nodes[a][i] = lo + h * i;
  }
  return g;
}

Grid Grid::from_nodes(std::array<std::vector<double>, 3> nodes, const DomainSpec& d) {
  check_grid_size({nodes[0].size() - 1.0, nodes[1].size() - 1.0, nodes[2].size() - 1.0});
  Grid g;
  for (int a = 0; a < 3; ++a) {
    YG_CHECK(nodes[a].size() >= 2, "a grid axis needs at least two nodes");
    for (std::size_t i = 0; i + 1 < nodes[a].size(); ++i)
      YG_CHECK(nodes[a][i + 1] > nodes[a][i], "grid nodes must increase strictly");
    g.n[a] = static_cast<int>(nodes[a].size()) - 1;
    g.nodes[a] = std::move(nodes[a]);
    g.periodic[a] = d.edges[2 * a] == EdgeKind::periodic;
    g.mirror_low[a] = is_mirror(d.edges[2 * a]);
  }
  return g;
}

double Grid::primal(int a, int i) const {
  const int m = n[a];
  if (periodic[a]) i = ((i % m) + m) % m;
  i = std::clamp(i, 0, m - 1);
  return nodes[a][i + 1] - nodes[a][i];
}

double Grid::dual(int a, int i) const {
  const int m = n[a];
  if (periodic[a]) return 0.5 * (primal(a, i - 1) + primal(a, i));
  // On a symmetry plane the mirror image supplies the other half-cell: the H values either side
  // of node 0 are a whole cell apart.
  if (i <= 0) return mirror_low[a] ? primal(a, 0) : 0.5 * primal(a, 0);
  if (i >= m) return 0.5 * primal(a, m - 1);
  return 0.5 * (primal(a, i - 1) + primal(a, i));
}

double Grid::position(int a, int i, bool half) const {
  const int m = n[a];
  const double length = nodes[a][m] - nodes[a][0];
  int wraps = 0;
  if (periodic[a]) {
    wraps = static_cast<int>(std::floor(static_cast<double>(i) / m));
    i -= wraps * m;
  }
  i = std::clamp(i, 0, m);
  double x = nodes[a][i];
  if (half) x += 0.5 * primal(a, i);
  return x + wraps * length;
}

double Grid::min_spacing(int a) const {
  double d = nodes[a][1] - nodes[a][0];
  for (int i = 1; i < n[a]; ++i) d = std::min(d, nodes[a][i + 1] - nodes[a][i]);
  return d;
}

double Grid::courant_limit() const {
  double s = 0;
  for (int a = 0; a < 3; ++a)
    if (!invariant(a)) s += 1.0 / (min_spacing(a) * min_spacing(a));
  YG_CHECK(s > 0, "at least one axis must vary");
  return 1.0 / (constants::c0 * std::sqrt(s));
}

int Grid::nearest_node(int a, double x) const {
  const auto& v = nodes[a];
  auto it = std::lower_bound(v.begin(), v.end(), x);
  int i = static_cast<int>(it - v.begin());
  if (i > 0 && (i == static_cast<int>(v.size()) || std::abs(v[i - 1] - x) <= std::abs(v[i] - x))) --i;
  return std::clamp(i, 0, n[a]);
}

int Grid::cell_of(int a, double x) const {
  const auto& v = nodes[a];
  int i = static_cast<int>(std::upper_bound(v.begin(), v.end(), x) - v.begin()) - 1;
  return std::clamp(i, 0, n[a] - 1);
}

Vec3 yee_position(const Grid& g, Component c, int i, int j, int k) {
  return {g.position(0, i, staggered(c, 0)), g.position(1, j, staggered(c, 1)), g.position(2, k, staggered(c, 2))};
}

}  // namespace yeegap::solver
