// Sommerfeld integrals of a dipole above a half-space (see dipole_half_space.h; Novotny & Hecht 2006,
// sec. 10.5, form from memory, checked against image theory). Propagating part over s = sin t,
// evanescent part over s = cosh t (no 1/s_z end points), each by adaptive Gauss-Kronrod 7/15 to a
// relative 1e-10. The integrals: docs/physics.md 4.6.
#include "materials/dipole_half_space.h"

#include <array>
#include <cmath>
#include <functional>
#include <stdexcept>

namespace yeegap::materials {
namespace {

using cd = std::complex<double>;
constexpr double pi = 3.14159265358979323846;

// Gauss-Kronrod 15-point nodes and weights on [-1, 1] (the 7-point Gauss rule sits on the odd nodes).
constexpr std::array<double, 8> xk = {0.991455371120812639, 0.949107912342758525, 0.864864423359769073,
                                      0.741531185599394440, 0.586087235467691130, 0.405845151377397167,
                                      0.207784955007898468, 0.000000000000000000};
constexpr std::array<double, 8> wk = {0.022935322010529225, 0.063092092629978553, 0.104790010322250184,
                                      0.140653259715525919, 0.169004726639267903, 0.190350578064785410,
                                      0.204432940075298892, 0.209482141084727828};
constexpr std::array<double, 4> wg = {0.129484966168869693, 0.279705391489276668, 0.381830050505118945,
                                      0.417959183673469388};

using Integrand = std::function<cd(double)>;

cd adaptive(const Integrand& f, double a, double b, double tol, int depth) {
  const double c = 0.5 * (a + b), h = 0.5 * (b - a);
  cd kronrod = wk[7] * f(c), gauss = wg[3] * f(c);
  for (int i = 0; i < 7; ++i) {
    const cd pair = f(c - h * xk[i]) + f(c + h * xk[i]);
    kronrod += wk[i] * pair;
    if (i % 2 == 1) gauss += wg[i / 2] * pair;
  }
  kronrod *= h;
  gauss *= h;
  if (depth >= 40 || std::abs(kronrod - gauss) <= tol) return kronrod;
  return adaptive(f, a, c, 0.5 * tol, depth + 1) + adaptive(f, c, b, 0.5 * tol, depth + 1);
}

// Integral over [a, b] to a relative accuracy of about 1e-10 of its own size (a first coarse pass
// sets the scale).
cd integrate(const Integrand& f, double a, double b) {
  cd scale = 0;
  const int pieces = 64;
  for (int i = 0; i < pieces; ++i) scale += adaptive(f, a + (b - a) * i / pieces, a + (b - a) * (i + 1) / pieces, 1e300, 40);
  const double tol = 1e-10 * std::max(std::abs(scale), 1e-300);
  cd total = 0;
  for (int i = 0; i < pieces; ++i)
    total += adaptive(f, a + (b - a) * i / pieces, a + (b - a) * (i + 1) / pieces, tol / pieces, 0);
  return total;
}

struct Reflection {
  cd rs, rp;
};

// The two integrals for reflection coefficients r(s, s_z).
HalfSpaceRates rates(double height, double wavelength, double upper_index,
                     const std::function<Reflection(cd s, cd sz)>& reflection) {
  if (!(height > 0) || !(wavelength > 0) || !(upper_index > 0))
    throw std::invalid_argument("dipole_above_half_space: height, wavelength and index must be positive");
  const double u = 2 * (2 * pi * upper_index / wavelength) * height;
  // Propagating: s = sin t, s_z = cos t, ds / s_z = dt.
  const Integrand perp_prop = [&](double t) {
    const double s = std::sin(t), sz = std::cos(t);
    return s * s * s * reflection(s, sz).rp * std::exp(cd(0, u * sz));
  };
  const Integrand par_prop = [&](double t) {
    const double s = std::sin(t), sz = std::cos(t);
    const Reflection r = reflection(s, sz);
    return s * (r.rs - sz * sz * r.rp) * std::exp(cd(0, u * sz));
  };
  // Evanescent: s = cosh t, s_z = i sinh t, ds / s_z = -i dt; exp(i u s_z) = exp(-u sinh t).
  const double t_max = std::asinh(60.0 / u);  // exp(-60): nothing beyond
  const Integrand perp_ev = [&](double t) {
    const double s = std::cosh(t), sh = std::sinh(t);
    return cd(0, -1) * s * s * s * reflection(s, cd(0, sh)).rp * std::exp(-u * sh);
  };
  const Integrand par_ev = [&](double t) {
    const double s = std::cosh(t), sh = std::sinh(t);
    const cd sz(0, sh);
    const Reflection r = reflection(s, sz);
    return cd(0, -1) * s * (r.rs - sz * sz * r.rp) * std::exp(-u * sh);
  };
  const cd i_perp = integrate(perp_prop, 0, pi / 2) + integrate(perp_ev, 0, t_max);
  const cd i_par = integrate(par_prop, 0, pi / 2) + integrate(par_ev, 0, t_max);
  return {1 + 1.5 * i_perp.real(), 1 + 0.75 * i_par.real()};
}

}  // namespace

HalfSpaceRates dipole_above_half_space(double height, double wavelength, double upper_index, cd lower_eps) {
  if (lower_eps.imag() < 0)
    throw std::invalid_argument("dipole_above_half_space: Im eps < 0 is gain (or the other time convention)");
  const cd ratio = lower_eps / (upper_index * upper_index);
  return rates(height, wavelength, upper_index, [&](cd s, cd sz) {
    cd sz2 = std::sqrt(ratio - s * s);
    if (sz2.imag() < 0) sz2 = -sz2;
    return Reflection{(sz - sz2) / (sz + sz2), (ratio * sz - sz2) / (ratio * sz + sz2)};
  });
}

HalfSpaceRates dipole_above_perfect_mirror_by_integral(double height, double wavelength, double upper_index) {
  return rates(height, wavelength, upper_index, [](cd, cd) { return Reflection{-1.0, 1.0}; });
}

}  // namespace yeegap::materials
