// Conductance per unit area as an integral over the barrier transmission (see tunnelling_conductance.h).
// The quadrature doubles its panels until it agrees with itself; it never trusts a single estimate.
#include "materials/tunnelling_conductance.h"

#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::materials {

namespace {

// 8-point Gauss-Legendre nodes and weights on [-1, 1] (Abramowitz & Stegun, Table 25.4).
constexpr double gl_nodes[4] = {0.1834346424956498, 0.5255324099163290, 0.7966664774136267, 0.9602898564975363};
constexpr double gl_weights[4] = {0.3626837833783620, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763};

double gauss_legendre_panels(const std::function<double(double)>& f, double a, double b, int panels) {
  const double h = (b - a) / panels;
  double sum = 0;
  for (int p = 0; p < panels; ++p) {
    const double mid = a + (p + 0.5) * h, half = 0.5 * h;
    for (int i = 0; i < 4; ++i)
      sum += gl_weights[i] * half * (f(mid - half * gl_nodes[i]) + f(mid + half * gl_nodes[i]));
  }
  return sum;
}

// Beyond this many panels (32768 evaluations) something is wrong with the integrand, not the rule.
constexpr int max_panels = 4096;

}  // namespace

double conductance_prefactor() {
  const double hbar3 = constants::hbar * constants::hbar * constants::hbar;
  return constants::e_charge * constants::e_charge * constants::m_e / (2.0 * constants::pi * constants::pi * hbar3);
}

double integrate_transmission(const std::function<double(double)>& transmission, double fermi_energy,
                              double relative_tolerance) {
  YG_CHECK(fermi_energy > 0, fmt::format("Fermi energy must be positive, got {} J", fermi_energy));
  double previous = gauss_legendre_panels(transmission, 0.0, fermi_energy, 2);
  for (int panels = 4; panels <= max_panels; panels *= 2) {
    const double current = gauss_legendre_panels(transmission, 0.0, fermi_energy, panels);
    if (std::abs(current - previous) <= relative_tolerance * std::abs(current)) return current;
    previous = current;
  }
  YG_CHECK(false, fmt::format("transmission integral not converged to {} with {} panels", relative_tolerance,
                              max_panels));
  return previous;
}

double conductance_per_area(const std::function<double(double)>& transmission, double fermi_energy,
                            double relative_tolerance) {
  return conductance_prefactor() * integrate_transmission(transmission, fermi_energy, relative_tolerance);
}

}  // namespace yeegap::materials
