// The multilayer response (materials/transfer_matrix.h) against textbook results: the Fresnel
// formulas and Brewster's angle of one interface, total internal reflection, energy conservation
// in lossless stacks, the quarter-wave antireflection layer, and the Kretschmann surface-plasmon
// check values of the project's physics notes (section 4.4).
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <cstdint>

#include "base/constants.h"
#include "materials/transfer_matrix.h"

namespace yeegap::materials {
namespace {

using constants::c0;
using constants::pi;
using cplx = std::complex<double>;

constexpr double deg = pi / 180;
const double omega_633 = 2 * pi * c0 / 632.8e-9;

Multilayer interface(double n1, double n2) { return {n1 * n1, {}, n2 * n2}; }

TEST(TransferMatrix, SingleInterfaceMatchesFresnelFormulas) {
  // Fresnel formulas (Born & Wolf, Principles of Optics, 7th ed., 1999, section 1.5.2; Hecht,
  // Optics, 4th ed., 2002, section 4.6; section numbers from memory):
  //   r_s = (n1 cos i - n2 cos t)/(n1 cos i + n2 cos t),  r_p = (n2 cos i - n1 cos t)/(n2 cos i + n1 cos t),
  //   t_s = 1 + r_s (E amplitudes), T = (n2 cos t)/(n1 cos i) |t_s|^2. Exact, so 1e-13.
  for (auto [n1, n2] : {std::pair{1.0, 1.5}, std::pair{1.5, 1.0}, std::pair{1.33, 2.4}}) {
    for (double angle = 0; angle < 80 && n1 * std::sin(angle * deg) < n2; angle += 7.5) {
      const double i = angle * deg, t = std::asin(n1 / n2 * std::sin(i));
      const double rs = (n1 * std::cos(i) - n2 * std::cos(t)) / (n1 * std::cos(i) + n2 * std::cos(t));
      const double rp = (n2 * std::cos(i) - n1 * std::cos(t)) / (n2 * std::cos(i) + n1 * std::cos(t));
      const StackResponse s = stack_response(interface(n1, n2), omega_633, i, Polarization::s);
      const StackResponse p = stack_response(interface(n1, n2), omega_633, i, Polarization::p);
      EXPECT_NEAR(std::abs(s.r - rs), 0.0, 1e-13) << n1 << " -> " << n2 << " at " << angle;
      EXPECT_NEAR(std::abs(p.r - rp), 0.0, 1e-13) << n1 << " -> " << n2 << " at " << angle;
      EXPECT_NEAR(std::abs(s.t - (1 + rs)), 0.0, 1e-13);
      EXPECT_NEAR(s.T, n2 * std::cos(t) / (n1 * std::cos(i)) * (1 + rs) * (1 + rs), 1e-13);
    }
  }
}

TEST(TransferMatrix, PPolarizedReflectionVanishesAtBrewsterAngle) {
  // tan(theta_B) = n2/n1 (Born & Wolf 1999, section 1.5.3; Hecht 2002, section 8.6; from memory).
  for (auto [n1, n2] : {std::pair{1.0, 1.5}, std::pair{1.5151, 1.0}}) {
    const double brewster = std::atan(n2 / n1);
    EXPECT_LT(stack_response(interface(n1, n2), omega_633, brewster, Polarization::p).R, 1e-28);
    EXPECT_GT(stack_response(interface(n1, n2), omega_633, brewster, Polarization::s).R, 1e-3);
    EXPECT_GT(stack_response(interface(n1, n2), omega_633, brewster - 2 * deg, Polarization::p).R, 1e-5);
    EXPECT_GT(stack_response(interface(n1, n2), omega_633, brewster + 2 * deg, Polarization::p).R, 1e-5);
  }
}

TEST(TransferMatrix, BeyondCriticalAngleReflectsEverything) {
  // Total internal reflection from glass to air above asin(1/1.5) = 41.8 degrees (Born & Wolf 1999,
  // section 1.5.4, from memory): |r| = 1 and no power crosses.
  for (double angle : {45.0, 60.0, 85.0})
    for (Polarization pol : {Polarization::s, Polarization::p}) {
      const StackResponse r = stack_response(interface(1.5, 1.0), omega_633, angle * deg, pol);
      EXPECT_NEAR(r.R, 1.0, 1e-13);
      EXPECT_EQ(r.T, 0.0);
    }
}

// A fixed pseudo-random lossless stack: seven layers of index 1.3-2.5, 20-300 nm thick.
Multilayer lossless_stack(double n_in, double n_out) {
  Multilayer m{n_in * n_in, {}, n_out * n_out};
  std::uint32_t x = 2024;
  auto next = [&x] { return (x = x * 1664525u + 1013904223u) / 4294967296.0; };
  for (int j = 0; j < 7; ++j) {
    const double n = 1.3 + 1.2 * next();
    m.layers.push_back({n * n, (20 + 280 * next()) * 1e-9});
  }
  return m;
}

TEST(TransferMatrix, LosslessStacksConserveEnergy) {
  // Poynting's theorem: with no absorbing layer, R + T = 1 (Born & Wolf 1999, section 1.6.3).
  const Multilayer stack = lossless_stack(1.5, 1.33);
  for (double lambda : {400e-9, 633e-9, 1000e-9})
    for (double angle = 0; angle <= 60; angle += 10)
      for (Polarization pol : {Polarization::s, Polarization::p}) {
        const StackResponse r = stack_response(stack, 2 * pi * c0 / lambda, angle * deg, pol);
        EXPECT_NEAR(r.R + r.T, 1.0, 1e-12) << lambda << " " << angle;
        EXPECT_GT(r.T, 0.0);
      }
  // Frustrated total internal reflection: an air gap between two prisms at 60 degrees carries an
  // evanescent wave, yet some power tunnels through and R + T = 1 still holds.
  const Multilayer gap{1.5 * 1.5, {{1.0, 200e-9}}, 1.5 * 1.5};
  for (Polarization pol : {Polarization::s, Polarization::p}) {
    const StackResponse r = stack_response(gap, omega_633, 60 * deg, pol);
    EXPECT_NEAR(r.R + r.T, 1.0, 1e-12);
    EXPECT_GT(r.T, 1e-3);
    EXPECT_LT(r.T, 0.5);
  }
}

TEST(TransferMatrix, QuarterWaveLayerCancelsReflectionAndHalfWaveLayerIsAbsent) {
  // A layer of index sqrt(n0 ns) and optical thickness lambda/4 gives R = 0 at normal incidence;
  // a lambda/2 layer leaves the bare interface's reflectance (Born & Wolf 1999, section 1.6.4;
  // Hecht 2002, section 9.7; from memory). Exact, so 1e-13.
  const double n0 = 1.0, ns = 1.52, n1 = std::sqrt(n0 * ns), lambda = 550e-9;
  const double w = 2 * pi * c0 / lambda;
  const Multilayer quarter{n0 * n0, {{n1 * n1, lambda / (4 * n1)}}, ns * ns};
  const Multilayer half{n0 * n0, {{1.9 * 1.9, lambda / (2 * 1.9)}}, ns * ns};
  EXPECT_LT(stack_response(quarter, w, 0, Polarization::s).R, 1e-26);
  EXPECT_NEAR(stack_response(half, w, 0, Polarization::p).R, std::pow((ns - n0) / (ns + n0), 2), 1e-13);
}

TEST(TransferMatrix, ThickMetalLayerReflectsLikeItsHalfSpace) {
  // 2 um of gold (eps = -11.785 + 1.256i) lets nothing through (skin depth ~ 30 nm), so the stack
  // reflects as the air/gold interface does.
  const cplx gold(-11.785, 1.256);
  for (Polarization pol : {Polarization::s, Polarization::p}) {
    const StackResponse film = stack_response({1.0, {{gold, 2e-6}}, 1.0}, omega_633, 30 * deg, pol);
    const StackResponse half_space = stack_response({1.0, {}, gold}, omega_633, 30 * deg, pol);
    EXPECT_NEAR(std::abs(film.r - half_space.r), 0.0, 1e-12);
    EXPECT_LT(film.T, 1e-25);
    EXPECT_GT(film.A, 0.01);
  }
}

// Angle of least p reflectance: a 0.01 degree scan, then golden-section refinement.
std::pair<double, double> resonance(const Multilayer& m) {
  auto R = [&](double theta) { return stack_response(m, omega_633, theta, Polarization::p).R; };
  double best = 30 * deg;
  for (double a = 30 * deg; a < 89.9 * deg; a += 0.01 * deg)
    if (R(a) < R(best)) best = a;
  double lo = best - 0.01 * deg, hi = best + 0.01 * deg;
  const double g = (std::sqrt(5.0) - 1) / 2;
  for (int it = 0; it < 80; ++it) {
    const double a = hi - g * (hi - lo), b = lo + g * (hi - lo);
    if (R(a) < R(b)) hi = b;
    else lo = a;
  }
  const double theta = 0.5 * (lo + hi);
  return {theta / deg, R(theta)};
}

TEST(TransferMatrix, KretschmannResonanceMatchesPhysicsNotes) {
  // Physics notes section 4.4 (values computed there from three-layer Airy/Fresnel p reflectance):
  // BK7 prism n = 1.5151 (Schott, from memory), Au film, analyte; 632.8 nm. The notes' tolerance:
  // 0.01 degree in theta_min and 1e-3 in R_min (both above the rounding of the tabulated values).
  struct Case {
    cplx gold;
    double n_analyte, d_nm, theta_deg, r_min;
  };
  const cplx jc(-11.785, 1.256);        // Johnson & Christy (1972) interpolated to 632.8 nm (notes 2.4)
  const cplx etchegoin(-11.411, 1.187);  // Etchegoin et al. (2006) model at 632.8 nm (notes 2.3)
  for (const Case& c : {Case{jc, 1.0, 50, 43.78, 0.006}, Case{jc, 1.3317, 50, 72.02, 0.010},
                        Case{etchegoin, 1.0, 50, 43.87, 0.001}, Case{etchegoin, 1.3317, 50, 72.45, 0.005},
                        Case{jc, 1.0, 40, 43.95, 0.064}, Case{jc, 1.0, 45, 43.84, 0.008},
                        Case{jc, 1.0, 55, 43.73, 0.057}}) {
    const Multilayer m{1.5151 * 1.5151, {{c.gold, c.d_nm * 1e-9}}, c.n_analyte * c.n_analyte};
    const auto [theta, r] = resonance(m);
    std::printf("eps_Au = %.3f%+.3fi, analyte n = %.4f, d = %.0f nm: theta_min = %.4f deg, R_min = %.5f\n",
                c.gold.real(), c.gold.imag(), c.n_analyte, c.d_nm, theta, r);
    EXPECT_NEAR(theta, c.theta_deg, 0.01);
    EXPECT_NEAR(r, c.r_min, 1e-3);
  }
}

}  // namespace
}  // namespace yeegap::materials
