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

// Distance from the inner face of the layer at `face` to the nearest point, along the face's axis,
// whose material differs from the layer's own (`medium`): the structure's side nearest the layer,
// sampled over a lateral grid of the cell. Infinite if the axis holds nothing else.
double distance_to_structure(const Scene& s, const Grid& g, int face, int medium) {
  const int a = face / 2, b = (a + 1) % 3, c = (a + 2) % 3;
  const int inner = face % 2 == 0 ? s.domain.cpml.cells : g.n[a] - s.domain.cpml.cells;
  const double start = g.nodes[a][inner];
  constexpr int lateral_samples = 8;
  double nearest = HUGE_VAL;
  for (int i = 0; i < lateral_samples; ++i)
    for (int j = 0; j < lateral_samples; ++j) {
      Vec3 p;
      p[b] = g.nodes[b].front() + (i + 0.5) / lateral_samples * (g.nodes[b].back() - g.nodes[b].front());
      p[c] = g.nodes[c].front() + (j + 0.5) / lateral_samples * (g.nodes[c].back() - g.nodes[c].front());
      const int step = face % 2 == 0 ? 1 : -1;
      for (int k = face % 2 == 0 ? inner : inner - 1; k >= 0 && k < g.n[a]; k += step) {
        p[a] = 0.5 * (g.nodes[a][k] + g.nodes[a][k + 1]);
        if (material_at(s, p) != medium) {
          nearest = std::min(nearest, std::abs((face % 2 == 0 ? g.nodes[a][k] : g.nodes[a][k + 1]) - start));
          break;
        }
      }
    }
  return nearest;
}

// Along lateral axis `b`, the period of the cell if it repeats and holds more than one cell (so
// that orders other than 0 exist); 0 otherwise.
double diffraction_period(const Scene& s, const Grid& g, int b) {
  if (s.domain.edges[static_cast<std::size_t>(2 * b)] != EdgeKind::periodic || g.n[b] < 2) return 0;
  return g.nodes[b].back() - g.nodes[b].front();
}

// Mean kappa over a layer of thickness d that makes an evanescent field decaying as exp(-alpha z),
// which has already come `travelled` from the structure, return R(0) on its round trip back.
double kappa_mean_for(double alpha, double travelled, double d, double reflection) {
  return std::max(1.0, (-std::log(reflection) / (2 * alpha) - travelled) / d);
}

}  // namespace

FaceDesign absorber_face_design(const Scene& s, const Grid& g, int face, double thickness) {
  const CpmlSpec& spec = s.domain.cpml;
  FaceDesign d;
  d.kappa_max = spec.kappa_max;
  const int a = face / 2;
  const Vec3& k = s.domain.bloch_wavevector;
  const int b = (a + 1) % 3, c = (a + 2) % 3;
  const double period_b = diffraction_period(s, g, b), period_c = diffraction_period(s, g, c);
  const bool diffracting = period_b > 0 || period_c > 0;
  const double k_lateral_sq = k[b] * k[b] + k[c] * k[c];
  const auto [w_lo, w_hi] = source_band(s);
  if ((k_lateral_sq == 0 && !diffracting) || w_hi == 0) return d;
  // The medium at the face: half a cell inside the layer, at the domain's centre laterally.
  const int cells = spec.cells, inner = face % 2 == 0 ? cells : g.n[a] - cells;
  Vec3 at = s.domain.center;
  at[a] = g.nodes[a][inner] + (face % 2 == 0 ? -0.5 : 0.5) * g.primal(a, face % 2 == 0 ? inner - 1 : inner);
  const int medium = material_at(s, at);
  const MaterialSpec& m = s.materials[static_cast<std::size_t>(medium)];
  if (m.perfect_conductor) return d;
  // Orders (m_b, m_c) whose lateral wavevector k + 2 pi (m_b / L_b, m_c / L_c) can propagate in the
  // face's medium somewhere in the band, and one more on each side (the slowest evanescent ones).
  double n_max = 0;
  constexpr int samples = 33;
  for (int q = 0; q < samples; ++q)
    n_max = std::max(n_max, std::sqrt(std::max(materials::permittivity(m.poles, w_lo + (w_hi - w_lo) * q / (samples - 1)).real(), 0.0)));
  const double k_max = n_max * w_hi / constants::c0;
  auto order_range = [&](double period, double k0) {
    return period > 0 ? static_cast<int>(std::ceil((k_max + std::abs(k0)) * period / (2 * constants::pi))) + 1 : 0;
  };
  const int mb = order_range(period_b, k[b]), mc = order_range(period_c, k[c]);
  double cos_min = 1.0, alpha_min = HUGE_VAL, alpha_diffracted_min = HUGE_VAL;
  bool propagates = false;
  for (int q = 0; q < samples; ++q) {
    const double w = w_lo + (w_hi - w_lo) * q / (samples - 1);
    if (!(w > 0)) continue;
    const double n_sq = std::max(materials::permittivity(m.poles, w).real(), 0.0);
    const double kn_sq = n_sq * (w / constants::c0) * (w / constants::c0);
    for (int ob = -mb; ob <= mb; ++ob)
      for (int oc = -mc; oc <= mc; ++oc) {
        const double kb = k[b] + (period_b > 0 ? 2 * constants::pi * ob / period_b : 0);
        const double kc = k[c] + (period_c > 0 ? 2 * constants::pi * oc / period_c : 0);
        const double kz_sq = kn_sq - kb * kb - kc * kc;
        const bool zero_order = ob == 0 && oc == 0;
        if (kz_sq > 0) {
          propagates = true;
          // Sigma follows the zero order only: scaled for a grazing diffracted order it would
          // weaken the layer for the zero order, which carries the reflectance.
          if (zero_order) cos_min = std::min(cos_min, std::sqrt(kz_sq / kn_sq));
        } else if (zero_order) {
          alpha_min = std::min(alpha_min, std::sqrt(-kz_sq));
        } else {
          alpha_diffracted_min = std::min(alpha_diffracted_min, std::sqrt(-kz_sq));
        }
      }
  }
  d.sigma_factor = std::min(1.0 / cos_min, max_grazing_factor);
  auto kappa_max_for = [&](double kappa_mean) { return 1 + (spec.grading_order + 1) * (kappa_mean - 1); };
  double needed = 1;
  // The zero order with nothing propagating (beyond the critical angle): designed from the layer's
  // face, as if the structure touched it.
  if (!propagates && alpha_min > 0 && std::isfinite(alpha_min))
    needed = kappa_max_for(kappa_mean_for(alpha_min, 0, thickness, spec.reflection));
  // Evanescent diffracted orders of a grating: they start at the structure and have decayed over
  // the distance to the layer already.
  if (alpha_diffracted_min > 0 && std::isfinite(alpha_diffracted_min))
    needed = std::max(needed, kappa_max_for(kappa_mean_for(alpha_diffracted_min, distance_to_structure(s, g, face, medium),
                                                          thickness, spec.reflection)));
  d.kappa_max = std::max(d.kappa_max, std::min(needed, propagates ? max_kappa_with_propagating : max_evanescent_kappa));
  return d;
}

}  // namespace yeegap::solver
