// Characteristic-matrix multilayer response (see transfer_matrix.h). Derivation, exp(-i omega t),
// plane of incidence xz, every field ~ exp(i kx x) with kx = k0 n_inc sin(theta) the same in all
// layers (Snell), and in layer j: kz = k0 q_j, q_j = sqrt(eps_j - eps_inc sin^2 theta).
//   s (TE): U = E_y,  W = -omega mu0 H_x    (from curl E = i omega mu0 H)
//   p (TM): U = H_y,  W =  omega eps0 E_x   (from curl H = -i omega eps0 eps E)
// U and W are the tangential fields, continuous at every interface. For a wave A e^{i kz z} +
// B e^{-i kz z} in layer j: U = A e + B e^-, W = Y_j (A e - B e^-), with the admittance
//   Y_j = q_j (s)   or   Y_j = q_j / eps_j (p).
// Across a layer of thickness d, with delta = k0 q_j d,
//   [U; W](z + d) = [[cos delta, i sin delta / Y_j], [i Y_j sin delta, cos delta]] [U; W](z)
// (the inverse of Born & Wolf's characteristic matrix, which takes the fields at the back of the
// layer to those at its front; from memory). Multiply the layers into M = [[a, b], [c, d]]. With U = 1 + r,
// W = Y_0 (1 - r) in front and U = t, W = Y_s t behind:
//   r = [Y_0 (d - Y_s b) - (Y_s a - c)] / D,   t = 2 Y_0 / D,   D = Y_0 (d - Y_s b) + (Y_s a - c)
// (t from the inverse map, det M = 1, which avoids the cancellation of a (1 + r) + b Y_0 (1 - r)
// behind a thick absorbing layer).
// The z-component of the time-averaged Poynting vector of one wave is Re(Y) |U|^2 / (2 omega mu0)
// for s and Re(Y) |U|^2 / (2 omega eps0) for p, so for a lossless incident medium
//   R = |r|^2,  T = Re(Y_s) / Re(Y_0) |t|^2.
// For no layers r reduces to (Y_0 - Y_s)/(Y_0 + Y_s): the Fresnel coefficients, r_p in the
// convention of the H amplitude. Thick absorbing layers overflow cos/sin once |Im delta| > ~700.
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
