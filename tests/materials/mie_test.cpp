// Analytic sphere and cylinder scattering (materials/mie_sphere.h, mie_cylinder.h) against published
// and independently computed values, their small-size (quasi-static) limits, energy conservation,
// and, for the cylinder, a second implementation from Bessel integral representations written here.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <cstdio>
#include <functional>
#include <stdexcept>
#include <vector>

#include "base/constants.h"
#include "base/units.h"
#include "materials/mie_cylinder.h"
#include "materials/mie_sphere.h"
#include "materials/pole_set.h"

namespace yeegap::materials {
namespace {

using cplx = std::complex<double>;
using constants::pi;

// physics.md 4.1 asks for agreement to 1e-5; efficiencies are O(0.1-3) and the tables give 5-6
// decimals, so an absolute 1e-5 also covers their rounding (at most 5e-6).
constexpr double kTableTolerance = 1e-5;

double relative_error(double got, double want) { return std::abs(got / want - 1.0); }

// ---------------------------------------------------------------------------------------------------
// Sphere: published values (physics.md 4.1)
// ---------------------------------------------------------------------------------------------------

TEST(MieSphere, MatchesBohrenHuffmanBhmieExample) {
  // Bohren & Huffman, Absorption and Scattering of Light by Small Particles (Wiley 1983), app. A,
  // the BHMIE example: m = 1.55, radius 0.525 um, lambda 0.6328 um in vacuum. Values from physics.md
  // 4.1 [M + V-calc]: recalled from the book's printed output (from memory) and reproduced there by
  // an independent implementation.
  const double radius = 0.525 * units::um, wavelength = 0.6328 * units::um;
  const double x = 2 * pi * radius / wavelength;
  EXPECT_NEAR(x, 5.2128, 1e-4);
  const MieSphere q = mie_sphere(x, 1.55);
  EXPECT_NEAR(q.q_ext, 3.10543, kTableTolerance);
  EXPECT_NEAR(q.q_sca, 3.10543, kTableTolerance);
  EXPECT_NEAR(q.q_back, 2.92534, kTableTolerance);
  // The same through the physical-units entry point: cross sections are Q pi a^2.
  const MieSphereCrossSections c = mie_sphere_cross_sections(radius, wavelength, {1.55 * 1.55, 0.0});
  const double area = pi * radius * radius;
  EXPECT_NEAR(c.extinction / area, 3.10543, kTableTolerance);
  EXPECT_NEAR(c.scattering / area, 3.10543, kTableTolerance);
  EXPECT_NEAR(c.backscattering / area, 2.92534, kTableTolerance);
  EXPECT_NEAR(c.absorption / area, 0.0, 1e-12);
}

TEST(MieSphere, MatchesWiscombeTestAtSizeTen) {
  // Wiscombe, Appl. Opt. 19, 1505 (1980) and his 1979 NCAR report, test case m = 1.5, x = 10
  // (from memory); Q_back computed in physics.md 4.1 [M + V-calc].
  const MieSphere q = mie_sphere(10.0, 1.5);
  EXPECT_NEAR(q.q_ext, 2.881999, kTableTolerance);
  EXPECT_NEAR(q.q_sca, 2.881999, kTableTolerance);
  EXPECT_NEAR(q.q_back, 1.695064, kTableTolerance);
}

TEST(MieSphere, MatchesWiscombeTestAtSizeHundred) {
  // Wiscombe (Appl. Opt. 19, 1505 (1980); NCAR report 1979) test case m = 1.5, x = 100: Q_ext and
  // Q_sca from physics.md 4.1 [M + V-calc].
  const MieSphere q = mie_sphere(100.0, 1.5);
  EXPECT_NEAR(q.q_ext, 2.094388, kTableTolerance);
  EXPECT_NEAR(q.q_sca, 2.094388, kTableTolerance);
  // An earlier recalled Q_back of 1.736799 here is not reproduced by this module (physics.md 4.1
  // now gives the corrected value). Two
  // independent computations give 1.736193 [V-calc]: the textbook Riccati-Bessel formulas in
  // 40-digit arithmetic (mpmath Bessel functions, 120 to 140 terms, all agreeing to 9 digits) and
  // the same formulas with double-precision library spherical Bessel functions. Starting the D_n(mx)
  // recurrence from zero 16 orders above |mx| instead of from its exact value moves this module to
  // 1.736434, so the physics.md value is most likely a start-value artefact of that kind; reported
  // for correction.
  EXPECT_NEAR(q.q_back, 1.736193, kTableTolerance);
}

struct SphereRow {
  cplx m;
  double x, q_ext, q_sca, q_abs, q_back;
};

TEST(MieSphere, MatchesComputedTableForAbsorbingAndWeakSpheres) {
  // physics.md 4.1, "additional computed values" [V-calc only]: computed there from the same series
  // by a separate implementation; no outside source.
  const SphereRow rows[] = {
      {{1.5, 1.0}, 1, 2.336321, 0.663454, 1.672867, 0.573003},
      {{1.5, 1.0}, 10, 2.417295, 1.346958, 1.070337, 0.172926},
      {{1.5, 1.0}, 100, 2.097502, 1.283697, 0.813805, 0.172421},
      {{1.33, 0.0}, 1, 0.093924, 0.093924, 0.0, 0.084625},
  };
  for (const SphereRow& r : rows) {
    SCOPED_TRACE(testing::Message() << "m = " << r.m << ", x = " << r.x);
    const MieSphere q = mie_sphere(r.x, r.m);
    EXPECT_NEAR(q.q_ext, r.q_ext, kTableTolerance);
    EXPECT_NEAR(q.q_sca, r.q_sca, kTableTolerance);
    EXPECT_NEAR(q.q_abs, r.q_abs, kTableTolerance);
    EXPECT_NEAR(q.q_back, r.q_back, kTableTolerance);
  }
}

// ---------------------------------------------------------------------------------------------------
// Sphere: quasi-static limit, energy balance, Drude resonance
// ---------------------------------------------------------------------------------------------------

TEST(MieSphere, ApproachesQuasiStaticCrossSectionsAtSmallSize) {
  // physics.md 4.2 (Rayleigh limit; Bohren & Huffman 1983 ch. 5): alpha = 4 pi a^3 (eps - eps_d) /
  // (eps + 2 eps_d), C_abs = k Im alpha, C_sca = k^4 |alpha|^2 / (6 pi), k = n_d k0. The next terms
  // are O(x^2) relative, about 1e-4 at x = 0.01, so the brief's 1e-3 holds with room.
  const double wavelength = 500 * units::nm;
  struct Case {
    cplx eps;
    double n_d;
  };
  // A lossless dielectric, a lossy one (eps of m = 1.5 + 1i), and a metal-like eps in water.
  const Case cases[] = {{{2.25, 0.0}, 1.0}, {{1.25, 3.0}, 1.0}, {{-5.0, 2.0}, 1.333}};
  for (const Case& c : cases) {
    const double k = 2 * pi * c.n_d / wavelength;
    const double radius = 0.01 / k;  // x = 0.01
    const double eps_d = c.n_d * c.n_d;
    const cplx alpha = 4 * pi * std::pow(radius, 3) * (c.eps - eps_d) / (c.eps + 2 * eps_d);
    const double c_abs = k * alpha.imag();
    const double c_sca = std::pow(k, 4) * std::norm(alpha) / (6 * pi);
    const MieSphereCrossSections mie = mie_sphere_cross_sections(radius, wavelength, c.eps, c.n_d);
    SCOPED_TRACE(testing::Message() << "eps = " << c.eps << ", n_d = " << c.n_d);
    std::printf("sphere x = 0.01, eps = %g%+gi, n_d = %g: C_sca rel. error %.2e, C_abs rel. error %.2e\n",
                c.eps.real(), c.eps.imag(), c.n_d, relative_error(mie.scattering, c_sca),
                c_abs > 0 ? relative_error(mie.absorption, c_abs) : 0.0);
    EXPECT_LT(relative_error(mie.scattering, c_sca), 1e-3);
    if (c.eps.imag() > 0) {
      EXPECT_LT(relative_error(mie.absorption, c_abs), 1e-3);
    } else {
      EXPECT_LT(std::abs(mie.absorption), 1e-10 * mie.scattering);
    }
  }
}

TEST(MieSphere, LeadingCoefficientsFollowSmallSizeExpansion) {
  // Bohren & Huffman 1983 ch. 5 (small-particle expansion, from memory): a_1 = -(2i x^3 / 3)
  // (m^2 - 1)/(m^2 + 2) + O(x^5), and b_1 = O(x^5). The sign of i fixes the coefficients' phase
  // convention (exp(-i omega t)); 1e-3 allows the O(x^2) correction at x = 0.01.
  // b_1 ~ x^5 is checked only for its order, |b_1| < x^2 |a_1|.
  const double x = 0.01;
  const cplx m(1.5, 1.0), m2 = m * m;
  const MieSphere q = mie_sphere(x, m);
  const cplx a1 = cplx(0, -2.0 / 3.0) * std::pow(x, 3) * (m2 - 1.0) / (m2 + 2.0);
  EXPECT_LT(std::abs(q.a[0] / a1 - 1.0), 1e-3);
  EXPECT_LT(std::abs(q.b[0]), x * x * std::abs(a1));
  // a_n scales as x^(2n+1) and b_n as x^(2n+3): halving x divides them by 2^(2n+1) and 2^(2n+3).
  // This checks the high orders too, which a plain upward psi_n recurrence gets wrong at small x.
  const MieSphere q2 = mie_sphere(0.04, m), q1 = mie_sphere(0.02, m);
  ASSERT_GE(q1.a.size(), 3u);
  for (int n = 1; n <= 3; ++n) {
    SCOPED_TRACE(testing::Message() << "n = " << n);
    EXPECT_NEAR(std::abs(q2.a[n - 1] / q1.a[n - 1]), std::pow(2.0, 2 * n + 1), 0.01 * std::pow(2.0, 2 * n + 1));
    EXPECT_NEAR(std::abs(q2.b[n - 1] / q1.b[n - 1]), std::pow(2.0, 2 * n + 3), 0.01 * std::pow(2.0, 2 * n + 3));
  }
}

TEST(MieSphere, AbsorbingSpheresAbsorbAndLosslessOnesDoNot) {
  // Energy balance (Bohren & Huffman 1983 ch. 4): Q_abs = Q_ext - Q_sca, and for a passive sphere
  // every multipole obeys Re a_n >= |a_n|^2 (its absorption is >= 0), with equality when lossless.
  // Tolerance 1e-10 relative: rounding over a few hundred terms.
  const double sizes[] = {0.1, 1.0, 5.0, 30.0, 200.0};
  const cplx lossy[] = {{1.5, 0.01}, {1.5, 1.0}, {0.2, 3.0}, {4.0, 0.5}};
  const cplx lossless[] = {{1.33, 0.0}, {0.7, 0.0}, {2.5, 0.0}, {0.0, 2.0}};  // 2i: eps = -4 metal
  for (double x : sizes) {
    for (cplx m : lossy) {
      SCOPED_TRACE(testing::Message() << "m = " << m << ", x = " << x);
      const MieSphere q = mie_sphere(x, m);
      EXPECT_GT(q.q_abs, 0.0);
      EXPECT_DOUBLE_EQ(q.q_abs, q.q_ext - q.q_sca);
      for (std::size_t i = 0; i < q.a.size(); ++i) {
        EXPECT_GE(q.a[i].real() - std::norm(q.a[i]), -1e-12) << "n = " << i + 1;
        EXPECT_GE(q.b[i].real() - std::norm(q.b[i]), -1e-12) << "n = " << i + 1;
      }
    }
    for (cplx m : lossless) {
      SCOPED_TRACE(testing::Message() << "m = " << m << ", x = " << x);
      const MieSphere q = mie_sphere(x, m);
      EXPECT_LT(std::abs(q.q_ext - q.q_sca), 1e-10 * q.q_ext);
    }
  }
}

// Absorption peak of a small Drude sphere in vacuum, by golden-section search on Q_abs(omega).
double drude_sphere_peak(const PoleSet& metal, double radius, double omega_lo, double omega_hi) {
  auto q_abs = [&](double omega) {
    const double wavelength = units::omega_to_wavelength(omega);
    return mie_sphere_cross_sections(radius, wavelength, permittivity(metal, omega)).absorption;
  };
  const double g = (std::sqrt(5.0) - 1) / 2;
  double a = omega_lo, b = omega_hi;
  for (int i = 0; i < 100 && (b - a) > 1e-10 * b; ++i) {
    const double c = b - g * (b - a), d = a + g * (b - a);
    if (q_abs(c) > q_abs(d)) b = d; else a = c;
  }
  return 0.5 * (a + b);
}

TEST(MieSphere, SmallDrudeSphereAbsorbsMostNearPlasmaFrequencyOverRootThree) {
  // physics.md 4.2 (Froehlich condition, Re eps = -2 eps_d): a Drude metal with eps_inf = 1 in
  // vacuum resonates at omega_p / sqrt(3), within the damping-limited half width gamma/2. The metal
  // is a test material (omega_p = 8 eV, gamma = 0.1 eV, invented; only gamma << omega_p matters).
  PoleSet metal;
  metal.eps_inf = 1.0;
  metal.drude.push_back({units::eV_to_omega(8.0), units::eV_to_omega(0.1)});
  const double omega_f = metal.drude[0].omega_p / std::sqrt(3.0);
  const double gamma = metal.drude[0].gamma;
  // A 2 nm sphere: x = 0.047 at omega_f, so retardation shifts the peak by only ~0.1 %.
  const double small = drude_sphere_peak(metal, 2 * units::nm, 0.9 * omega_f, 1.1 * omega_f);
  std::printf("Drude sphere, radius 2 nm: peak at %.5f omega_p/sqrt(3) (half width %.5f)\n", small / omega_f,
              0.5 * gamma / omega_f);
  EXPECT_LT(std::abs(small - omega_f), 0.5 * gamma);
  // Retardation red-shifts the dipole resonance as the sphere grows (Bohren & Huffman 1983 ch. 12,
  // from memory; also the x^2 term of a_1's denominator): a 15 nm sphere peaks lower.
  const double large = drude_sphere_peak(metal, 15 * units::nm, 0.8 * omega_f, 1.05 * omega_f);
  std::printf("Drude sphere, radius 15 nm: peak at %.5f omega_p/sqrt(3)\n", large / omega_f);
  EXPECT_LT(large, small - 0.5 * gamma);
}

TEST(MieSphere, RefusesIndexWrittenForTheOtherTimeConventionAndBadSizes) {
  EXPECT_THROW(mie_sphere(1.0, {1.5, -0.1}), std::invalid_argument);
  EXPECT_THROW(mie_sphere(0.0, 1.5), std::invalid_argument);
  EXPECT_THROW(mie_sphere(std::nan(""), 1.5), std::invalid_argument);
  EXPECT_THROW(mie_sphere_cross_sections(50e-9, 500e-9, {-10.0, -1.0}), std::invalid_argument);
  EXPECT_THROW(mie_sphere_cross_sections(-50e-9, 500e-9, {2.0, 0.0}), std::invalid_argument);
  // A lossless metal written with a signed zero still gets the passive root m = +2i.
  const MieSphereCrossSections c = mie_sphere_cross_sections(50e-9, 500e-9, {-4.0, -0.0});
  EXPECT_GT(c.scattering, 0.0);
  EXPECT_LT(std::abs(c.absorption), 1e-10 * c.scattering);
}

// ---------------------------------------------------------------------------------------------------
// Cylinder at normal incidence (Bohren & Huffman 1983 ch. 8)
// ---------------------------------------------------------------------------------------------------

constexpr CylinderPolarization kBoth[] = {CylinderPolarization::tm, CylinderPolarization::te};

const char* name(CylinderPolarization p) { return p == CylinderPolarization::tm ? "tm" : "te"; }

TEST(MieCylinder, ApproachesRayleighCylinderLimitsAtSmallRadius) {
  // Small-radius limits, derived here from the leading terms of Bohren & Huffman's series (ch. 8;
  // the book states these limits too, but its equation numbers are not checked here):
  //   tm (E along the axis): b_0 = -i pi x^2 (m^2 - 1)/4,        Q_abs = (pi x / 2) Im(m^2),
  //                          Q_sca = (pi^2 x^3 / 8) |m^2 - 1|^2
  //   te (E across):         a_1 = -i pi x^2 (m^2 - 1)/(4(m^2 + 1)), Q_abs = pi x Im[(m^2 - 1)/(m^2 + 1)],
  //                          Q_sca = (pi^2 x^3 / 4) |(m^2 - 1)/(m^2 + 1)|^2
  // i.e. a line dipole of polarizability per length pi a^2 (eps - 1) (tm) or 2 pi a^2 (eps - 1)/(eps + 1)
  // (te, depolarization 1/2). The next terms are O(|m^2| x^2 ln x) relative: a few 1e-5 at x = 1e-3
  // for |m^2| up to ~5, hence 1e-4.
  const double x = 1e-3;
  const cplx indices[] = {{1.5, 0.0}, {1.5, 1.0}, std::sqrt(cplx(-5.0, 2.0))};
  for (cplx m : indices) {
    const cplx m2 = m * m;
    const cplx ratio = (m2 - 1.0) / (m2 + 1.0);
    const MieCylinder tm = mie_cylinder(x, m, CylinderPolarization::tm);
    const MieCylinder te = mie_cylinder(x, m, CylinderPolarization::te);
    const double tm_sca = pi * pi * std::pow(x, 3) / 8 * std::norm(m2 - 1.0);
    const double te_sca = pi * pi * std::pow(x, 3) / 4 * std::norm(ratio);
    SCOPED_TRACE(testing::Message() << "m = " << m);
    std::printf("cylinder x = 1e-3, m = %g%+gi: Q_sca rel. error tm %.2e, te %.2e\n", m.real(), m.imag(),
                relative_error(tm.q_sca, tm_sca), relative_error(te.q_sca, te_sca));
    EXPECT_LT(relative_error(tm.q_sca, tm_sca), 1e-4);
    EXPECT_LT(relative_error(te.q_sca, te_sca), 1e-4);
    EXPECT_LT(std::abs(tm.coefficients[0] / (cplx(0, -pi / 4) * x * x * (m2 - 1.0)) - 1.0), 1e-4);
    EXPECT_LT(std::abs(te.coefficients[1] / (cplx(0, -pi / 4) * x * x * ratio) - 1.0), 1e-4);
    if (m.imag() > 0) {
      const double tm_abs = pi * x / 2 * m2.imag();
      const double te_abs = pi * x * ratio.imag();
      std::printf("cylinder x = 1e-3, m = %g%+gi: Q_abs rel. error tm %.2e, te %.2e\n", m.real(), m.imag(),
                  relative_error(tm.q_abs, tm_abs), relative_error(te.q_abs, te_abs));
      EXPECT_LT(relative_error(tm.q_abs, tm_abs), 1e-4);
      EXPECT_LT(relative_error(te.q_abs, te_abs), 1e-4);
    }
  }
  // Physical units in water: per unit length C_abs = k Im alpha and C_sca = k^3 |alpha|^2 / 4 (tm)
  // or / 8 (te), with alpha = pi a^2 (eps - eps_d)/eps_d or 2 pi a^2 (eps - eps_d)/(eps + eps_d).
  const double n_d = 1.333, wavelength = 600 * units::nm, k = 2 * pi * n_d / wavelength;
  const double radius = x / k, eps_d = n_d * n_d;
  const cplx eps(-5.0, 2.0);
  const cplx alpha_tm = pi * radius * radius * (eps - eps_d) / eps_d;
  const cplx alpha_te = 2 * pi * radius * radius * (eps - eps_d) / (eps + eps_d);
  const auto tm = mie_cylinder_cross_sections(radius, wavelength, eps, CylinderPolarization::tm, n_d);
  const auto te = mie_cylinder_cross_sections(radius, wavelength, eps, CylinderPolarization::te, n_d);
  EXPECT_LT(relative_error(tm.absorption, k * alpha_tm.imag()), 1e-4);
  EXPECT_LT(relative_error(te.absorption, k * alpha_te.imag()), 1e-4);
  EXPECT_LT(relative_error(tm.scattering, std::pow(k, 3) * std::norm(alpha_tm) / 4), 1e-4);
  EXPECT_LT(relative_error(te.scattering, std::pow(k, 3) * std::norm(alpha_te) / 8), 1e-4);
}

TEST(MieCylinder, LosslessCylinderScattersAllItRemovesAndLossyOneAbsorbs) {
  // Energy balance as for the sphere: per order Re c_n >= |c_n|^2, equal when lossless; tolerance
  // 1e-10 relative for rounding over a few hundred terms.
  const double sizes[] = {0.1, 1.0, 5.0, 30.0, 200.0};
  const cplx lossy[] = {{1.5, 0.01}, {1.5, 1.0}, {0.2, 3.0}, {4.0, 0.5}};
  const cplx lossless[] = {{1.33, 0.0}, {0.7, 0.0}, {2.5, 0.0}, {0.0, 2.0}};
  for (CylinderPolarization p : kBoth) {
    for (double x : sizes) {
      for (cplx m : lossy) {
        SCOPED_TRACE(testing::Message() << name(p) << ", m = " << m << ", x = " << x);
        const MieCylinder q = mie_cylinder(x, m, p);
        EXPECT_GT(q.q_abs, 0.0);
        EXPECT_DOUBLE_EQ(q.q_abs, q.q_ext - q.q_sca);
        for (std::size_t n = 0; n < q.coefficients.size(); ++n)
          EXPECT_GE(q.coefficients[n].real() - std::norm(q.coefficients[n]), -1e-12) << "n = " << n;
      }
      for (cplx m : lossless) {
        SCOPED_TRACE(testing::Message() << name(p) << ", m = " << m << ", x = " << x);
        const MieCylinder q = mie_cylinder(x, m, p);
        EXPECT_LT(std::abs(q.q_ext - q.q_sca), 1e-10 * q.q_ext);
      }
    }
  }
}

// --- A second implementation, sharing no code with materials/: Bessel functions from their integral
// representations (Watson, A Treatise on the Theory of Bessel Functions, 1922; DLMF 10.9.2 and
// 10.9.7, equation numbers from memory, checked against <cmath> below), and the textbook
// coefficient ratios summed directly, without logarithmic derivatives.

// Tanh-sinh quadrature over [lo, hi]; converges exponentially for integrands analytic inside.
template <class F>
auto tanh_sinh(const F& f, double lo, double hi) {
  const double h = 1.0 / 32, half = 0.5 * (hi - lo), mid = 0.5 * (hi + lo);
  decltype(f(lo)) sum = 0.0;
  for (int k = -128; k <= 128; ++k) {
    const double s = 0.5 * pi * std::sinh(k * h);
    const double w = 0.5 * pi * std::cosh(k * h) / (std::cosh(s) * std::cosh(s));
    sum += w * f(mid + half * std::tanh(s));
  }
  return sum * (h * half);
}

// J_n(z) = (1/2pi) int_0^2pi cos(n t - z sin t) dt for any integer n and complex z; the trapezoid
// rule on a full period converges exponentially (its error is ~ J_{256-n}(z)).
cplx j_integral(int n, cplx z) {
  constexpr int points = 256;
  cplx sum = 0.0;
  for (int k = 0; k < points; ++k) {
    const double t = 2 * pi * k / points;
    sum += std::cos(static_cast<double>(n) * t - z * std::sin(t));
  }
  return sum / static_cast<double>(points);
}

// Y_n(x) = (1/pi) int_0^pi sin(x sin t - n t) dt - (1/pi) int_0^inf (e^{nt} + (-1)^n e^{-nt}) e^{-x sinh t} dt,
// x > 0; Y_{-n} = (-1)^n Y_n.
double y_integral(int n, double x) {
  if (n < 0) return (n % 2 == 0 ? 1.0 : -1.0) * y_integral(-n, x);
  const double sign = (n % 2 == 0) ? 1.0 : -1.0;
  double end = 1.0;  // the second integrand is below e^-50 beyond this
  while (x * std::sinh(end) - n * end < 50) end += 0.5;
  const double oscillating = tanh_sinh([&](double t) { return std::sin(x * std::sin(t) - n * t); }, 0.0, pi);
  const double decaying = tanh_sinh(
      [&](double t) { return (std::exp(n * t) + sign * std::exp(-n * t)) * std::exp(-x * std::sinh(t)); }, 0.0, end);
  return (oscillating - decaying) / pi;
}

cplx j_prime(int n, cplx z) { return 0.5 * (j_integral(n - 1, z) - j_integral(n + 1, z)); }
double y_prime(int n, double x) { return 0.5 * (y_integral(n - 1, x) - y_integral(n + 1, x)); }

// Bohren & Huffman ch. 8, normal incidence, as printed: b_n (case I, tm) and a_n (case II, te).
cplx direct_coefficient(int n, double x, cplx m, CylinderPolarization p) {
  const double jx = j_integral(n, x).real(), djx = j_prime(n, x).real();
  const cplx h(jx, y_integral(n, x)), dh(djx, y_prime(n, x));
  const cplx jm = j_integral(n, m * x), djm = j_prime(n, m * x);
  if (p == CylinderPolarization::tm) return (jm * djx - m * djm * jx) / (jm * dh - m * djm * h);
  return (m * djx * jm - jx * djm) / (m * jm * dh - djm * h);
}

TEST(MieCylinder, IntegralBesselFunctionsAgreeWithStandardLibraryAtRealArgument) {
  // Guards the second implementation itself: <cmath>'s cyl_bessel_j / cyl_neumann (C++17) at real x.
  for (double x : {0.3, 1.5, 3.0, 7.5}) {
    for (int n = 0; n <= 12; ++n) {
      SCOPED_TRACE(testing::Message() << "n = " << n << ", x = " << x);
      const double j = std::cyl_bessel_j(static_cast<double>(n), x);
      const double y = std::cyl_neumann(static_cast<double>(n), x);
      EXPECT_NEAR(j_integral(n, x).real(), j, 1e-13 + 1e-12 * std::abs(j));
      EXPECT_NEAR(y_integral(n, x), y, 1e-12 * std::max(1.0, std::abs(y)));
    }
  }
}

TEST(MieCylinder, SeriesMatchesDirectSummationWithIndependentBesselFunctions) {
  // Derived here by a second, independent method (above): a dielectric, an absorbing and a
  // metal-like cylinder, both polarizations. Both sides are accurate to ~1e-13, so 1e-9.
  struct Case {
    double x;
    cplx m;
  };
  const Case cases[] = {{3.0, {1.5, 0.0}}, {2.0, {1.5, 0.5}}, {1.5, {0.3, 2.5}}};
  for (CylinderPolarization p : kBoth) {
    for (const Case& c : cases) {
      SCOPED_TRACE(testing::Message() << name(p) << ", m = " << c.m << ", x = " << c.x);
      const MieCylinder q = mie_cylinder(c.x, c.m, p);
      double ext = 0, sca = 0;
      for (int n = 0; n < static_cast<int>(q.coefficients.size()); ++n) {
        const cplx d = direct_coefficient(n, c.x, c.m, p);
        EXPECT_LT(std::abs(q.coefficients[n] - d), 1e-10) << "n = " << n;
        ext += (n == 0 ? 1 : 2) * d.real();
        sca += (n == 0 ? 1 : 2) * std::norm(d);
      }
      std::printf("cylinder %s x = %g, m = %g%+gi: Q_ext %.10f (direct %.10f), Q_sca %.10f (direct %.10f)\n",
                  name(p), c.x, c.m.real(), c.m.imag(), q.q_ext, 2 / c.x * ext, q.q_sca, 2 / c.x * sca);
      EXPECT_LT(relative_error(q.q_ext, 2 / c.x * ext), 1e-9);
      EXPECT_LT(relative_error(q.q_sca, 2 / c.x * sca), 1e-9);
    }
  }
}

TEST(MieCylinder, AbsorptionEqualsPowerDissipatedInside) {
  // Derived here: Q_abs from the field inside, (omega eps0 eps''/2) int |E|^2 dA over the
  // incident intensity and the diameter, with the interior amplitudes fixed by continuity at r = a:
  //   tm: E_z = sum i^n c_n J_n(m k r) e^{in phi},  c_n = [J_n(x) - b_n H_n(x)] / J_n(mx),
  //       Q_abs = pi x eps'' sum_n |c_n|^2 int_0^1 |J_n(mxt)|^2 t dt
  //   te: H_z likewise with d_n = [J_n(x) - a_n H_n(x)] / J_n(mx), E = i curl H / (omega eps0 eps),
  //       Q_abs = pi eps'' / (x |eps|^2) sum_n |d_n|^2 int_0^1 (|mx J_n'(mxt)|^2 + n^2 |J_n(mxt)|^2 / t^2) t dt
  // (sums over n = -inf..inf). This checks the efficiency formulas and the coefficients' sign and
  // normalisation against energy conservation. Nested quadratures, ~1e-12; tolerance 1e-8.
  struct Case {
    double x;
    cplx m;
  };
  const Case cases[] = {{2.0, {1.5, 0.5}}, {1.5, {0.3, 2.5}}};
  for (CylinderPolarization p : kBoth) {
    for (const Case& c : cases) {
      SCOPED_TRACE(testing::Message() << name(p) << ", m = " << c.m << ", x = " << c.x);
      const MieCylinder q = mie_cylinder(c.x, c.m, p);
      const cplx mx = c.m * c.x, eps = c.m * c.m;
      double total = 0;
      for (int n = 0; n < static_cast<int>(q.coefficients.size()); ++n) {
        const cplx h(j_integral(n, c.x).real(), y_integral(n, c.x));
        const cplx inside = (j_integral(n, c.x).real() - q.coefficients[n] * h) / j_integral(n, mx);
        const double radial = tanh_sinh(
            [&](double t) {
              if (t <= 0) return 0.0;  // the integrand vanishes at the axis for every n
              const double jj = std::norm(j_integral(n, mx * t));
              if (p == CylinderPolarization::tm) return jj * t;
              return (std::norm(mx * j_prime(n, mx * t)) + n * n * jj / (t * t)) * t;
            },
            0.0, 1.0);
        total += (n == 0 ? 1 : 2) * std::norm(inside) * radial;
      }
      const double q_abs = (p == CylinderPolarization::tm) ? pi * c.x * eps.imag() * total
                                                           : pi * eps.imag() / (c.x * std::norm(eps)) * total;
      std::printf("cylinder %s x = %g, m = %g%+gi: Q_abs %.10f, from the interior field %.10f\n", name(p), c.x,
                  c.m.real(), c.m.imag(), q.q_abs, q_abs);
      EXPECT_LT(relative_error(q.q_abs, q_abs), 1e-8);
    }
  }
}

TEST(MieCylinder, RefusesIndexWrittenForTheOtherTimeConvention) {
  EXPECT_THROW(mie_cylinder(1.0, {1.5, -0.1}, CylinderPolarization::tm), std::invalid_argument);
  EXPECT_THROW(mie_cylinder(-1.0, 1.5, CylinderPolarization::te), std::invalid_argument);
  EXPECT_THROW(mie_cylinder_cross_sections(50e-9, 500e-9, {-10.0, -1.0}, CylinderPolarization::te),
               std::invalid_argument);
}

}  // namespace
}  // namespace yeegap::materials
