// Scene -> mesh request -> grid (see mesh_plan.h). A gap narrower than a thousandth of the base
// step counts as touching (two stacked slabs share a face exactly, but rounding may leave a sliver).
#include "solver/engine/mesh_plan.h"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "base/errors.h"
#include "geometry/graded_mesh.h"

namespace yeegap::solver {
namespace {

constexpr double touching_fraction = 1e-3;
// Gaps narrower than this are below atomic dimensions (gold's nearest-neighbour distance is
// 0.288 nm: lattice constant 0.408 nm over sqrt 2, Kittel 2005, from memory): refined as asked, but noted.
constexpr double sub_atomic_gap = 0.1e-9;

bool unbounded(double v) { return !std::isfinite(v); }

// A conductor here: free carriers (a Drude pole or a static conductivity) or a perfect conductor.
bool conducts(const Scene& s, const BodySpec& b) {
  const MaterialSpec& m = s.materials.at(static_cast<std::size_t>(b.material));
  return m.perfect_conductor || !m.poles.drude.empty() || m.poles.conductivity > 0;
}

}  // namespace

double absorber_thickness(const Grid& g, int face, int cells) {
  const int a = face / 2;
  const auto& v = g.nodes[a];
  YG_CHECK(cells >= 0 && cells <= g.n[a], "absorber wider than its axis");
  return face % 2 == 0 ? v[cells] - v[0] : v[g.n[a]] - v[g.n[a] - cells];
}

MeshPlan plan_mesh(const Scene& s) {
  const DomainSpec& d = s.domain;
  // Given nodes (an auxiliary problem that must share another run's cells) are the grid as they are.
  if (!d.nodes[0].empty() && !d.nodes[1].empty() && !d.nodes[2].empty()) return {Grid::from_nodes(d.nodes, d), {}, {}};
  // Before any node is made: the base step and each refine zone give an upper estimate of the
  // cells per axis, so a slip of units (metres at a nanometre step) is refused, not allocated.
  std::array<double, 3> estimate{};
  for (int a = 0; a < 3; ++a) {
    YG_CHECK(d.size[a] > 0 && d.step[a] > 0, "domain size and step must be positive");
    estimate[a] = d.size[a] / d.step[a];
    for (const RefineZone& z : d.refine)
      if (z.step[a] > 0) estimate[a] += std::min(z.box.hi[a] - z.box.lo[a], d.size[a]) / z.step[a];
  }
  check_grid_size(estimate);
  geometry::MeshRequest q;
  q.domain = {d.center - 0.5 * d.size, d.center + 0.5 * d.size};
  q.base_step = d.step;
  q.ratio = d.grading_ratio;
  for (int f = 0; f < 6; ++f) q.absorber_cells[f] = d.edges[f] == EdgeKind::cpml ? d.cpml.cells : 0;
  for (int a = 0; a < 3; ++a) q.periodic[a] = d.edges[2 * a] == EdgeKind::periodic;
  for (const RefineZone& z : d.refine) q.zones.push_back({{z.box.lo, z.box.hi}, z.step});

  // Slab faces (a body bounded along one axis only) must be cell edges; the box extremes of
  // bounded bodies are cell edges where they cost nothing.
  std::vector<geometry::ShapePtr> shapes;
  std::vector<int> slab_axis;  // per body: the axis of a slab (bounded along one axis only), or -1
  for (const BodySpec& b : s.bodies) {
    shapes.push_back(b.shape);
    const geometry::Aabb box = b.shape->bounds();
    int finite_axes = 0, last_finite = -1;
    for (int a = 0; a < 3; ++a)
      if (!unbounded(box.lo[a]) || !unbounded(box.hi[a])) ++finite_axes, last_finite = a;
    slab_axis.push_back(finite_axes == 1 ? last_finite : -1);
    for (int a = 0; a < 3; ++a)
      for (double x : {box.lo[a], box.hi[a]}) {
        if (unbounded(x)) continue;
        (finite_axes == 1 ? q.interfaces[a] : q.optional_interfaces[a]).push_back(x);
      }
  }

  MeshPlan plan;
  if (d.gap_cells > 0 && shapes.size() > 1) {
    geometry::GapSearch search;
    const double base = std::max({d.step.x, d.step.y, d.step.z});
    // A gap of gap_cells base cells or more is resolved already; the margin keeps a gap of exactly
    // that width (4 nm on 1 nm cells) from being refined by rounding.
    search.max_width = d.gap_cells * base * (1 - 1e-6);
    search.region = q.domain;
    const double touching = touching_fraction * std::min({d.step.x, d.step.y, d.step.z});
    for (const geometry::Gap& g : geometry::find_gaps(shapes, search)) {
      // Two slabs along the same axis, not both conductors, enclose a layer of a stack (glass /
      // adhesion layer / gold), not a gap: refining it to gap_cells cells would shrink the time
      // step of a whole film run; a refine zone (or subcell averaging) resolves a thin layer when
      // the user asks. Between two conducting films (a metal-insulator-metal junction) the field
      // concentrates as in any gap, so that layer is refined.
      const auto a = static_cast<std::size_t>(g.body_a), b = static_cast<std::size_t>(g.body_b);
      if (slab_axis[a] >= 0 && slab_axis[a] == slab_axis[b] && !(conducts(s, s.bodies[a]) && conducts(s, s.bodies[b]))) {
        plan.notes.push_back(fmt::format("bodies {} and {} are slabs {:.3g} nm apart: a layer of a stack, not refined "
                                         "as a gap (a refine zone resolves it further)",
                                         g.body_a, g.body_b, g.width * 1e9));
        continue;
      }
      if (g.width < touching) {
        plan.notes.push_back(fmt::format("bodies {} and {} touch (gap {:.3g} nm): not refined", g.body_a, g.body_b,
                                         g.width * 1e9));
        continue;
      }
      if (g.width < sub_atomic_gap)
        plan.notes.push_back(fmt::format("bodies {} and {} are {:.3g} nm apart, less than an atom's size: in practice "
                                         "they touch; the gap is refined as given ({:.3g} nm cells set the time step)",
                                         g.body_a, g.body_b, g.width * 1e9, g.width / d.gap_cells * 1e9));
      geometry::add_gap_refinement(q, g, d.gap_cells);
      plan.gaps.push_back(g);
    }
  }

  geometry::GradedMesh m = geometry::build_graded_mesh(q);
  plan.notes.insert(plan.notes.end(), m.notes.begin(), m.notes.end());
  plan.grid = Grid::from_nodes(std::move(m.nodes), d);
  return plan;
}

}  // namespace yeegap::solver
