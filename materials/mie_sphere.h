// Mie scattering by a homogeneous sphere (Bohren & Huffman, Absorption and Scattering of Light by
// Small Particles, Wiley 1983, ch. 4 and app. A): the reference the solver's sphere runs are checked
// against. Time convention exp(-i omega t), as in pole_set.h and as in Bohren & Huffman, whose index
// m = n + ik has k >= 0 for an absorber; so an absorbing sphere has Im m > 0 here too.
#pragma once

#include <complex>
#include <vector>

namespace yeegap::materials {

/// Efficiencies (cross section over the geometric cross section pi a^2) and the expansion
/// coefficients of the scattered field.
struct MieSphere {
  double q_ext = 0;   // extinction efficiency
  double q_sca = 0;   // scattering efficiency
  double q_abs = 0;   // absorption efficiency, q_ext - q_sca
  double q_back = 0;  // radar backscattering efficiency |sum (2n+1)(-1)^n (a_n - b_n)|^2 / x^2
  // a[n - 1] and b[n - 1] hold a_n and b_n (Bohren & Huffman ch. 4 normalisation), n = 1 .. n_max, where
  // n_max = floor(x + 4 x^(1/3) + 2) (Wiscombe, Appl. Opt. 19, 1505 (1980)).
  std::vector<std::complex<double>> a;
  std::vector<std::complex<double>> b;
};

/// Cross sections in m^2 (efficiency times pi a^2).
struct MieSphereCrossSections {
  double extinction = 0;
  double scattering = 0;
  double absorption = 0;
  double backscattering = 0;
};

/// The Mie series for size parameter x = 2 pi n_med a / lambda0 (> 0) and relative index
/// m = n_particle / n_med. Im m must be >= 0 (a passive particle): a negative imaginary part almost
/// always means an index written for the exp(+j omega t) convention, so it is refused
/// (std::invalid_argument) rather than silently giving negative absorption.
MieSphere mie_sphere(double x, std::complex<double> m);

/// The same for a sphere of radius (m) in a lossless medium of real index medium_index, lit at the
/// vacuum wavelength (m), with the particle's relative permittivity (Im >= 0).
MieSphereCrossSections mie_sphere_cross_sections(double radius, double wavelength,
                                                 std::complex<double> particle_permittivity,
                                                 double medium_index = 1.0);

/// n_max = floor(x + 4 x^(1/3) + 2), at least 1: the number of terms kept (Wiscombe 1980).
int mie_term_count(double x);

namespace detail {
/// Refuses (std::invalid_argument, naming `what`) a size parameter that is not positive and finite,
/// and a relative index that is zero, not finite, or has Im m < 0 (written for exp(+j omega t)).
void check_mie_arguments(const char* what, double x, std::complex<double> m);
/// J_{nu-1}(z) / J_nu(z) from the continued fraction J_{nu-1}/J_nu = 2nu/z - 1/(J_nu/J_{nu+1}),
/// evaluated by the modified Lentz algorithm: the exact start for the downward recurrences of the
/// sphere (half-integer nu) and cylinder (integer nu) series. Converges fast for nu > |z|.
std::complex<double> bessel_j_ratio(double nu, std::complex<double> z);
}  // namespace detail

}  // namespace yeegap::materials
