// Characteristic-matrix multilayer response (see transfer_matrix.h): the tangential fields (U, W)
// carried across each layer by a 2x2 matrix, r and t from the product, t through the inverse map
// (det M = 1) to avoid cancellation behind a thick absorbing layer. Derivation: docs/physics.md 4.4.
// Trap: cos and sin of a thick absorbing layer overflow once |Im delta| exceeds about 700.
#include "materials/transfer_matrix.h"

#include <cmath>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::materials {

namespace {

using cplx = std::complex<double>;

// Normal wavenumber over k0 on the branch of an outgoing or decaying wave (Im q >= 0, and Re q >= 0
// when q is real), also for a purely real negative argument whose zero imaginary part is -0.0.
cplx normal_index(cplx eps, double kx_over_k0) {
  cplx q = std::sqrt(eps - kx_over_k0 * kx_over_k0);
  if (q.imag() < 0 || (q.imag() == 0 && q.real() < 0)) q = -q;
  return q;
}

// sin(x)/x, with its series near 0 (a layer at its own critical angle has q = 0).
cplx sinc(cplx x) {
  if (std::abs(x) < 1e-4) return 1.0 - x * x / 6.0;
  return std::sin(x) / x;
}

}  // namespace

StackResponse stack_response(const Multilayer& stack, double omega, double theta, Polarization pol) {
  YG_CHECK(omega > 0, "the multilayer response needs omega > 0");
  const double k0 = omega / constants::c0;
  const cplx n_inc = std::sqrt(stack.eps_incident);
  YG_CHECK(std::abs(n_inc.imag()) < 1e-12 * std::abs(n_inc) && n_inc.real() > 0,
           "the incident medium must be lossless (R and T are defined against its real admittance)");
  const double kx = n_inc.real() * std::sin(theta);  // kx / k0
  auto admittance = [&](cplx eps, cplx q) { return pol == Polarization::s ? q : q / eps; };

  // M = P_N ... P_1, built in the order the light crosses the layers.
  cplx a = 1.0, b = 0.0, c = 0.0, d = 1.0;
  for (const Layer& layer : stack.layers) {
    const cplx q = normal_index(layer.eps, kx);
    const cplx delta = k0 * q * layer.thickness;
    const cplx cos_d = std::cos(delta);
    // sin(delta)/Y and Y sin(delta) without dividing by q (q may vanish).
    const cplx sin_over_y = k0 * layer.thickness * sinc(delta) * (pol == Polarization::s ? 1.0 : layer.eps);
    const cplx y_sin = admittance(layer.eps, q) * std::sin(delta);
    const cplx i(0, 1);
    const cplx p11 = cos_d, p12 = i * sin_over_y, p21 = i * y_sin, p22 = cos_d;
    const cplx na = p11 * a + p12 * c, nb = p11 * b + p12 * d;
    const cplx nc = p21 * a + p22 * c, nd = p21 * b + p22 * d;
    a = na, b = nb, c = nc, d = nd;
  }
  const cplx y0 = admittance(stack.eps_incident, normal_index(stack.eps_incident, kx));
  const cplx ys = admittance(stack.eps_exit, normal_index(stack.eps_exit, kx));
  const cplx front = y0 * (d - ys * b), back = ys * a - c;
  StackResponse out;
  out.r = (front - back) / (front + back);
  out.t = 2.0 * y0 / (front + back);
  out.R = std::norm(out.r);
  out.T = ys.real() / y0.real() * std::norm(out.t);
  out.A = 1.0 - out.R - out.T;
  return out;
}

}  // namespace yeegap::materials
