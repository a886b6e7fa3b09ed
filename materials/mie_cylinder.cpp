// Normal-incidence cylinder series (Bohren & Huffman 1983, ch. 8), written with the logarithmic
// derivative D_n(mx) = J_n'(mx)/J_n(mx) so that only real-argument Bessel functions are needed:
//   tm (case I):  b_n = [J_n'(x) - m D_n J_n(x)] / [H_n'(x) - m D_n H_n(x)]
//   te (case II): a_n = [m J_n'(x) - D_n J_n(x)] / [m H_n'(x) - D_n H_n(x)],   H_n = J_n + i Y_n
// (the textbook ratios divided through by J_n(mx), which can be huge or tiny for complex mx).
#include "materials/mie_cylinder.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include <fmt/format.h>

#include "base/constants.h"
#include "materials/mie_sphere.h"

namespace yeegap::materials {

using cplx = std::complex<double>;

namespace {

// Start the downward recurrence for D_n(mx) this far above max(n_max, |mx|) (see mie_sphere.cpp).
constexpr int kDownwardMargin = 16;

void check_arguments(double x, cplx m) { detail::check_mie_arguments("cylinder", x, m); }

// J_n(x), n = 0 .. n_max, by downward recurrence J_{n-1} = (2n/x) J_n - J_{n+1} (upward loses every
// digit once n > x), started from the exact ratio J_N/J_{N+1} at N = n_max + 1 and scaled to J_0 or
// J_1 from <cmath>, whichever is larger (they have no common zero).
std::vector<double> bessel_j(double x, int n_max) {
  const int n_start = n_max + 1;
  std::vector<double> j(n_max + 1);
  double upper = 1.0;                                               // J_{n+1}, unnormalised
  double current = detail::bessel_j_ratio(n_start + 1.0, x).real();  // J_n
  for (int n = n_start; n > 0; --n) {
    const double lower = 2.0 * n / x * current - upper;
    upper = current;
    current = lower;
    if (n - 1 <= n_max) j[n - 1] = current;
    if (std::abs(current) > 1e250) {  // small x grows the sequence like (2n/x)^n: rescale
      for (int k = n - 1; k <= n_max; ++k) j[k] *= 1e-250;
      upper *= 1e-250;
      current *= 1e-250;
    }
  }
  const double j0 = std::cyl_bessel_j(0.0, x);
  const double j1 = std::cyl_bessel_j(1.0, x);
  const double scale = (std::abs(j0) >= std::abs(j1) || n_max < 1) ? j0 / j[0] : j1 / j[1];
  for (double& v : j) v *= scale;
  return j;
}

// Y_n(x), n = 0 .. n_max, by upward recurrence (Y_n grows with n, so upward is the stable way).
std::vector<double> bessel_y(double x, int n_max) {
  std::vector<double> y(n_max + 1);
  y[0] = std::cyl_neumann(0.0, x);
  if (n_max >= 1) y[1] = std::cyl_neumann(1.0, x);
  for (int n = 1; n < n_max; ++n) y[n + 1] = 2.0 * n / x * y[n] - y[n - 1];
  return y;
}

// D_n(z) = J_n'(z)/J_n(z), n = 0 .. n_max, by D_{n-1} = (n-1)/z - 1/(D_n + n/z), started from the
// exact D_N = J_{N-1}(z)/J_N(z) - N/z.
std::vector<cplx> log_derivative(cplx z, int n_max) {
  const int n_start = std::max(n_max, static_cast<int>(std::ceil(std::abs(z)))) + kDownwardMargin;
  std::vector<cplx> d(n_max + 1);
  cplx dn = detail::bessel_j_ratio(static_cast<double>(n_start), z) - static_cast<double>(n_start) / z;
  for (int n = n_start; n > 0; --n) {
    dn = static_cast<double>(n - 1) / z - 1.0 / (dn + static_cast<double>(n) / z);
    if (n - 1 <= n_max) d[n - 1] = dn;
  }
  return d;
}

}  // namespace

MieCylinder mie_cylinder(double x, cplx m, CylinderPolarization polarization) {
  check_arguments(x, m);
  // The sphere's truncation rule (Wiscombe 1980) serves here too: the terms fall off beyond n ~ x
  // in the same way for cylindrical orders (common practice).
  const int n_max = mie_term_count(x);
  const std::vector<cplx> d = log_derivative(m * x, n_max);
  const std::vector<double> j = bessel_j(x, n_max + 1);
  const std::vector<double> y = bessel_y(x, n_max + 1);

  MieCylinder r;
  r.coefficients.resize(n_max + 1);
  double ext = 0, sca = 0;
  for (int n = 0; n <= n_max; ++n) {
    // Z_n' = Z_{n-1} - (n/x) Z_n, and Z_0' = -Z_1, for Z = J, Y.
    const double jd = (n == 0) ? -j[1] : j[n - 1] - n / x * j[n];
    const double yd = (n == 0) ? -y[1] : y[n - 1] - n / x * y[n];
    const cplx h(j[n], y[n]);
    const cplx hd(jd, yd);
    const cplx c = (polarization == CylinderPolarization::tm)
                       ? (jd - m * d[n] * j[n]) / (hd - m * d[n] * h)
                       : (m * jd - d[n] * j[n]) / (m * hd - d[n] * h);
    r.coefficients[n] = c;
    const double w = (n == 0) ? 1.0 : 2.0;  // orders n and -n contribute alike
    ext += w * c.real();
    sca += w * std::norm(c);
  }
  r.q_ext = 2.0 / x * ext;
  r.q_sca = 2.0 / x * sca;
  r.q_abs = r.q_ext - r.q_sca;
  return r;
}

MieCylinderCrossSections mie_cylinder_cross_sections(double radius, double wavelength, cplx particle_permittivity,
                                                     CylinderPolarization polarization, double medium_index) {
  if (!(radius > 0) || !(wavelength > 0) || !(medium_index > 0))
    throw std::invalid_argument(fmt::format(
        "Mie cylinder: radius, wavelength and medium index must be positive, got {} m, {} m, {}", radius,
        wavelength, medium_index));
  if (particle_permittivity.imag() < 0)
    throw std::invalid_argument(fmt::format(
        "Mie cylinder: permittivity {}{:+}i has Im eps < 0; with exp(-i omega t) a passive medium has Im eps >= 0",
        particle_permittivity.real(), particle_permittivity.imag()));
  const cplx eps(particle_permittivity.real(), particle_permittivity.imag() + 0.0);  // -0.0 -> +0.0
  const cplx m = std::sqrt(eps) / medium_index;
  const double x = 2.0 * constants::pi * medium_index * radius / wavelength;
  const MieCylinder q = mie_cylinder(x, m, polarization);
  const double width = 2.0 * radius;
  return {q.q_ext * width, q.q_sca * width, q.q_abs * width};
}

}  // namespace yeegap::materials
