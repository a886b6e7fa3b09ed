// Bloch plane wave: planes, sheet and TFSF corrections (see bloch_wave.h). An update that reads a
// neighbour across the plane gets the incident value there, added when the updated location is in the
// total field and removed when it is scattered; the terms follow from the updates of yee_kernels.cpp,
// written out in docs/physics.md 3.7.
#include "solver/sources/bloch_wave.h"

#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "solver/engine/bloch_halos.h"
#include "solver/media/material_map.h"

namespace yeegap::solver {

namespace {
// Cells between the absorber and the entry plane by default: the reflected-power plane sits two
// cells behind the entry plane and one cell must stay between it and the absorber.
constexpr int default_entry_margin = 4;
}  // namespace

Vec3 bloch_wave_k_parallel(const BlochWaveSpec& w, double index) {
  const double omega = w.reference_omega > 0 ? w.reference_omega : 0.5 * (w.waveform.omega_min + w.waveform.omega_max);
  const double k = index * omega / constants::c0 * std::sin(w.angle);
  Vec3 v;
  const int b = (w.axis + 1) % 3, c = (w.axis + 2) % 3;
  v[b] = k * std::cos(w.azimuth);
  v[c] = k * std::sin(w.azimuth);
  // An azimuth of 90 degrees leaves cos = 6e-17, not 0: the axis would need a Bloch phase for nothing.
  for (int a : {b, c})
    if (std::abs(v[a]) < 1e-12 * std::abs(k)) v[a] = 0;
  return v;
}

double bloch_wave_angle(double k_parallel, double index, double omega) {
  const double s = constants::c0 * k_parallel / (index * omega);
  return std::abs(s) <= 1 ? std::asin(s) : std::numeric_limits<double>::quiet_NaN();
}

BlochWavePlan plan_bloch_wave(const BlochWaveSpec& w, const Scene& s, const Grid& g) {
  const std::string at = w.where.location();
  BlochWavePlan p;
  p.axis = w.axis;
  p.sign = w.sign;
  const int a = w.axis, b = (a + 1) % 3, c = (a + 2) % 3;
  p.lateral_b = b, p.lateral_c = c;
  for (int t : {b, c}) {
    if (!g.periodic[t])
      throw RunError(fmt::format("{}: a plane_wave needs periodic or bloch edges on the lateral axis {} (the film is "
                                 "one period of an infinite plane)", at, "xyz"[t]));
    for (int i = 1; i < g.n[t]; ++i)
      if (std::abs(g.primal(t, i) - g.primal(t, 0)) > 1e-9 * g.primal(t, 0))
        throw RunError(fmt::format("{}: a plane_wave needs uniform cells along the lateral axis {} (refine zones "
                                   "there change the phase per cell)", at, "xyz"[t]));
  }
  if (g.periodic[a]) throw RunError(fmt::format("{}: the plane_wave's axis {} must not be periodic", at, "xyz"[a]));
  const DomainSpec& d = s.domain;
  const int n = g.n[a];
  const int abs_lo = d.edges[2 * a] == EdgeKind::cpml ? d.cpml.cells : 0;
  const int abs_hi = d.edges[2 * a + 1] == EdgeKind::cpml ? d.cpml.cells : 0;
  if ((w.sign > 0 ? abs_lo : abs_hi) == 0 || (w.sign > 0 ? abs_hi : abs_lo) == 0)
    throw RunError(fmt::format("{}: a plane_wave needs absorbing edges at both ends of its axis {}", at, "xyz"[a]));
  p.entry = w.position_given ? g.nearest_node(a, w.position)
                             : (w.sign > 0 ? abs_lo + default_entry_margin : n - abs_hi - default_entry_margin);
  p.reflected = p.entry - 2 * w.sign;
  p.sheet = p.entry - 2 * w.sign;
  p.transmitted = w.sign > 0 ? n - abs_hi - 2 : abs_lo + 2;
  const bool room_behind = w.sign > 0 ? p.reflected >= abs_lo + 1 : p.reflected <= n - abs_hi - 1;
  const bool room_ahead = w.sign * (p.transmitted - p.entry) >= 2;
  if (!room_behind || !room_ahead)
    throw RunError(fmt::format("{}: the plane_wave's entry plane (node {} of {} along {}) needs at least {} cells "
                               "between it and the absorber behind it and 2 cells ahead of it", at, p.entry, n,
                               "xyz"[a], 3));
  Vec3 point = d.center;
  point[a] = g.nodes[a][p.entry];
  p.material = material_at(s, point);
  const MaterialSpec& m = s.materials[p.material];
  if (m.perfect_conductor || m.poles.dispersive() || m.poles.conductivity != 0)
    throw RunError(fmt::format("{}: the plane_wave enters through '{}', which is lossy or dispersive; the incident "
                               "medium must be a lossless index (move 'position' into it)", at, m.name));
  p.index = std::sqrt(m.poles.eps_inf);
  p.reference_omega = w.reference_omega > 0 ? w.reference_omega : 0.5 * (w.waveform.omega_min + w.waveform.omega_max);
  p.k_parallel = bloch_wave_k_parallel(w, p.index);
  for (int t : {b, c})
    if (p.k_parallel[t] != 0 && !d.bloch[t])
      throw RunError(fmt::format("{}: at {:.4g} deg the wave varies along {}; make that axis's edges 'bloch'", at,
                                 w.angle * 180 / constants::pi, "xyz"[t]));
  // p polarization: E in the plane of incidence, driven by a current along k_par; s: across it.
  const double ca = std::cos(w.azimuth), sa = std::sin(w.azimuth);
  p.current[b] = w.p_polarized ? ca : -sa;
  p.current[c] = w.p_polarized ? sa : ca;
  return p;
}

// ---------------------------------------------------------------- sheet

BlochWaveSheet::BlochWaveSheet(const BlochWavePlan& p, const Grid& g, const BlockLayout& L,
                               const CurlCoefficients& curls, const ECoefficients& ec, const DomainSpec& d,
                               const Waveform& w, int part)
    : time_(w) {
  const int a = p.axis;
  const double eta = constants::eta0 / p.index;
  std::array<int, 3> idx{0, 0, 0};
  idx[a] = p.sheet;
  const double cb = ec.cb[p.material];
  for (int q = 0; q < 2; ++q) {
    const int t = q == 0 ? p.lateral_b : p.lateral_c;
    // E_t sits half a cell along t: its share of the plane wave's phase exp(i k_par . r).
    const double psi = 0.5 * bloch_phase(g, d, t) / g.n[t];
    comp_[q] = t;
    offset_[q] = L.at(idx[0], idx[1], idx[2]);
    weight_[q] = -cb * curls.e[a][p.sheet] * (-(2.0 / eta)) * p.current[t] * (part == 0 ? std::cos(psi) : std::sin(psi));
  }
}

void BlochWaveSheet::after_e(Fields& f, double t_h) {
  const double s = time_.moment(t_h);
  for (int q = 0; q < 2; ++q) f.c[comp_[q]][offset_[q]] += static_cast<real>(weight_[q] * s);
}

// ---------------------------------------------------------------- entry plane

BlochWaveEntry::BlochWaveEntry(const BlochWavePlan& p, const Grid& g, const BlockLayout& L,
                               const CurlCoefficients& curls, const ECoefficients& ec, const MaterialIndex& mi,
                               const DomainSpec& d, int part, const Fields* aux_re, const Fields* aux_im)
    : part_(part), aux_re_(aux_re), aux_im_(aux_im), layout_(L) {
  const int a = p.axis, b = p.lateral_b, c = p.lateral_c;
  nb_ = g.n[b], nc_ = g.n[c];
  const double phi_b = bloch_phase(g, d, b) / nb_, phi_c = bloch_phase(g, d, c) / nc_;
  for (int jc = 0; jc < nc_; ++jc)
    for (int ib = 0; ib < nb_; ++ib) {
      cos_.push_back(std::cos(phi_b * ib + phi_c * jc));
      sin_.push_back(std::sin(phi_b * ib + phi_c * jc));
    }
  // The E cells corrected must all hold the incident medium, or cb differs from the one used.
  for (int t : {b, c})
    for (int jc = 0; jc < nc_; ++jc)
      for (int ib = 0; ib < nb_; ++ib) {
        std::array<int, 3> idx{};
        idx[a] = p.entry, idx[b] = ib, idx[c] = jc;
        if (mi.e[t][L.at(idx[0], idx[1], idx[2])] != p.material)
          throw RunError("the plane_wave's entry plane must lie inside one material over the whole cell; a body "
                         "crosses it (move 'position')");
      }
  const BlockLayout& A = aux_re->layout;
  auto aux_at = [&](int node) {
    std::array<int, 3> idx{0, 0, 0};
    idx[a] = node - p.aux_offset;
    return A.at(idx[0], idx[1], idx[2]);
  };
  const double cbce = ec.cb[p.material] * curls.e[a][p.entry];
  const int h_node = p.sign > 0 ? p.entry - 1 : p.entry;  // the scattered-side H next to the plane
  const double ch = curls.h[a][h_node];
  const double s = p.sign;
  // E_b reads H_c at h_node, E_c reads H_b (signs from the updates above; see the file header).
  e_fix_ = {Fix{b, 3 + c, aux_at(h_node), +s * cbce}, Fix{c, 3 + b, aux_at(h_node), -s * cbce}};
  h_fix_ = {Fix{3 + b, c, aux_at(p.entry), -s * ch}, Fix{3 + c, b, aux_at(p.entry), +s * ch}};
  std::array<int, 3> base{0, 0, 0};
  base[a] = p.entry;
  lateral_stride_axis_ = {a, b, c};
  e_base_ = L.at(base[0], base[1], base[2]);
  base[a] = h_node;
  h_base_ = L.at(base[0], base[1], base[2]);
}

void BlochWaveEntry::apply(Fields& f, const std::vector<Fix>& fixes, std::ptrdiff_t base) const {
  const std::ptrdiff_t sb = layout_.stride(lateral_stride_axis_[1]), sc = layout_.stride(lateral_stride_axis_[2]);
  for (const Fix& x : fixes) {
    const double re = aux_re_->c[x.source][x.aux_offset];
    const double im = aux_im_ ? aux_im_->c[x.source][x.aux_offset] : 0.0;
    real* out = f.c[x.target].data() + base;
    std::size_t q = 0;
    for (int jc = 0; jc < nc_; ++jc)
      for (int ib = 0; ib < nb_; ++ib, ++q) {
        const double v = part_ == 0 ? re * cos_[q] - im * sin_[q] : re * sin_[q] + im * cos_[q];
        out[ib * sb + jc * sc] += static_cast<real>(x.coefficient * v);
      }
  }
}

void BlochWaveEntry::after_h(Fields& f) { apply(f, h_fix_, h_base_); }

void BlochWaveEntry::after_e(Fields& f, double) { apply(f, e_fix_, e_base_); }

}  // namespace yeegap::solver
