// A point dipole above a planar interface: its total power (radiated, sent into the lower medium and
// absorbed there, surface plasmons included) over the power of the same dipole in the upper medium
// alone, perpendicular and parallel to the interface. The reference the solver's decay rates near a
// metal surface are checked against; with r = +-1 (a perfect conductor) it is image theory.
#pragma once

#include <complex>

namespace yeegap::materials {

struct HalfSpaceRates {
  double perpendicular = 0;  // P / P0, dipole along the normal
  double parallel = 0;       // P / P0, dipole along the interface
};

/// Dipole at `height` (m, > 0) above the interface, in an upper medium of real index `upper_index`,
/// over a lower medium of relative permittivity `lower_eps` (Im >= 0; time convention exp(-i omega t)),
/// at the vacuum wavelength `wavelength` (m). Sommerfeld's integral over the in-plane wavenumber.
HalfSpaceRates dipole_above_half_space(double height, double wavelength, double upper_index,
                                       std::complex<double> lower_eps);

/// The same with the reflection coefficients r_s = -1 and r_p = +1 of a perfect conductor (for checks
/// of the quadrature against image theory).
HalfSpaceRates dipole_above_perfect_mirror_by_integral(double height, double wavelength, double upper_index);

}  // namespace yeegap::materials
