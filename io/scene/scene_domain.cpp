// The `domain` block: size, centre, base cell step, what happens at each of the six faces, the
// CPML settings, the background material and the time-step controls. Only checks that
// need nothing but the scene live here; grid and stability checks are the solver's.
#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"

namespace yeegap::io {
namespace {

using solver::EdgeKind;

// In the order of solver::EdgeKind, then 'bloch': a periodic edge whose copies carry the phase of
// the in-plane wavevector (set by a plane_wave's angle).
const std::vector<std::string> edge_words = {"cpml", "periodic", "metal", "mirror_even", "mirror_odd", "bloch"};
constexpr std::size_t bloch_word = 5;

struct Edge {
  EdgeKind kind = EdgeKind::cpml;
  bool bloch = false;
};
const char* const axis_names[] = {"x", "y", "z"};
const char* const face_names[] = {"x_low", "x_high", "y_low", "y_high", "z_low", "z_high"};

Edge read_edge(const Node& v) {
  if (v.is_scalar() && v.text() == "absorber") v.fail("'absorber' is now called 'cpml' (a convolutional PML)");
  const std::string w = read_word(v, edge_words);
  if (w == edge_words[bloch_word]) return {EdgeKind::periodic, true};
  for (std::size_t i = 0; i < bloch_word; ++i)
    if (w == edge_words[i]) return {static_cast<EdgeKind>(i), false};
  return {};  // unreachable: read_word accepted one of edge_words
}

/// One word for all faces, or a block with per-axis (x) or per-face (x_low) words; faces not named
/// are absorbers.
std::array<Edge, 6> read_edges(const Node& v) {
  std::array<Edge, 6> edges;
  if (v.is_scalar()) {
    edges.fill(read_edge(v));
    return edges;
  }
  if (!v.is_map())
    v.fail(fmt::format("must be one of {} for all faces, or a block such as {{x: periodic, z: cpml}}, got {}",
                       fmt::format("{}", fmt::join(edge_words, ", ")), v.found()));
  v.allow({"x", "y", "z", "x_low", "x_high", "y_low", "y_high", "z_low", "z_high"});
  for (int a = 0; a < 3; ++a) {
    if (auto both = v.get(axis_names[a])) {
      for (int side = 0; side < 2; ++side)
        if (v.has(face_names[2 * a + side]))
          v.fail_key(face_names[2 * a + side],
                     fmt::format("{}: '{}' already sets both {} faces; give either '{}' or '{}'/'{}'", v.path(),
                                 axis_names[a], axis_names[a], axis_names[a], face_names[2 * a], face_names[2 * a + 1]));
      edges[2 * a] = edges[2 * a + 1] = read_edge(*both);
    }
    for (int side = 0; side < 2; ++side)
      if (auto face = v.get(face_names[2 * a + side])) edges[2 * a + side] = read_edge(*face);
  }
  v.done();
  return edges;
}

void read_cpml(const Node& block, solver::CpmlSpec& abs) {
  block.allow({"cells", "grading_order", "reflection", "kappa_max", "alpha_max"});
  if (auto cells = block.get("cells")) {
    const long n = read_whole_number(*cells, 1);
    // Far beyond any grid's cells per axis (2^24, grid.h), and small enough that the layers' total
    // cannot overflow an int (the fuzzer's 2147483647 did).
    if (n > (1L << 24)) cells->fail(fmt::format("is far too large, got '{}'", cells->text()));
    abs.cells = static_cast<int>(n);  // too many for the domain is refused below, with the sizes
  }
  if (auto m = block.get("grading_order")) abs.grading_order = read_positive_number(*m);
  if (auto r = block.get("reflection")) {
    abs.reflection = read_number(*r);
    if (!(abs.reflection > 0 && abs.reflection < 1))
      r->fail(fmt::format("must be a reflection between 0 and 1 (e.g. 1e-8), got '{}'", r->text()));
  }
  if (auto kappa = block.get("kappa_max")) {
    abs.kappa_max = read_number(*kappa);
    if (!(abs.kappa_max >= 1)) kappa->fail(fmt::format("must be at least 1, got '{}'", kappa->text()));
  }
  if (auto alpha = block.get("alpha_max")) abs.alpha_max = read_conductivity(*alpha);
  block.done();
}

/// `refine: [{from, to, step}, ...]`: boxes of finer cells, inside the domain, no coarser than the
/// base step along any axis (a zone only makes cells finer).
void read_refine(const Node& list, solver::DomainSpec& d) {
  for (const Node& z : list.items_or_single()) {
    if (!z.is_map()) z.fail(fmt::format("must be a block {{from, to, step}}, got {}", z.found()));
    z.allow({"from", "to", "step"});
    const Node from = z.require("from"), to = z.require("to"), step = z.require("step");
    const Vec3 a = read_position(from), b = read_position(to);
    check_inside_domain(from, a, d);
    check_inside_domain(to, b, d);
    solver::RefineZone zone;
    for (int i = 0; i < 3; ++i) {
      zone.box.lo[i] = std::min(a[i], b[i]);  // corners in either order
      zone.box.hi[i] = std::max(a[i], b[i]);
    }
    zone.step = read_extent(step);
    for (int i = 0; i < 3; ++i)
      if (zone.step[i] > d.step[i] * (1 + 1e-9))
        step.fail(fmt::format("the zone's step {} along {} is coarser than domain.step {}: a zone can only make cells "
                              "finer", format_length(zone.step[i]), axis_names[i], format_length(d.step[i])));
    z.done();
    d.refine.push_back(zone);
  }
}

}  // namespace

solver::Region domain_bounds(const solver::DomainSpec& d) {
  return {d.center - 0.5 * d.size, d.center + 0.5 * d.size};
}

void check_inside_domain(const Node& v, const Vec3& p, const solver::DomainSpec& d) {
  const solver::Region box = domain_bounds(d);
  for (int a = 0; a < 3; ++a) {
    // Slack for unit conversion rounding: "200 nm" on the face of a 400 nm domain must count as inside.
    const double slack = 1e-9 * d.size[a];
    if (p[a] < box.lo[a] - slack || p[a] > box.hi[a] + slack) {
      // Point at the offending coordinate when the point was written as a list.
      const Node at = v.is_list() && v.items().size() == 3 ? v.items()[static_cast<std::size_t>(a)] : v;
      at.fail(fmt::format("{} = {} lies outside the domain, which spans {} to {} along {}", axis_names[a],
                          format_length(p[a]), format_length(box.lo[a]), format_length(box.hi[a]), axis_names[a]));
    }
  }
}

void read_domain(const Node& block, solver::Scene& scene) {
  // Keys renamed in version 1 of the scene format's second wave (#15): say the new word.
  if (block.is_map() && block.has("absorber"))
    block.fail_key("absorber", fmt::format("{}.absorber is now {}.cpml (the absorbing layers are a convolutional PML)",
                                           block.path(), block.path()));
  if (block.is_map() && block.has("courant"))
    block.fail_key("courant", fmt::format("{}.courant is now {}.stability_fraction (the time step as a fraction of "
                                          "the stability limit)", block.path(), block.path()));
  block.allow({"size", "center", "step", "edges", "cpml", "background", "stability_fraction", "time_step", "refine",
               "gap_cells", "grading", "averaging"});
  solver::DomainSpec& d = scene.domain;
  d.size = read_extent(block.require("size"));
  if (auto center = block.get("center")) d.center = read_position(*center);
  const Node step = block.require("step");
  d.step = read_extent(step);
  for (int a = 0; a < 3; ++a)
    if (d.step[a] > d.size[a])
      step.fail(fmt::format("the cell step {} along {} is larger than the domain size {}", format_length(d.step[a]),
                            axis_names[a], format_length(d.size[a])));

  if (auto edges = block.get("edges")) {
    const std::array<Edge, 6> read = read_edges(*edges);
    for (int f = 0; f < 6; ++f) d.edges[f] = read[f].kind;
    for (int a = 0; a < 3; ++a) {
      if (read[2 * a].bloch != read[2 * a + 1].bloch)
        edges->fail(fmt::format("{} is bloch but {} is not: bloch applies to both faces of an axis",
                                face_names[read[2 * a].bloch ? 2 * a : 2 * a + 1],
                                face_names[read[2 * a].bloch ? 2 * a + 1 : 2 * a]));
      d.bloch[a] = read[2 * a].bloch;
    }
    for (int a = 0; a < 3; ++a) {
      const bool lo = d.edges[2 * a] == EdgeKind::periodic, hi = d.edges[2 * a + 1] == EdgeKind::periodic;
      if (solver::is_mirror(d.edges[2 * a + 1]))
        edges->fail(fmt::format("{}_high is {}: a symmetry plane goes on a low face; place the domain so the plane "
                                "is its {}_low face", axis_names[a],
                                solver::edge_kind_names[static_cast<int>(d.edges[2 * a + 1])], axis_names[a]));
      if (lo != hi)
        edges->fail(fmt::format("{} is periodic but {} is {}: periodic applies to both faces of an axis",
                                face_names[lo ? 2 * a : 2 * a + 1], face_names[lo ? 2 * a + 1 : 2 * a],
                                solver::edge_kind_names[static_cast<int>(d.edges[lo ? 2 * a + 1 : 2 * a])]));
    }
  } else {
    d.edges.fill(EdgeKind::cpml);
  }

  if (auto layers = block.get("cpml")) read_cpml(*layers, d.cpml);
  for (int a = 0; a < 3; ++a) {
    const int faces = (d.edges[2 * a] == EdgeKind::cpml) + (d.edges[2 * a + 1] == EdgeKind::cpml);
    const double thickness = faces * d.cpml.cells * d.step[a];
    // Equal within rounding counts as full: "2 x 40 cells x 5 nm" in a 400 nm domain leaves nothing.
    if (faces > 0 && thickness >= d.size[a] * (1 - 1e-9))
      block.fail(fmt::format("the absorber layers take {} x {} cells x {} = {} along {}, leaving no room in a "
                             "domain of {}", faces, d.cpml.cells, format_length(d.step[a]),
                             format_length(thickness), axis_names[a], format_length(d.size[a])));
  }

  if (auto background = block.get("background")) d.background = material_index(*background, scene);
  else d.background = builtin_or_defined(builtin_vacuum, scene);

  if (auto fraction = block.get("stability_fraction")) {
    d.stability_fraction = read_number(*fraction);
    // Below a thousandth the run takes a thousand times the steps it needs, and 1e-320 made the
    // step count overflow (found by fuzzing): a slip, not a setting.
    if (!(d.stability_fraction >= 1e-3 && d.stability_fraction <= 1))
      fraction->fail(fmt::format("must be a fraction of the stability limit in [0.001, 1], got '{}'", fraction->text()));
  }
  if (auto dt = block.get("time_step")) d.time_step = read_positive_time(*dt);
  if (auto refine = block.get("refine")) read_refine(*refine, d);
  if (auto gap = block.get("gap_cells")) {
    const long n = read_whole_number(*gap, 0);
    if (n > 1000) gap->fail(fmt::format("is far too many cells across a gap, got '{}'", gap->text()));
    d.gap_cells = static_cast<int>(n);
  }
  if (auto grading = block.get("grading")) {
    d.grading_ratio = read_number(*grading);
    if (!(d.grading_ratio > 1 && d.grading_ratio <= 2))
      grading->fail(fmt::format("must be the largest ratio of neighbouring cells, above 1 and at most 2 (1.2 is common "
                                "practice), got '{}'", grading->text()));
  }
  // Subcell averaging at interfaces (solver/media/subcell_average.h), or the plain staircase to compare.
  if (auto averaging = block.get("averaging")) d.averaging = read_word(*averaging, {"on", "off"}) == "on";
  block.done();
}

}  // namespace yeegap::io
