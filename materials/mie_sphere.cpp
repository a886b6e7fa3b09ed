// Mie series for a sphere in the Riccati-Bessel form of Bohren & Huffman (1983) ch. 4 and app. A.
// D_n(mx) = psi_n'(mx)/psi_n(mx) comes from downward recurrence (stable for any complex mx) started
// at its exact value from a continued fraction; psi_n(x) is recurred downward too and normalised,
// because the textbook's upward recurrence loses ~2 log10(1/x) digits per order when x is small.
#include "materials/mie_sphere.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::materials {

using cplx = std::complex<double>;

namespace {

// Where the downward recurrence for D_n(mx) starts: above both n_max and |mx|, where the continued
// fraction converges in a few dozen steps (below |mx| it needs about |mx| steps).
constexpr int kDownwardMargin = 16;

void check_arguments(double x, cplx m) { detail::check_mie_arguments("sphere", x, m); }

// psi_n(x) = x j_n(x) for n = 0 .. n_max by downward recurrence
//   psi_{n-1} = (2n + 1)/x psi_n - psi_{n+1}
// (upward loses every digit once n > x), started from the exact ratio psi_{N}/psi_{N+1} =
// J_{N+1/2}/J_{N+3/2} at N = n_max + 1 > x and scaled to the exact psi_0 = sin x or, near a zero of
// sin x, to psi_1 = sin x / x - cos x (there |cos x| ~ 1, so that difference does not cancel).
std::vector<double> riccati_psi(double x, int n_max) {
  const int n_start = n_max + 1;
  std::vector<double> psi(n_max + 1);
  double upper = 1.0;                                             // psi_{n+1}, unnormalised
  double current = detail::bessel_j_ratio(n_start + 1.5, x).real();  // psi_n
  for (int n = n_start; n > 0; --n) {
    const double lower = (2.0 * n + 1.0) / x * current - upper;
    upper = current;
    current = lower;
    if (n - 1 <= n_max) psi[n - 1] = current;
    if (std::abs(current) > 1e250) {  // small x grows the sequence like (2n/x)^n: rescale
      for (int k = n - 1; k <= n_max; ++k) psi[k] *= 1e-250;
      upper *= 1e-250;
      current *= 1e-250;
    }
  }
  const double sin_x = std::sin(x);
  double scale;
  if (std::abs(sin_x) > 0.1 || n_max < 1) {
    scale = sin_x / psi[0];
  } else {
    scale = (sin_x / x - std::cos(x)) / psi[1];
  }
  for (double& p : psi) p *= scale;
  return psi;
}

// D_n(z) = psi_n'(z)/psi_n(z), n = 0 .. n_max, by D_{n-1} = n/z - 1/(D_n + n/z), started from the
// exact D_N = J_{N-1/2}(z)/J_{N+1/2}(z) - N/z. Starting from D_N = 0 instead (as the textbook listing
// does, from memory) leaves errors of order 1e-4 in Q_back at x = 100, m = 1.5: there |mx| = 150 lies
// above n_max, and 16 orders above |mx| the start error has barely decayed.
std::vector<cplx> log_derivative(cplx z, int n_max) {
  const int n_start = std::max(n_max, static_cast<int>(std::ceil(std::abs(z)))) + kDownwardMargin;
  std::vector<cplx> d(n_max + 1);
  cplx dn = detail::bessel_j_ratio(n_start + 0.5, z) - static_cast<double>(n_start) / z;
  for (int n = n_start; n > 0; --n) {
    const cplx n_over_z = static_cast<double>(n) / z;
    dn = n_over_z - 1.0 / (dn + n_over_z);
    if (n - 1 <= n_max) d[n - 1] = dn;
  }
  return d;
}

}  // namespace

namespace detail {
void check_mie_arguments(const char* what, double x, cplx m) {
  if (!(x > 0) || !std::isfinite(x))
    throw std::invalid_argument(fmt::format("Mie {}: size parameter must be positive and finite, got {}", what, x));
  if (!std::isfinite(m.real()) || !std::isfinite(m.imag()) || m == cplx(0, 0))
    throw std::invalid_argument(
        fmt::format("Mie {}: relative index must be finite and non-zero, got {}{:+}i", what, m.real(), m.imag()));
  if (m.imag() < 0)
    throw std::invalid_argument(fmt::format(
        "Mie {}: relative index {}{:+}i has Im m < 0; with exp(-i omega t) an absorber has Im m > 0 "
        "(an index written for exp(+j omega t) must be conjugated)",
        what, m.real(), m.imag()));
}
}  // namespace detail

namespace detail {

cplx bessel_j_ratio(double nu, cplx z) {
  // f = b_0 + a_1/(b_1 + a_2/(b_2 + ...)) with b_j = 2(nu + j)/z, a_j = -1 (modified Lentz).
  constexpr double tiny = 1e-300;
  constexpr double tolerance = 1e-15;
  const int max_steps = 1000 + static_cast<int>(10.0 * std::abs(z));
  cplx f = 2.0 * nu / z;
  if (f == 0.0) f = tiny;
  cplx c = f, d = 0.0;
  for (int j = 1; j <= max_steps; ++j) {
    const cplx b = 2.0 * (nu + j) / z;
    d = b - d;
    if (d == 0.0) d = tiny;
    c = b - 1.0 / c;
    if (c == 0.0) c = tiny;
    d = 1.0 / d;
    const cplx delta = c * d;
    f *= delta;
    if (std::abs(delta - 1.0) < tolerance) return f;
  }
  YG_CHECK(false, fmt::format("Bessel ratio continued fraction did not converge for nu = {}, z = {}{:+}i", nu,
                              z.real(), z.imag()));
  return f;
}

}  // namespace detail

int mie_term_count(double x) {
  return std::max(1, static_cast<int>(x + 4.0 * std::cbrt(x) + 2.0));
}

MieSphere mie_sphere(double x, cplx m) {
  check_arguments(x, m);
  const int n_max = mie_term_count(x);
  const std::vector<cplx> d = log_derivative(m * x, n_max);
  const std::vector<double> psi = riccati_psi(x, n_max);

  MieSphere r;
  r.a.resize(n_max);
  r.b.resize(n_max);
  // chi_n = -x y_n(x) by upward recurrence (it grows with n, so upward is stable), from
  // chi_{-1} = -sin x and chi_0 = cos x; xi_n = psi_n - i chi_n = x h_n^(1)(x), outgoing for exp(-i omega t).
  double chi_prev = std::cos(x), chi_prev2 = -std::sin(x);
  double ext = 0, sca = 0;
  cplx back = 0;
  for (int n = 1; n <= n_max; ++n) {
    const double chi = (2.0 * n - 1.0) / x * chi_prev - chi_prev2;
    const cplx xi(psi[n], -chi);
    const cplx xi_prev(psi[n - 1], -chi_prev);
    const double n_over_x = n / x;
    const cplx ta = d[n] / m + n_over_x;
    const cplx tb = m * d[n] + n_over_x;
    const cplx an = (ta * psi[n] - psi[n - 1]) / (ta * xi - xi_prev);
    const cplx bn = (tb * psi[n] - psi[n - 1]) / (tb * xi - xi_prev);
    r.a[n - 1] = an;
    r.b[n - 1] = bn;
    const double w = 2.0 * n + 1.0;
    ext += w * (an.real() + bn.real());
    sca += w * (std::norm(an) + std::norm(bn));
    back += w * ((n % 2 == 0) ? 1.0 : -1.0) * (an - bn);
    chi_prev2 = chi_prev;
    chi_prev = chi;
  }
  r.q_ext = 2.0 / (x * x) * ext;
  r.q_sca = 2.0 / (x * x) * sca;
  r.q_abs = r.q_ext - r.q_sca;
  r.q_back = std::norm(back) / (x * x);
  return r;
}

MieSphereCrossSections mie_sphere_cross_sections(double radius, double wavelength, cplx particle_permittivity,
                                                 double medium_index) {
  if (!(radius > 0) || !(wavelength > 0) || !(medium_index > 0))
    throw std::invalid_argument(fmt::format(
        "Mie sphere: radius, wavelength and medium index must be positive, got {} m, {} m, {}", radius,
        wavelength, medium_index));
  if (particle_permittivity.imag() < 0)
    throw std::invalid_argument(fmt::format(
        "Mie sphere: permittivity {}{:+}i has Im eps < 0; with exp(-i omega t) a passive medium has Im eps >= 0",
        particle_permittivity.real(), particle_permittivity.imag()));
  // Adding +0.0 turns a signed zero -0.0 into +0.0, so a lossless metal (eps < 0) gets m = +i|m|
  // from the principal root rather than -i|m|.
  const cplx eps(particle_permittivity.real(), particle_permittivity.imag() + 0.0);
  const cplx m = std::sqrt(eps) / medium_index;
  const double x = 2.0 * constants::pi * medium_index * radius / wavelength;
  const MieSphere q = mie_sphere(x, m);
  const double area = constants::pi * radius * radius;
  return {q.q_ext * area, q.q_sca * area, q.q_abs * area, q.q_back * area};
}

}  // namespace yeegap::materials
