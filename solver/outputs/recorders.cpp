// Probes, field maps and flux surfaces (see recorders.h). The Poynting flux through a face with
// normal a uses the components tangential to it, b = a+1 and c = a+2 (cyclic):
//   S_a = Re[E_b H_c^* - E_c H_b^*] / 2,
// with H averaged over the two half-cells beside the E plane so both factors share a location,
// integrated by the trapezoid rule over the face's nodes.
#include "solver/outputs/recorders.h"
#include "solver/outputs/surface_weights.h"
#include "solver/engine/simulation_state.h"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::solver {

std::array<int, 2> node_range(const Grid& g, int a, double lo, double hi) {
  if (g.invariant(a)) return {0, 1};
  return {g.nearest_node(a, lo), g.nearest_node(a, hi)};
}

namespace {

// Storage indices of positions first..last on axis a for a component on nodes (or staggered,
// then starting one lower so node values can be interpolated). Wraps periodic axes, clamps others.
std::vector<int> sample_indices(const Grid& g, int a, int first, int last, bool half) {
  std::vector<int> v;
  const int n = g.n[a];
  for (int i = half ? first - 1 : first; i <= last; ++i) {
    int m = i;
    if (g.periodic[a]) m = ((m % n) + n) % n;
    else m = std::clamp(m, 0, half ? n - 1 : n);
    v.push_back(m);
  }
  return v;
}

std::vector<int> cell_indices(const Grid& g, int a, int first, int last) {
  std::vector<int> v;
  for (int i = first; i < last; ++i) v.push_back(g.periodic[a] ? i % g.n[a] : i);
  return v;
}

std::vector<int> node_indices(const Grid& g, int a, int first, int last) {
  std::vector<int> v;
  for (int i = first; i <= last; ++i) v.push_back(g.periodic[a] ? i % g.n[a] : i);
  return v;
}


}  // namespace

// ---------------------------------------------------------------- probe

ProbeRecorder::ProbeRecorder(const ProbeSpec& spec, const Grid& g, const BlockLayout& L) {
  result_.name = spec.name;
  result_.position = spec.position;
  result_.components = spec.components;
  for (Component c : spec.components) {
    int idx[3];
    for (int a = 0; a < 3; ++a) {
      if (g.invariant(a)) {
        idx[a] = 0;
        continue;
      }
      // Nearest Yee position of this component along a.
      const bool half = staggered(c, a);
      int best = 0;
      double d = 1e300;
      for (int i = 0; i < g.n[a] + (half ? 0 : 1); ++i) {
        const double e = std::abs(g.position(a, i, half) - spec.position[a]);
        if (e < d) d = e, best = i;
      }
      idx[a] = best;
    }
    offsets_.push_back(L.at(idx[0], idx[1], idx[2]));
    result_.sampled_at.push_back(yee_position(g, c, idx[0], idx[1], idx[2]));
    result_.values.emplace_back();
  }
}

void ProbeRecorder::record(const Fields& f, bool electric, double t) {
  if (electric) result_.time.push_back(t);
  for (std::size_t q = 0; q < offsets_.size(); ++q) {
    const Component c = result_.components[q];
    if (is_electric(c) == electric) result_.values[q].push_back(f[c][offsets_[q]]);
  }
}

// ---------------------------------------------------------------- field map

FieldMapRecorder::FieldMapRecorder(const FieldMapSpec& spec, const Grid& g, const BlockLayout& L) : spec_(spec) {
  for (int a = 0; a < 3; ++a) {
    nodes_[a] = node_range(g, a, spec.region.lo[a], spec.region.hi[a]);
    if (g.invariant(a)) nodes_[a] = {0, 0};
    periodic_[a] = g.periodic[a];
  }
  for (int i = nodes_[0][0]; i <= nodes_[0][1]; ++i) x_.push_back(g.position(0, i, false));
  for (int i = nodes_[1][0]; i <= nodes_[1][1]; ++i) y_.push_back(g.position(1, i, false));
  for (int i = nodes_[2][0]; i <= nodes_[2][1]; ++i) z_.push_back(g.position(2, i, false));
  for (Component c : spec.components) {
    std::array<std::vector<int>, 3> idx;
    for (int a = 0; a < 3; ++a)
      idx[a] = g.invariant(a) ? std::vector<int>{0}
                              : sample_indices(g, a, nodes_[a][0], nodes_[a][1], staggered(c, a));
    // Periods each list entry was wrapped by (periodic axes): a Bloch field takes their phase.
    std::array<std::vector<int>, 3> wraps;
    for (int a = 0; a < 3; ++a) {
      if (g.invariant(a) || !g.periodic[a]) {
        wraps[a].assign(idx[a].size(), 0);
        continue;
      }
      const bool half = staggered(c, a);
      for (int i = half ? nodes_[a][0] - 1 : nodes_[a][0]; i <= nodes_[a][1]; ++i)
        wraps[a].push_back(i >= 0 ? i / g.n[a] : -((-i + g.n[a] - 1) / g.n[a]));
    }
    wraps_.push_back(std::move(wraps));
    boxes_.emplace_back(c, L, std::move(idx), 0, spec.omegas.size());
  }
}

void FieldMapRecorder::record(const Fields& f, bool electric, const std::vector<Complex>& phase) {
  for (DftBox& b : boxes_)
    if (is_electric(b.component()) == electric) b.accumulate(f, phase);
}

FieldMapResult FieldMapRecorder::result(const FieldMapRecorder* imaginary, const std::array<double, 3>& bloch_phase) const {
  FieldMapResult r;
  r.name = spec_.name;
  r.x = x_, r.y = y_, r.z = z_;
  r.omegas = spec_.omegas;
  r.components = spec_.components;
  const std::size_t nx = x_.size(), ny = y_.size(), nz = z_.size();
  r.values.assign(spec_.omegas.size(), {});
  for (std::size_t fq = 0; fq < spec_.omegas.size(); ++fq) {
    for (std::size_t bi = 0; bi < boxes_.size(); ++bi) {
      const DftBox& b = boxes_[bi];
      const DftBox* bim = imaginary ? &imaginary->boxes_[bi] : nullptr;
      const auto& wr = wraps_[bi];
      auto value = [&](std::size_t i, std::size_t j, std::size_t k) {
        const Complex v = bim ? b.at(i, j, k, fq) + Complex(0, 1) * bim->at(i, j, k, fq) : b.at(i, j, k, fq);
        const double phase = wr[0][i] * bloch_phase[0] + wr[1][j] * bloch_phase[1] + wr[2][k] * bloch_phase[2];
        return phase == 0 ? v : v * std::polar(1.0, phase);
      };
      std::vector<Complex> v(nx * ny * nz);
      // A staggered axis's list starts one position below the first node: node p is the mean of
      // list entries p and p+1. An invariant axis has a single entry.
      auto span = [&](int a) { return b.indices()[a].size() > 1 && staggered(b.component(), a) ? 2 : 1; };
      const int sx = span(0), sy = span(1), sz = span(2);
      for (std::size_t k = 0; k < nz; ++k)
        for (std::size_t j = 0; j < ny; ++j)
          for (std::size_t i = 0; i < nx; ++i) {
            Complex s = 0;
            for (int dk = 0; dk < sz; ++dk)
              for (int dj = 0; dj < sy; ++dj)
                for (int di = 0; di < sx; ++di)
                  s += value(std::min(i + di, b.indices()[0].size() - 1), std::min(j + dj, b.indices()[1].size() - 1),
                             std::min(k + dk, b.indices()[2].size() - 1));
            v[(k * ny + j) * nx + i] = s / double(sx * sy * sz);
          }
      r.values[fq].push_back(std::move(v));
    }
  }
  return r;
}

std::size_t FieldMapRecorder::memory_bytes() const {
  std::size_t s = 0;
  for (const DftBox& b : boxes_) s += b.memory_bytes();
  return s;
}

// ---------------------------------------------------------------- flux

FluxRecorder::Face FluxRecorder::make_face(const Grid& g, const BlockLayout& L, int a, int node,
                                           const std::array<std::array<int, 2>, 3>& r, double sign, std::size_t nf) {
  const int b = (a + 1) % 3, c = (a + 2) % 3;
  if (!g.periodic[a]) node = std::clamp(node, 1, g.n[a] - 1);  // H needs a half-cell on each side
  const std::array<Component, 3> E = {Component::Ex, Component::Ey, Component::Ez};
  const std::array<Component, 3> H = {Component::Hx, Component::Hy, Component::Hz};
  const std::ptrdiff_t below = -L.stride(a);
  auto make = [&](Component comp, int staggered_axis, std::ptrdiff_t avg) {
    std::array<std::vector<int>, 3> idx;
    idx[a] = {g.periodic[a] ? node % g.n[a] : node};
    for (int t : {b, c})
      idx[t] = t == staggered_axis ? cell_indices(g, t, r[t][0], r[t][1]) : node_indices(g, t, r[t][0], r[t][1]);
    return DftBox(comp, L, std::move(idx), avg, nf);
  };
  Face face{a, sign,
            {make(E[b], b, 0), make(H[c], b, below), make(E[c], c, 0), make(H[b], c, below)},
            {cell_weights(g, b, r[b][0], r[b][1]), node_weights(g, b, r[b][0], r[b][1])},
            {node_weights(g, c, r[c][0], r[c][1]), cell_weights(g, c, r[c][0], r[c][1])}};
  return face;
}

FluxRecorder::FluxRecorder(const FluxSpec& spec, const Grid& g, const BlockLayout& L) : spec_(spec) {
  std::array<std::array<int, 2>, 3> r;
  int flat = -1, flat_count = 0;
  for (int a = 0; a < 3; ++a) {
    r[a] = node_range(g, a, spec.region.lo[a], spec.region.hi[a]);
    if (!g.invariant(a) && r[a][0] == r[a][1]) flat = a, ++flat_count;
  }
  const std::size_t nf = spec.omegas.size();
  // A region that starts on a symmetry plane stands for itself and its mirror image: its power is
  // doubled per such plane, and no power crosses the plane itself (tangential E or H vanishes there).
  auto on_mirror = [&](int a) { return g.mirror_low[a] && r[a][0] == 0; };
  if (flat_count == 1) {
    normal_ = flat;
    for (int a = 0; a < 3; ++a)
      if (a != flat && on_mirror(a)) mirror_factor_ *= 2;
    faces_.push_back(make_face(g, L, flat, r[flat][0], r, +1.0, nf));
    return;
  }
  if (flat_count != 0) throw RunError("flux '" + spec.name + "': the region must be a plane or a box with volume");
  closed_ = true;
  for (int a = 0; a < 3; ++a) {
    if (g.invariant(a)) continue;  // no flux leaves through an invariant direction
    if (on_mirror(a)) mirror_factor_ *= 2;
    else faces_.push_back(make_face(g, L, a, r[a][0], r, -1.0, nf));
    faces_.push_back(make_face(g, L, a, r[a][1], r, +1.0, nf));
  }
}

void FluxRecorder::record(const Fields& f, bool electric, const std::vector<Complex>& phase) {
  for (Face& face : faces_)
    for (DftBox& d : face.dft)
      if (is_electric(d.component()) == electric) d.accumulate(f, phase);
}

FluxResult FluxRecorder::result(const FluxRecorder* imaginary) const {
  FluxResult out;
  out.name = spec_.name;
  out.closed = closed_;
  out.normal_axis = normal_;
  out.omegas = spec_.omegas;
  out.power.assign(spec_.omegas.size(), 0.0);
  for (std::size_t fi = 0; fi < faces_.size(); ++fi) {
    const Face& face = faces_[fi];
    const Face* im_face = imaginary ? &imaginary->faces_[fi] : nullptr;
    const int b = (face.axis + 1) % 3, c = (face.axis + 2) % 3;
    for (std::size_t fq = 0; fq < out.omegas.size(); ++fq) {
      double p = 0;
      for (int term = 0; term < 2; ++term) {
        auto complex_at = [&](int which, const std::array<std::size_t, 3>& q) {
          const Complex re = face.dft[which].at(q[0], q[1], q[2], fq);
          return im_face ? re + Complex(0, 1) * im_face->dft[which].at(q[0], q[1], q[2], fq) : re;
        };
        const auto& wb = face.weight_b[term];
        const auto& wc = face.weight_c[term];
        // The face's lists are ordered x, y, z; find which list is b and which is c.
        auto list_pos = [&](std::size_t ib, std::size_t ic, int axis_b, int axis_c) {
          std::array<std::size_t, 3> p3{0, 0, 0};
          p3[axis_b] = ib;
          p3[axis_c] = ic;
          return p3;
        };
        double s = 0;
        for (std::size_t ic = 0; ic < wc.size(); ++ic)
          for (std::size_t ib = 0; ib < wb.size(); ++ib) {
            const auto q = list_pos(ib, ic, b, c);
            s += wb[ib] * wc[ic] * std::real(complex_at(2 * term, q) * std::conj(complex_at(2 * term + 1, q)));
          }
        p += term == 0 ? s : -s;
      }
      out.power[fq] += 0.5 * face.sign * p * mirror_factor_;
    }
  }
  return out;
}

std::size_t FluxRecorder::memory_bytes() const {
  std::size_t s = 0;
  for (const Face& face : faces_)
    for (const DftBox& d : face.dft) s += d.memory_bytes();
  return s;
}

// ---------------------------------------------------------------- checkpoints

void ProbeRecorder::resize(std::size_t samples) {
  result_.time.resize(samples);
  for (auto& v : result_.values) v.resize(samples);
}

void ProbeRecorder::add_state(StateArrays& s, const std::string& prefix) {
  s.add_vector(prefix + "/time", result_.time);
  for (std::size_t q = 0; q < result_.values.size(); ++q)
    s.add_vector(fmt::format("{}/{}", prefix, component_names[static_cast<int>(result_.components[q])]), result_.values[q]);
}

void FieldMapRecorder::add_state(StateArrays& s, const std::string& prefix) {
  for (std::size_t b = 0; b < boxes_.size(); ++b) boxes_[b].add_state(s, fmt::format("{}/box{}", prefix, b));
}

void FluxRecorder::add_state(StateArrays& s, const std::string& prefix) {
  for (std::size_t f = 0; f < faces_.size(); ++f)
    for (std::size_t t = 0; t < faces_[f].dft.size(); ++t) faces_[f].dft[t].add_state(s, fmt::format("{}/face{}/dft{}", prefix, f, t));
}

}  // namespace yeegap::solver
