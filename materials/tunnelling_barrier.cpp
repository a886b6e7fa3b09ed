// Barrier transmission (see tunnelling_barrier.h). The profile method is the transfer matrix of the
// Schroedinger equation written for the ratio psi'/psi instead of the pair (psi, psi'): the pair
// grows like exp(q a) and loses T below the rounding of the reflected wave, the ratio stays O(q).
#include "materials/tunnelling_barrier.h"

#include <algorithm>
#include <cmath>
#include <complex>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::materials {

namespace {

using cplx = std::complex<double>;

// Wavenumber squared, 2 m (V - E)/hbar^2 (1/m^2): positive inside a barrier, negative in a well.
double decay_squared(double potential, double energy) {
  return 2.0 * constants::m_e * (potential - energy) / (constants::hbar * constants::hbar);
}

// log(cosh x) for x >= 0 without overflow.
double log_cosh(double x) { return x + std::log1p(std::exp(-2.0 * x)) - std::log(2.0); }

// log(sinh(x)/x) for x >= 0: the series near 0, the asymptotic form where sinh would overflow.
double log_sinhc(double x) {
  if (x < 1e-4) return x * x / 6.0;
  if (x < 20.0) return std::log(std::sinh(x) / x);
  return x - std::log(2.0) + std::log1p(-std::exp(-2.0 * x)) - std::log(x);
}

// 1/(1 + s) given log s, accurate for s from 1e-300 to 1e300.
double one_over_one_plus(double log_s) {
  if (log_s > 0) {
    const double inv = std::exp(-log_s);
    return inv / (1.0 + inv);
  }
  return 1.0 / (1.0 + std::exp(log_s));
}

}  // namespace

double rectangular_transmission(double energy, double height, double width) {
  if (!(energy > 0)) return 0.0;
  if (width <= 0 || height == 0) return 1.0;
  const double hbar2 = constants::hbar * constants::hbar;
  // s = V0^2 sinh^2(q a)/(4 E (V0 - E)) rewritten with (V0 - E) = hbar^2 q^2/(2m):
  // s = m V0^2 a^2 (sinh(qa)/(qa))^2/(2 hbar^2 E); the same with sin above the barrier top.
  const double log_scale = std::log(constants::m_e * height * height * width * width / (2.0 * hbar2 * energy));
  const double p2 = decay_squared(height, energy);
  if (p2 >= 0) return one_over_one_plus(log_scale + 2.0 * log_sinhc(std::sqrt(p2) * width));
  const double x = std::sqrt(-p2) * width;
  const double sinc = x < 1e-4 ? 1.0 - x * x / 6.0 : std::sin(x) / x;
  return 1.0 / (1.0 + std::exp(log_scale) * sinc * sinc);
}

BarrierProfile rectangular_profile(double height, double width, int slabs) {
  YG_CHECK(slabs >= 1, fmt::format("a barrier needs at least one slab, got {}", slabs));
  return {width, std::vector<double>(static_cast<size_t>(slabs), height)};
}

BarrierProfile image_rounded_profile(double fermi_energy, double work_function, double width,
                                     double relative_permittivity, double max_slab) {
  YG_CHECK(max_slab > 0 && relative_permittivity > 0,
           fmt::format("slab thickness {} m and permittivity {} must be positive", max_slab, relative_permittivity));
  BarrierProfile p;
  p.width = std::max(width, 0.0);
  if (p.width == 0) return p;  // no gap: the metals touch
  // The allowance keeps 1 nm / 0.01 A at 1000 slabs, not 1001 from rounding in the division.
  const int slabs = std::max(1, static_cast<int>(std::ceil(p.width / max_slab - 1e-9)));
  const double d = p.width / slabs;
  // Simmons 1963: lambda = e^2 ln2/(8 pi K eps0 s) (in J); 1.15 lambda s^2/(x (s-x)) approximates
  // the sum over all image charges of both surfaces.
  const double lambda = constants::e_charge * constants::e_charge * std::log(2.0) /
                        (8.0 * constants::pi * relative_permittivity * constants::eps0 * p.width);
  p.potential.resize(static_cast<size_t>(slabs));
  for (int i = 0; i < slabs; ++i) {
    const double x = (i + 0.5) * d;
    const double phi = work_function - 1.15 * lambda * p.width * p.width / (x * (p.width - x));
    p.potential[static_cast<size_t>(i)] = std::max(0.0, fermi_energy + phi);
  }
  return p;
}

double profile_transmission(const BarrierProfile& profile, double energy) {
  if (!(energy > 0)) return 0.0;
  const double k = std::sqrt(2.0 * constants::m_e * energy) / constants::hbar;
  if (profile.potential.empty()) return 1.0;
  const double d = profile.width / static_cast<double>(profile.potential.size());
  cplx u(0.0, k);       // psi'/psi at the right edge: only the transmitted wave exp(i k z)
  double log_ratio = 0;  // log |psi(left edge)/psi(right edge)|
  for (auto it = profile.potential.rbegin(); it != profile.potential.rend(); ++it) {
    // Given u at the right side z1 of a slab (psi(z1) = 1), the left side z0 = z1 - d has
    // psi(z0) = C - u S and psi'(z0) = -p^2 S + u C, with C = cosh(p d), S = sinh(p d)/p in a
    // barrier (p^2 > 0) and C = cos, S = sin(kappa d)/kappa in a well. In a barrier both are
    // divided by cosh(p d) first, so only tanh appears and log cosh is added separately.
    const double p2 = decay_squared(*it, energy);
    cplx psi0, dpsi0;
    if (p2 > 0) {
      const double p = std::sqrt(p2), x = p * d;
      const double th = std::tanh(x);
      const double th_over_p = x < 1e-8 ? d : th / p;
      psi0 = 1.0 - u * th_over_p;
      dpsi0 = -p * th + u;
      log_ratio += log_cosh(x);
    } else {
      const double kappa = std::sqrt(-p2), x = kappa * d;
      const double s_over_kappa = x < 1e-8 ? d : std::sin(x) / kappa;
      psi0 = std::cos(x) - u * s_over_kappa;
      dpsi0 = kappa * std::sin(x) + u * std::cos(x);
    }
    // psi cannot vanish: a state carrying current has |psi|^2 Im(u) = const != 0.
    log_ratio += std::log(std::abs(psi0));
    u = dpsi0 / psi0;
  }
  // Left of the barrier psi = exp(ikz) + r exp(-ikz), so psi(0) = 2ik/(ik + u0) for unit incidence;
  // the transmitted amplitude is psi(0) divided by the growth exp(log_ratio) through the barrier.
  const double incident_scale = 2.0 * k / std::abs(cplx(0.0, k) + u);
  return incident_scale * incident_scale * std::exp(-2.0 * log_ratio);
}

double wkb_transmission(const BarrierProfile& profile, double energy) {
  if (!(energy > 0)) return 0.0;
  if (profile.potential.empty()) return 1.0;
  const double d = profile.width / static_cast<double>(profile.potential.size());
  double exponent = 0;
  for (double v : profile.potential) {
    const double p2 = decay_squared(v, energy);
    if (p2 > 0) exponent += 2.0 * std::sqrt(p2) * d;
  }
  return std::exp(-exponent);
}

}  // namespace yeegap::materials
