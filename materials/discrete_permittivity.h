// The permittivity that the time-stepping scheme really has at a frequency omega for a time step
// dt: the polarization-current (J-form) ADE of physics.md 3.4, derived by z-transform in
// discrete_permittivity.cpp. It tends to permittivity(poles, omega) as dt^2, so it separates the
// time-discretisation error of a dispersive run from every other error. Pure math: no solver types.
#pragma once

#include <complex>

#include "materials/pole_set.h"

namespace yeegap::materials {

/// The Yee time-difference operator as a frequency: (2/dt) sin(omega dt/2). The central difference
/// (X^{n+1/2} - X^{n-1/2})/dt of exp(-i omega t) equals -i yee_omega * X.
double yee_omega(double omega, double dt);

/// eps_d(omega, dt): the curl H term of the E update divided by (-i Omega_d eps0 E), Omega_d =
/// yee_omega(omega, dt), with both referred to the same time level (see the .cpp for the algebra).
std::complex<double> discrete_permittivity(const PoleSet& poles, double omega, double dt);

// Each term's share of eps_d, for tests and for anyone checking one pole at a time.
std::complex<double> discrete_drude_susceptibility(const DrudePole& pole, double omega, double dt);
std::complex<double> discrete_lorentz_susceptibility(const LorentzPole& pole, double omega, double dt);
std::complex<double> discrete_critical_point_susceptibility(const CriticalPoint& term, double omega, double dt);
std::complex<double> discrete_conductivity_term(double sigma, double omega, double dt);

/// A critical point written as one second-order ADE (physics.md 2.3, derived there and re-derived in
/// the .cpp):  P'' + damping P' + omega0_sq P = eps0 (a0 E + a1 dE/dt).
struct CriticalPointAde {
  double omega0_sq = 0;  // Omega^2 + Gamma^2, (rad/s)^2
  double damping = 0;    // 2 Gamma, rad/s
  double a0 = 0;         // 2 A Omega (Omega cos phi - Gamma sin phi), (rad/s)^2
  double a1 = 0;         // -2 A Omega sin phi, rad/s
};
CriticalPointAde critical_point_ade(const CriticalPoint& term);

}  // namespace yeegap::materials
