// Reflection and transmission of a planar multilayer for s and p polarized plane waves at any
// angle, by the characteristic-matrix method of Born & Wolf, Principles of Optics, 7th ed. (1999),
// sections 1.6.2-1.6.3 (section numbers from memory; the algebra is re-derived in the .cpp), in
// yeegap's exp(-i omega t) convention. The incident medium may be any lossless index (a prism).
#pragma once

#include <complex>
#include <vector>

namespace yeegap::materials {

enum class Polarization { s, p };  // s: E normal to the plane of incidence (TE); p: H normal (TM)

struct Layer {
  std::complex<double> eps;  // relative permittivity (Im >= 0 for a lossy layer)
  double thickness = 0;      // m
};

/// Incident half-space, layers in the order the light meets them, exit half-space.
struct Multilayer {
  std::complex<double> eps_incident = 1.0;  // must be real and positive for R, T, A to be defined
  std::vector<Layer> layers;
  std::complex<double> eps_exit = 1.0;
};

struct StackResponse {
  // Amplitude ratios at the first and last interfaces: of E_y for s, of H_y for p (the field normal
  // to the plane of incidence, so that r_p = 0 at Brewster's angle and both reduce to the
  // textbook Fresnel coefficients for one interface).
  std::complex<double> r, t;
  double R = 0, T = 0, A = 0;  // reflectance, transmittance, absorptance (A = 1 - R - T)
};

/// Response at angular frequency omega (rad/s) for the angle of incidence theta (rad, from the
/// normal, in the incident medium). Beyond the critical angle the exit wave is evanescent and T = 0.
StackResponse stack_response(const Multilayer& stack, double omega, double theta, Polarization pol);

}  // namespace yeegap::materials
