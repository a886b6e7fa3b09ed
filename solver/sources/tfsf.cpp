// TFSF corrections (see tfsf.h): each neighbour Q in a curl of yee_kernels.cpp enters with a known
// coefficient; where P and Q lie on different sides of the box, P gets + coefficient * incident(Q) if
// P is in the total field and - coefficient * incident(Q) if scattered. Updates: docs/physics.md 3.6.
#include "solver/sources/tfsf.h"

#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "solver/media/material_map.h"

namespace yeegap::solver {

namespace {

struct Box {
  std::array<int, 3> lo, hi;       // node index range per axis
  std::array<bool, 3> whole{};     // a periodic axis the box spans completely: no face there
  std::array<bool, 3> open_low{};  // the box starts on a symmetry plane: no face there either
};

// Whether component c at (i, j, k) lies in the total-field region.
bool total(const Box& b, int c, const std::array<int, 3>& idx) {
  const auto comp = static_cast<Component>(c);
  for (int a = 0; a < 3; ++a) {
    if (b.whole[a]) continue;
    const int i = idx[a];
    const bool above_low = b.open_low[a] || i >= b.lo[a];
    const bool inside = staggered(comp, a) ? (above_low && i < b.hi[a]) : (above_low && i <= b.hi[a]);
    if (!inside) return false;
  }
  return true;
}

// The box on the grid's nodes, refused (RunError) where it cannot work: too thin, across a mirror
// plane, against the plane's symmetry, reaching into an absorber, or without faces across the
// direction. Shared by the source and by the plan, so `check` refuses what `run` would.
Box place_box(const PlaneWaveSpec& spec, const Scene& scene, const Grid& g, const Vec3& e_dir) {
  const int ax = spec.axis;
  Box b;
  for (int a = 0; a < 3; ++a) {
    b.lo[a] = g.nearest_node(a, spec.box.lo[a]);
    b.hi[a] = g.nearest_node(a, spec.box.hi[a]);
    b.whole[a] = g.periodic[a] && b.lo[a] == 0 && b.hi[a] == g.n[a];
    if (g.invariant(a)) b.whole[a] = true;
    if (b.whole[a]) continue;
    if (b.hi[a] - b.lo[a] < 1)
      throw RunError(fmt::format("{}: the plane-wave box must be at least one cell across on every axis",
                                 spec.where.location()));
    b.open_low[a] = g.mirror_low[a] && b.lo[a] == 0;
    if (g.mirror_low[a] && a == ax)
      throw RunError(fmt::format("{}: a plane wave cannot travel across a mirror plane ({}_low); send it along "
                                 "the plane", spec.where.location(), "xyz"[a]));
    // The incident field must have the plane's symmetry: tangential E even on an even mirror,
    // normal E only on an odd one.
    if (b.open_low[a]) {
      const bool normal_e = std::abs(e_dir[a]) > 1e-9, tangential_e = std::abs(e_dir[a]) < 1 - 1e-9;
      const EdgeKind k = scene.domain.edges[2 * a];
      if ((k == EdgeKind::mirror_even && normal_e) || (k == EdgeKind::mirror_odd && tangential_e))
        throw RunError(fmt::format("{}: the plane wave's polarization breaks the {} symmetry of the {}_low plane: "
                                   "use E along the plane for mirror_even, across it for mirror_odd",
                                   spec.where.location(), edge_kind_names[static_cast<int>(k)], "xyz"[a]));
    }
    const int margin = b.open_low[a] ? 0 : (scene.domain.edges[2 * a] == EdgeKind::cpml ? scene.domain.cpml.cells + 1 : 1);
    const int margin_hi = scene.domain.edges[2 * a + 1] == EdgeKind::cpml ? scene.domain.cpml.cells + 1 : 1;
    if (b.lo[a] < margin || b.hi[a] > g.n[a] - margin_hi)
      throw RunError(fmt::format("{}: the plane-wave box must lie inside the domain, clear of the absorbing layers "
                                 "(axis {}: nodes {}..{} allowed, box has {}..{})",
                                 spec.where.location(), "xyz"[a], margin, g.n[a] - margin_hi, b.lo[a], b.hi[a]));
  }
  if (b.whole[ax]) throw RunError(fmt::format("{}: the plane-wave box needs faces across its direction", spec.where.location()));
  return b;
}

Vec3 unit_polarization(const PlaneWaveSpec& spec) {
  const double pol_len = norm(spec.polarization);
  if (!(pol_len > 0) || std::abs(spec.polarization[spec.axis]) > 1e-9 * pol_len)
    throw RunError(fmt::format("{}: the plane wave's polarization must be perpendicular to its direction",
                               spec.where.location()));
  return (1.0 / pol_len) * spec.polarization;
}

}  // namespace

void check_plane_wave_box(const PlaneWaveSpec& spec, const Scene& scene, const Grid& g) {
  place_box(spec, scene, g, unit_polarization(spec));
}

PlaneWaveSource::PlaneWaveSource(const PlaneWaveSpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L,
                                 const CurlCoefficients& curls, const ECoefficients& ec, const MaterialIndex& mi,
                                 double dt)
    : line_(g, spec.axis, spec.sign, scene.materials[scene.domain.background].poles.eps_inf, spec.amplitude,
            spec.waveform, -2, g.n[spec.axis] + 2, dt) {
  const int ax = spec.axis;
  const Vec3 e_dir = unit_polarization(spec);
  Vec3 a_dir;
  a_dir[ax] = spec.sign;
  const Vec3 h_dir = cross(a_dir, e_dir);

  const Box b = place_box(spec, scene, g, e_dir);
  reference_node_ = (b.lo[ax] + b.hi[ax]) / 2;

  const std::uint8_t background = static_cast<std::uint8_t>(scene.domain.background);
  // Scan one cell around the box surface; the interior and exterior far from it need nothing.
  std::array<int, 3> from{}, to{};
  for (int a = 0; a < 3; ++a) {
    from[a] = b.whole[a] || b.open_low[a] ? 0 : b.lo[a] - 1;
    to[a] = b.whole[a] ? g.n[a] - 1 : b.hi[a] + 1;
  }
  for (int c = 0; c < 6; ++c) {
    const bool electric = c < 3;
    const int base = c % 3, c1 = (base + 1) % 3, c2 = (base + 2) % 3;
    for (int k = from[2]; k <= to[2]; ++k)
      for (int j = from[1]; j <= to[1]; ++j)
        for (int i = from[0]; i <= to[0]; ++i) {
          const std::array<int, 3> p{i, j, k};
          bool near_face = false;
          for (int a = 0; a < 3; ++a)
            if (!b.whole[a] && (p[a] <= b.lo[a] || p[a] >= b.hi[a] - 1)) near_face = true;
          if (!near_face) continue;
          const bool p_total = total(b, c, p);
          // The four neighbours this update reads: (component, index offset along an axis, coefficient).
          struct Term { int comp; int axis; int step; double coef; };
          std::array<Term, 4> terms;
          if (electric) {
            terms = {Term{3 + c2, c1, 0, +curls.e[c1][p[c1]]}, Term{3 + c2, c1, -1, -curls.e[c1][p[c1]]},
                     Term{3 + c1, c2, 0, -curls.e[c2][p[c2]]}, Term{3 + c1, c2, -1, +curls.e[c2][p[c2]]}};
          } else {
            // curls.h already holds dt/mu0/d; the H update subtracts the curl.
            terms = {Term{c2, c1, +1, -curls.h[c1][p[c1]]}, Term{c2, c1, 0, +curls.h[c1][p[c1]]},
                     Term{c1, c2, +1, +curls.h[c2][p[c2]]}, Term{c1, c2, 0, -curls.h[c2][p[c2]]}};
          }
          for (const Term& t : terms) {
            std::array<int, 3> q = p;
            q[t.axis] += t.step;
            if (total(b, t.comp, q) == p_total) continue;
            const int inc_comp = t.comp % 3;
            const double dir = t.comp >= 3 ? h_dir[inc_comp] : e_dir[inc_comp];
            if (dir == 0) continue;
            const std::ptrdiff_t off = L.at(i, j, k);
            double coef = t.coef * dir * (p_total ? 1.0 : -1.0);
            if (electric) {
              if (mi.e[c][off] != background)
                throw RunError(fmt::format("{}: the plane-wave box surface must lie in the background material; a "
                                           "body crosses it",
                                           spec.where.location()));
              coef *= ec.cb[background];
            }
            (electric ? e_fix_ : h_fix_).push_back({c, off, q[ax], coef});
          }
        }
  }
}

void PlaneWaveSource::apply_h(Fields& f) {
  for (const Correction& c : h_fix_) f.c[c.component][c.offset] += static_cast<real>(c.coefficient * line_.e_at(c.line_index));
  line_.advance_h();
}

void PlaneWaveSource::apply_e(Fields& f, double t_h) {
  for (const Correction& c : e_fix_) f.c[c.component][c.offset] += static_cast<real>(c.coefficient * line_.h_at(c.line_index));
  line_.advance_e(t_h);
}

}  // namespace yeegap::solver
