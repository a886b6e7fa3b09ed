// Analytic permittivity of a PoleSet (see pole_set.h for the sign convention).
#include "materials/pole_set.h"

#include "base/constants.h"

namespace yeegap::materials {

std::complex<double> permittivity(const PoleSet& poles, double omega) {
  const std::complex<double> i(0.0, 1.0);
  std::complex<double> eps = poles.eps_inf;
  if (poles.conductivity != 0.0) eps += i * poles.conductivity / (constants::eps0 * omega);
  for (const DrudePole& d : poles.drude) eps -= d.omega_p * d.omega_p / (omega * omega + i * d.gamma * omega);
  for (const LorentzPole& l : poles.lorentz) {
    const double w0sq = l.omega_0 * l.omega_0;
    eps += l.delta_eps * w0sq / (w0sq - omega * omega - i * l.gamma * omega);
  }
  for (const CriticalPoint& c : poles.critical_points) {
    const std::complex<double> phase = std::polar(1.0, c.phase);
    eps += c.amplitude * c.omega *
           (phase / (c.omega - omega - i * c.gamma) + std::conj(phase) / (c.omega + omega + i * c.gamma));
  }
  return eps;
}

std::complex<double> refractive_index(const PoleSet& poles, double omega) {
  // Principal root: Re n >= 0, and k >= 0 whenever Im eps >= 0 (a passive medium).
  return std::sqrt(permittivity(poles, omega));
}

}  // namespace yeegap::materials
