// Graded mesh builder (see graded_mesh.h). Per axis: the absorbing layers take fixed uniform cells
// at both ends; between them, the interfaces cut the axis into segments, each filled by
// equidistributing 1/S; then neighbour ratios are checked and fixed by extra zones, or by a
// smaller absorber cell when the absorber's cell is the larger one, and the axis is rebuilt.
#include "geometry/graded_mesh.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

constexpr double inf = std::numeric_limits<double>::infinity();
const char* const axis_names[] = {"x", "y", "z"};

// The grading slope of S is a little below ln(ratio), so that rounding in the equidistribution
// stays inside the allowed ratio.
constexpr double slope_margin = 0.95;
// Sub-steps per allowed cell when integrating 1/S (S changes by under 1 % per sub-step).
constexpr int substeps = 16;
// Rebuilds allowed while fixing ratio jumps; each adds zones, so this only stops a runaway.
constexpr int max_rebuilds = 200;
// An optional interface is kept only this many allowed cells away from every other interface.
constexpr double optional_clearance = 4.0;
// A gap face within this many allowed cells of another edge merges into it. Neighbouring gaps of an
// array find the same face up to rounding (1e-16 m apart), and two forced edges that close made
// cells of 1e-7 nm; the two faces of one gap are gap_cells allowed cells apart and never merge.
constexpr double gap_clearance = 0.5;

std::string nm(double x) { return fmt::format("{:.4g} nm", x * 1e9); }

struct Builder {
  const AxisRequest& r;
  double length, k;
  std::vector<AxisRequest::Zone> zones;  // user zones (clipped) and zones added by the fixes

  double allowed(double x) const {
    double s = r.base;
    for (const auto& z : zones) {
      double d = std::max({z.from - x, x - z.to, 0.0});
      if (r.periodic) {
        d = std::min({d, std::max({z.from - (x + length), x + length - z.to, 0.0}),
                      std::max({z.from - (x - length), x - length - z.to, 0.0})});
      }
      s = std::min(s, z.step + k * d);
    }
    return s;
  }

  // Nodes strictly between p and q (q itself is appended), equidistributing 1/S.
  void fill(double p, double q, std::vector<double>& out) const {
    std::vector<double> xs{p}, cs{0.0};
    double x = p, inv = 1.0 / allowed(p);
    while (x < q) {
      double x2 = x + allowed(x) / substeps;
      if (x2 >= q - 1e-12 * length) x2 = q;
      const double inv2 = 1.0 / allowed(x2);
      cs.push_back(cs.back() + 0.5 * (inv + inv2) * (x2 - x));
      xs.push_back(x2);
      x = x2;
      inv = inv2;
    }
    const double total = cs.back();
    // A hair below an integer counts as that integer: a gap of exactly 4 zone steps is 4 cells.
    const int n = std::max(1, static_cast<int>(std::ceil(total - 1e-6)));
    std::size_t m = 0;
    for (int j = 1; j < n; ++j) {
      const double target = total * j / n;
      while (m + 1 < cs.size() && cs[m + 1] < target) ++m;
      const double f = (target - cs[m]) / (cs[m + 1] - cs[m]);
      out.push_back(xs[m] + f * (xs[m + 1] - xs[m]));
    }
    out.push_back(q);
  }
};

}  // namespace

namespace {

// The cell edges an axis must have between its absorbing layers (A and B): the layers' inner faces,
// the interfaces (those inside a layer are noted, not kept), gap faces clear of the others, and the
// optional interfaces (zone edges among them) where they cost no extra cells.
std::vector<double> pinned_edges(const AxisRequest& r, const Builder& b, double A, double B, std::size_t user_zones,
                                 std::vector<std::string>& notes) {
  const double merge = 1e-9 * (r.hi - r.lo);
  std::vector<double> pins = {A, B};
  for (double x : r.interfaces) {
    if (x > A + merge && x < B - merge) pins.push_back(x);
    else if (x > r.lo && x < r.hi && std::abs(x - A) > merge && std::abs(x - B) > merge)
      notes.push_back(fmt::format("interface at {} lies in an absorbing layer; not made a cell edge", nm(x)));
  }
  std::sort(pins.begin(), pins.end());
  pins.erase(std::unique(pins.begin(), pins.end(), [&](double u, double v) { return v - u <= merge; }), pins.end());
  // Gap faces, in order along the axis so that a run of near twins keeps its first member.
  std::vector<double> gap_faces = r.gap_interfaces;
  std::sort(gap_faces.begin(), gap_faces.end());
  for (double x : gap_faces) {
    if (!(x > A && x < B)) continue;
    const double clear = gap_clearance * b.allowed(x);
    const auto at = std::lower_bound(pins.begin(), pins.end(), x);
    const bool near_next = at != pins.end() && *at - x < clear;
    const bool near_previous = at != pins.begin() && x - *(at - 1) < clear;
    if (!near_next && !near_previous) pins.insert(at, x);
  }
  std::vector<double> optional = r.optional_interfaces;
  for (std::size_t z = 0; z < user_zones; ++z) {
    optional.push_back(b.zones[z].from);
    optional.push_back(b.zones[z].to);
  }
  for (double x : optional) {
    if (!(x > A && x < B)) continue;
    const double clear = optional_clearance * b.allowed(x);
    const bool free = std::all_of(pins.begin(), pins.end(), [&](double p) { return std::abs(p - x) >= clear; });
    if (free) pins.insert(std::upper_bound(pins.begin(), pins.end(), x), x);
  }
  return pins;
}

// Notes on a finished axis: user zones that lie in an absorbing layer (they refine nothing), and
// layers whose cells were made finer than the base step to grade into the interior.
void note_layers(const AxisRequest& r, const Builder& b, double A, double B, std::size_t user_zones, double h_lo,
                 double h_hi, std::vector<std::string>& notes) {
  for (std::size_t z = 0; z < user_zones; ++z)
    if (b.zones[z].to <= A || b.zones[z].from >= B)
      notes.push_back(fmt::format("the refine zone from {} to {} lies in an absorbing layer, whose cells stay "
                                  "uniform: it refines nothing", nm(b.zones[z].from), nm(b.zones[z].to)));
  if (h_lo > 0 && h_lo < r.base * (1 - 1e-12))
    notes.push_back(fmt::format("the low absorbing layer uses cells of {} (base {}) to grade into the interior",
                                nm(h_lo), nm(r.base)));
  if (h_hi > 0 && h_hi < r.base * (1 - 1e-12))
    notes.push_back(fmt::format("the high absorbing layer uses cells of {} (base {}) to grade into the interior",
                                nm(h_hi), nm(r.base)));
}

}  // namespace

AxisMesh build_axis(const AxisRequest& r) {
  const double length = r.hi - r.lo;
  YG_CHECK(length > 0 && r.base > 0 && r.ratio > 1, "an axis needs hi > lo, a positive base step and a ratio > 1");
  YG_CHECK(r.absorber_lo >= 0 && r.absorber_hi >= 0, "absorber cells must not be negative");
  AxisMesh out;
  const int n_uniform = std::max(1, static_cast<int>(std::lround(length / r.base)));
  const double h_uniform = length / n_uniform;

  Builder b{r, length, slope_margin * std::log(r.ratio), {}};
  for (const auto& z : r.zones) {
    if (!(z.step > 0 && z.step < r.base * (1 - 1e-12))) continue;  // not finer: nothing to do
    const double from = std::max(z.from, r.lo), to = std::min(z.to, r.hi);
    if (from > to) continue;
    b.zones.push_back({from, to, z.step});
  }
  // A one-cell periodic axis is an invariant direction: it stays one cell.
  const bool invariant = r.periodic && n_uniform == 1;
  if (invariant && !b.zones.empty()) {
    out.notes.push_back("refinement along an invariant (one-cell periodic) axis is ignored");
    b.zones.clear();
  }

  auto uniform = [&]() {
    for (int i = 0; i <= n_uniform; ++i) out.nodes.push_back(i == n_uniform ? r.hi : r.lo + h_uniform * i);
    out.absorber_step_lo = r.absorber_lo > 0 ? h_uniform : 0;
    out.absorber_step_hi = r.absorber_hi > 0 ? h_uniform : 0;
    return out;
  };
  // An axis that nothing refines stays uniform, interfaces or not: with staircased materials a face
  // midway between nodes gives a layer its exact thickness, which a node on the face would not
  // (until the permittivity is averaged over the cells a face cuts).
  if (invariant || b.zones.empty()) return uniform();

  double h_lo = r.absorber_lo > 0 ? r.base : 0, h_hi = r.absorber_hi > 0 ? r.base : 0;
  const std::size_t user_zones = b.zones.size();
  for (int rebuild = 0; rebuild < max_rebuilds; ++rebuild) {
    out = AxisMesh{};
    const double A = r.lo + r.absorber_lo * h_lo, B = r.hi - r.absorber_hi * h_hi;
    if (!(B - A > 0))
      throw RunError(fmt::format("the absorbing layers ({} + {} cells) leave no room on an axis of {}", r.absorber_lo,
                                 r.absorber_hi, nm(length)));
    const std::vector<double> pins = pinned_edges(r, b, A, B, user_zones, out.notes);

    std::vector<double>& nodes = out.nodes;
    for (int i = 0; i < r.absorber_lo; ++i) nodes.push_back(r.lo + h_lo * i);
    nodes.push_back(A);
    for (std::size_t s = 0; s + 1 < pins.size(); ++s) b.fill(pins[s], pins[s + 1], nodes);
    for (int i = r.absorber_hi - 1; i >= 0; --i) nodes.push_back(i == 0 ? r.hi : r.hi - h_hi * i);
    out.absorber_step_lo = h_lo;
    out.absorber_step_hi = h_hi;

    // Neighbour ratios; periodic axes wrap.
    const int n = static_cast<int>(nodes.size()) - 1;
    auto cell = [&](int i) { return nodes[i + 1] - nodes[i]; };
    bool fixed_any = false;
    for (int i = 0; i < (r.periodic ? n : n - 1); ++i) {
      const int j = (i + 1) % n;
      const double ci = cell(i), cj = cell(j);
      if (std::max(ci, cj) <= r.ratio * (1 + 1e-9) * std::min(ci, cj)) continue;
      const int small = ci < cj ? i : j, big = ci < cj ? j : i;
      const double cs = cell(small);
      fixed_any = true;
      if (big < r.absorber_lo) h_lo = std::min(h_lo, 0.99 * r.ratio * cs);
      else if (big >= n - r.absorber_hi) h_hi = std::min(h_hi, 0.99 * r.ratio * cs);
      else b.zones.push_back({nodes[small], nodes[small + 1], cs});
    }
    if (!fixed_any) {
      for (int i = 0; i < n; ++i) YG_CHECK(cell(i) > 0, "graded mesh produced an empty cell");
      note_layers(r, b, A, B, user_zones, h_lo, h_hi, out.notes);
      return out;
    }
  }
  throw RunError(fmt::format("could not grade an axis of {} within a cell ratio of {} after {} rebuilds", nm(length),
                             r.ratio, max_rebuilds));
}

std::array<int, 3> GradedMesh::cells() const {
  return {static_cast<int>(nodes[0].size()) - 1, static_cast<int>(nodes[1].size()) - 1,
          static_cast<int>(nodes[2].size()) - 1};
}

long long GradedMesh::cell_count() const {
  const auto n = cells();
  return 1LL * n[0] * n[1] * n[2];
}

double GradedMesh::smallest_cell() const { return std::min({min_step[0], min_step[1], min_step[2]}); }

double GradedMesh::largest_ratio() const {
  double worst = 1;
  for (int a = 0; a < 3; ++a) {
    const auto& v = nodes[a];
    const int n = static_cast<int>(v.size()) - 1;
    for (int i = 0; i < (periodic[a] ? n : n - 1); ++i) {
      const int j = (i + 1) % n;
      const double c0 = v[i + 1] - v[i], c1 = v[j + 1] - v[j];
      worst = std::max(worst, std::max(c0, c1) / std::min(c0, c1));
    }
  }
  return worst;
}

GradedMesh build_graded_mesh(const MeshRequest& q) {
  GradedMesh m;
  for (int a = 0; a < 3; ++a) {
    AxisRequest r;
    r.lo = q.domain.lo[a];
    r.hi = q.domain.hi[a];
    r.base = q.base_step[a];
    r.ratio = q.ratio;
    for (const RefineZone& z : q.zones)
      if (z.step[a] > 0 && std::isfinite(z.step[a])) r.zones.push_back({z.box.lo[a], z.box.hi[a], z.step[a]});
    r.interfaces = q.interfaces[a];
    r.optional_interfaces = q.optional_interfaces[a];
    r.gap_interfaces = q.gap_interfaces[a];
    r.absorber_lo = q.absorber_cells[2 * a];
    r.absorber_hi = q.absorber_cells[2 * a + 1];
    r.periodic = q.periodic[a];
    AxisMesh axis = build_axis(r);
    m.nodes[a] = std::move(axis.nodes);
    m.periodic[a] = q.periodic[a];
    m.absorber_step[2 * a] = axis.absorber_step_lo;
    m.absorber_step[2 * a + 1] = axis.absorber_step_hi;
    for (auto& note : axis.notes) m.notes.push_back(fmt::format("{}: {}", axis_names[a], note));
    m.min_step[a] = inf;
    m.max_step[a] = 0;
    for (std::size_t i = 0; i + 1 < m.nodes[a].size(); ++i) {
      m.min_step[a] = std::min(m.min_step[a], m.nodes[a][i + 1] - m.nodes[a][i]);
      m.max_step[a] = std::max(m.max_step[a], m.nodes[a][i + 1] - m.nodes[a][i]);
    }
  }
  return m;
}

}  // namespace yeegap::geometry
