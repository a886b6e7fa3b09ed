// Absorbing faces of a Bloch cell (see absorber_angle.h), sampled over the sources' band: where the
// wave propagates in the face's medium, sigma_max / cos(theta); where it is evanescent, a mean kappa
// of -ln R(0) / (2 alpha d) over the layer. Either way its round trip returns R(0) again.
// Derivation: docs/physics.md 3.5.
#include "solver/engine/absorber_angle.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <utility>

#include "base/constants.h"
#include "materials/pole_set.h"
#include "solver/media/material_map.h"

namespace yeegap::solver {

namespace {

// The band of every source of the scene, rad/s; {0, 0} without sources.
std::pair<double, double> source_band(const Scene& s) {
  double lo = HUGE_VAL, hi = 0;
  auto add = [&](const Waveform& w) {
    const double a = w.omega_min > 0 ? w.omega_min : w.omega_max;
    lo = std::min(lo, a), hi = std::max(hi, w.omega_max);
  };
  for (const auto& d : s.dipoles) add(d.waveform);
  for (const auto& p : s.plane_waves) add(p.waveform);
  for (const auto& w : s.bloch_waves) add(w.waveform);
  return hi > 0 ? std::make_pair(lo, hi) : std::make_pair(0.0, 0.0);
}

}  // namespace

FaceDesign absorber_face_design(const Scene& s, const Grid& g, int face, double thickness) {
  const CpmlSpec& spec = s.domain.cpml;
  FaceDesign d;
  d.kappa_max = spec.kappa_max;
  const int a = face / 2;
  const Vec3& k = s.domain.bloch_wavevector;
  double k_lateral_sq = 0;
  for (int b = 0; b < 3; ++b)
    if (b != a) k_lateral_sq += k[b] * k[b];
  const auto [w_lo, w_hi] = source_band(s);
  if (k_lateral_sq == 0 || w_hi == 0) return d;
  // The medium at the face: half a cell inside the layer, at the domain's centre laterally.
  const int cells = spec.cells, inner = face % 2 == 0 ? cells : g.n[a] - cells;
  Vec3 at = s.domain.center;
  at[a] = g.nodes[a][inner] + (face % 2 == 0 ? -0.5 : 0.5) * g.primal(a, face % 2 == 0 ? inner - 1 : inner);
  const MaterialSpec& m = s.materials[static_cast<std::size_t>(material_at(s, at))];
  if (m.perfect_conductor) return d;
  double cos_min = 1.0, alpha_min = HUGE_VAL;
  bool propagates = false;
  constexpr int samples = 33;
  for (int q = 0; q < samples; ++q) {
    const double w = w_lo + (w_hi - w_lo) * q / (samples - 1);
    if (!(w > 0)) continue;
    const double n_sq = std::max(materials::permittivity(m.poles, w).real(), 0.0);
    const double kn_sq = n_sq * (w / constants::c0) * (w / constants::c0);
    const double kz_sq = kn_sq - k_lateral_sq;
    if (kz_sq > 0) {
      propagates = true;
      cos_min = std::min(cos_min, std::sqrt(kz_sq / kn_sq));
    } else {
      alpha_min = std::min(alpha_min, std::sqrt(-kz_sq));
    }
  }
  d.sigma_factor = std::min(1.0 / cos_min, max_grazing_factor);
  if (!propagates && alpha_min > 0 && std::isfinite(alpha_min)) {
    const double kappa_mean = -std::log(spec.reflection) / (2 * alpha_min * thickness);
    const double needed = 1 + (spec.grading_order + 1) * std::max(kappa_mean - 1, 0.0);
    d.kappa_max = std::max(d.kappa_max, std::min(needed, max_evanescent_kappa));
  }
  return d;
}

}  // namespace yeegap::solver
