// Numerical permittivity of the J-form ADE scheme (physics.md 3.4), by z-transform. The derivation
// is written out below so that a change to the scheme can be followed into the formulas.
#include "materials/discrete_permittivity.h"

#include <cmath>

#include "base/constants.h"

namespace yeegap::materials {

// Derivation (exp(-i omega t), as everywhere in yeegap).
//
// The scheme. E lives at integer steps n, H and every polarization current J at half steps:
//   E update:  eps0 eps_inf (E^{n+1} - E^n)/dt = C^{n+1/2} - sigma (E^{n+1} + E^n)/2 - sum J^{n+1/2}
//              where C = curl H.
//   Drude:     J^{n+1/2} = [(1 - g dt/2) J^{n-1/2} + eps0 wp^2 dt E^n] / (1 + g dt/2)
//   Lorentz:   J^{n+1/2} = [(1 - g dt/2) J^{n-1/2} - dt w0^2 P^n + dt eps0 de w0^2 E^n] / (1 + g dt/2)
//              P^{n+1} = P^n + dt J^{n+1/2}
//   Critical point (the second-order ADE of physics.md 2.3, P'' + 2G P' + w0^2 P = eps0 (a0 E + a1 E'),
//   centred at step n like the Lorentz pole, with the centred difference for E'):
//              J^{n+1/2} = [(1 - G dt) J^{n-1/2} - dt w0^2 P^n + dt eps0 a0 E^n
//                           + (eps0 a1/2)(E^{n+1} - E^{n-1})] / (1 + G dt)
//              P^{n+1} = P^n + dt J^{n+1/2}
//
// A steady state at angular frequency omega has X^n = X z^n with z = exp(-i omega dt); a half-step
// quantity is written X^{n+1/2} = X_h z^n (X_h carries its own phase). Two identities do all the work:
//   z - 1       = -i Omega z^{1/2} dt,   Omega = (2/dt) sin(omega dt/2)   (= yee_omega)
//   (z + 1)/2   = c z^{1/2},              c = cos(omega dt/2)
//
// Definition. In the continuum C = -i omega eps0 eps E. The discrete analogue compares C at n+1/2
// with E at n through the Yee operator, after removing the half-step phase z^{1/2}:
//   C_h = z^{1/2} (-i Omega) eps0 eps_d E,   i.e. eps_d = C_h / (z^{1/2} (-i Omega) eps0 E).
// With this definition D/E taken at the same integer step (D = eps0 eps_inf E + sum P) gives the
// same eps_d, because P = dt J_h / (z - 1) = J_h / (z^{1/2} (-i Omega)).
//
// E update:  eps0 eps_inf (-i Omega) z^{1/2} E + sigma c z^{1/2} E + sum J_h = C_h, so
//   eps_d = eps_inf + i sigma c / (eps0 Omega) + sum J_h / (z^{1/2} (-i Omega) eps0 E).
//
// Drude: J_h (1 + g dt/2) = (1 - g dt/2) J_h / z + eps0 wp^2 dt E. Multiply by z:
//   J_h [(z - 1) + g dt (z + 1)/2] = eps0 wp^2 dt z E
//   J_h z^{1/2} dt [-i Omega + g c] = eps0 wp^2 dt z E
//   chi_d = J_h / (z^{1/2} (-i Omega) eps0 E) = wp^2 / ((-i Omega)(-i Omega + g c))
//         = -wp^2 / (Omega^2 + i g c Omega).
//
// Lorentz: with P = dt J_h / (z - 1), so dt w0^2 z P = w0^2 dt^2 z J_h/(z - 1) = dt w0^2 z^{1/2} J_h/(-i Omega):
//   J_h z^{1/2} dt [-i Omega + g c + w0^2/(-i Omega)] = dt eps0 de w0^2 z E
//   chi_d = de w0^2 / ((-i Omega)(-i Omega + g c) + w0^2) = de w0^2 / (w0^2 - Omega^2 - i g c Omega).
//
// Critical point: the new term (eps0 a1/2)(z - 1/z) E times z is (eps0 a1/2)(z^2 - 1) E
//   = eps0 a1 [(z - 1)(z + 1)/2] E = eps0 a1 (-i Omega dt c) z E, so the right side is
//   dt eps0 z E (a0 - i Omega c a1) and, with damping 2G in place of g,
//   chi_d = (a0 - i c Omega a1) / (w0^2 - Omega^2 - 2 i G c Omega).
//
// These are physics.md 3.4's chi_d for the Drude and Lorentz poles exactly, and the continuous
// model with omega -> Omega in the restoring and driving terms and omega -> c Omega in the loss
// and numerator terms. Omega = omega (1 - (omega dt)^2/24 + ...) and c = 1 - (omega dt)^2/8 + ...,
// so eps_d - eps = O((omega dt)^2): the scheme is second-order accurate in time.

double yee_omega(double omega, double dt) { return 2.0 / dt * std::sin(0.5 * omega * dt); }

namespace {
const std::complex<double> i_unit(0.0, 1.0);
}

std::complex<double> discrete_drude_susceptibility(const DrudePole& pole, double omega, double dt) {
  const double big_omega = yee_omega(omega, dt);
  const double c = std::cos(0.5 * omega * dt);
  return -pole.omega_p * pole.omega_p / (big_omega * big_omega + i_unit * pole.gamma * c * big_omega);
}

std::complex<double> discrete_lorentz_susceptibility(const LorentzPole& pole, double omega, double dt) {
  const double big_omega = yee_omega(omega, dt);
  const double c = std::cos(0.5 * omega * dt);
  const double w0sq = pole.omega_0 * pole.omega_0;
  return pole.delta_eps * w0sq / (w0sq - big_omega * big_omega - i_unit * pole.gamma * c * big_omega);
}

CriticalPointAde critical_point_ade(const CriticalPoint& term) {
  // A Omega [e^{i phi}/(Omega - w - iG) + e^{-i phi}/(Omega + w + iG)] over a common denominator
  // (Omega - w - iG)(Omega + w + iG) = Omega^2 + G^2 - w^2 - 2 i G w has numerator
  // 2 A Omega [(Omega cos phi - G sin phi) + i w sin phi]; with -i w <-> d/dt this is the ADE below.
  const double s = std::sin(term.phase);
  const double co = std::cos(term.phase);
  CriticalPointAde ade;
  ade.omega0_sq = term.omega * term.omega + term.gamma * term.gamma;
  ade.damping = 2.0 * term.gamma;
  ade.a0 = 2.0 * term.amplitude * term.omega * (term.omega * co - term.gamma * s);
  ade.a1 = -2.0 * term.amplitude * term.omega * s;
  return ade;
}

std::complex<double> discrete_critical_point_susceptibility(const CriticalPoint& term, double omega, double dt) {
  const CriticalPointAde ade = critical_point_ade(term);
  const double big_omega = yee_omega(omega, dt);
  const double c = std::cos(0.5 * omega * dt);
  return (ade.a0 - i_unit * c * big_omega * ade.a1) /
         (ade.omega0_sq - big_omega * big_omega - i_unit * ade.damping * c * big_omega);
}

std::complex<double> discrete_conductivity_term(double sigma, double omega, double dt) {
  const double big_omega = yee_omega(omega, dt);
  const double c = std::cos(0.5 * omega * dt);
  return i_unit * sigma * c / (constants::eps0 * big_omega);
}

std::complex<double> discrete_permittivity(const PoleSet& poles, double omega, double dt) {
  std::complex<double> eps = poles.eps_inf;
  if (poles.conductivity != 0.0) eps += discrete_conductivity_term(poles.conductivity, omega, dt);
  for (const DrudePole& d : poles.drude) eps += discrete_drude_susceptibility(d, omega, dt);
  for (const LorentzPole& l : poles.lorentz) eps += discrete_lorentz_susceptibility(l, omega, dt);
  for (const CriticalPoint& cp : poles.critical_points) eps += discrete_critical_point_susceptibility(cp, omega, dt);
  return eps;
}

}  // namespace yeegap::materials
