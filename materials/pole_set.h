// A linear, isotropic, dispersive medium as the solver sees it: eps_inf, a static conductivity and
// lists of Drude, Lorentz and critical-point poles, in SI (rad/s, S/m), exp(-i omega t); forms in
// docs/physics.md 2.1 and 2.3. A critical point (Etchegoin et al. 2006) has a complex numerator, so it
// is neither Drude nor Lorentz and has its own list; discrete_permittivity.h steps it.
#pragma once

#include <complex>
#include <string>
#include <vector>

namespace yeegap::materials {

struct DrudePole {
  double omega_p = 0;  // plasma frequency of this pole, rad/s
  double gamma = 0;    // damping, rad/s
};

struct LorentzPole {
  double delta_eps = 0;  // oscillator strength (dimensionless)
  double omega_0 = 0;    // resonance, rad/s
  double gamma = 0;      // damping, rad/s
};

/// One critical-point term (a conjugate pair of poles with phase phi). A single term need not be
/// passive on its own (Im < 0 is possible below Omega); only the whole PoleSet must be.
struct CriticalPoint {
  double amplitude = 0;  // A (dimensionless)
  double phase = 0;      // phi, rad
  double omega = 0;      // Omega: transition frequency, rad/s
  double gamma = 0;      // Gamma: broadening, rad/s
};

struct PoleSet {
  double eps_inf = 1.0;
  double conductivity = 0.0;  // static conductivity sigma, S/m
  std::vector<DrudePole> drude;
  std::vector<LorentzPole> lorentz;
  std::vector<CriticalPoint> critical_points;

  bool dispersive() const { return !drude.empty() || !lorentz.empty() || !critical_points.empty(); }
};

/// The continuous model's relative permittivity at angular frequency omega (rad/s, > 0).
std::complex<double> permittivity(const PoleSet& poles, double omega);

/// The complex refractive index n + i k = sqrt(eps), principal root (k >= 0 for a passive medium).
std::complex<double> refractive_index(const PoleSet& poles, double omega);

}  // namespace yeegap::materials
