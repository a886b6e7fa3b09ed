// Scattering by an infinite circular cylinder lit at normal incidence (Bohren & Huffman, Absorption
// and Scattering of Light by Small Particles, Wiley 1983, ch. 8): the 2D counterpart of mie_sphere.h,
// for checking wires and grooves. Efficiencies are per unit length over the diameter 2a, so a
// cross section per unit length (in m) is Q * 2a. Convention exp(-i omega t): an absorber has Im m > 0.
#pragma once

#include <complex>
#include <vector>

namespace yeegap::materials {

/// Which way the incident electric field points. tm: E along the cylinder axis (Bohren & Huffman's
/// case I, only the b_n are non-zero); te: E across the axis, H along it (case II, only the a_n).
enum class CylinderPolarization { tm, te };

struct MieCylinder {
  double q_ext = 0;  // extinction efficiency, (extinction per unit length) / (2a)
  double q_sca = 0;  // scattering efficiency
  double q_abs = 0;  // absorption efficiency, q_ext - q_sca
  // coefficients[n] is b_n (tm) or a_n (te), n = 0 .. n_max with n_max = floor(x + 4 x^(1/3) + 2);
  // the series runs over n = -n_max .. n_max and the coefficient of -n equals that of n. The
  // scattered field of order n is -coefficients[n] H_n^(1)(k r) times that of the incident wave.
  std::vector<std::complex<double>> coefficients;
};

/// Cross sections per unit length of cylinder, in m (efficiency times 2a).
struct MieCylinderCrossSections {
  double extinction = 0;
  double scattering = 0;
  double absorption = 0;
};

/// The series for size parameter x = 2 pi n_med a / lambda0 (> 0), relative index m = n_particle /
/// n_med (Im m >= 0, else std::invalid_argument, as in mie_sphere) and a polarization.
MieCylinder mie_cylinder(double x, std::complex<double> m, CylinderPolarization polarization);

/// The same for a cylinder of radius (m) in a lossless medium of real index medium_index, lit at
/// the vacuum wavelength (m), with the particle's relative permittivity (Im >= 0).
MieCylinderCrossSections mie_cylinder_cross_sections(double radius, double wavelength,
                                                     std::complex<double> particle_permittivity,
                                                     CylinderPolarization polarization,
                                                     double medium_index = 1.0);

}  // namespace yeegap::materials
