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
  return eps;
}

}  // namespace yeegap::materials
