// The half-space dipole reference (dipole_half_space.h) against the closed forms it must reach (Novotny
// & Hecht 2006, ch. 8 and sec. 10.5; physics.md 4.6): image theory for a perfect conductor, a metal of
// very large |eps| tending to it, and close to a lossy surface the quasi-static term
// P_perp / P0 -> (3/8) Im[(eps - 1)/(eps + 1)] / (k h)^3, P_par half of it.
#include "materials/dipole_half_space.h"

#include <cmath>

#include <gtest/gtest.h>

namespace yeegap::materials {
namespace {

constexpr double pi = 3.14159265358979323846;

double image_perpendicular(double u) { return 1 + 3 * (std::sin(u) / (u * u * u) - std::cos(u) / (u * u)); }
double image_parallel(double u) { return 1 - 1.5 * (std::sin(u) / u + std::cos(u) / (u * u) - std::sin(u) / (u * u * u)); }

TEST(DipoleHalfSpace, PerfectConductorIntegralIsImageTheory) {
  const double wavelength = 600e-9;
  for (double u : {0.2, 0.7, 1.5, 3.0, 7.0, 15.0}) {
    const double h = u / (2 * 2 * pi / wavelength);
    const HalfSpaceRates r = dipole_above_perfect_mirror_by_integral(h, wavelength, 1.0);
    EXPECT_NEAR(r.perpendicular, image_perpendicular(u), 1e-8 * std::max(1.0, image_perpendicular(u))) << u;
    EXPECT_NEAR(r.parallel, image_parallel(u), 1e-8) << u;
  }
}

TEST(DipoleHalfSpace, AVeryGoodConductorTendsToTheMirror) {
  const double wavelength = 600e-9, u = 1.5, h = u / (2 * 2 * pi / wavelength);
  const HalfSpaceRates r = dipole_above_half_space(h, wavelength, 1.0, {-1e6, 1e3});
  EXPECT_NEAR(r.perpendicular, image_perpendicular(u), 5e-3);
  EXPECT_NEAR(r.parallel, image_parallel(u), 5e-3);
}

TEST(DipoleHalfSpace, CloseToALossyMetalTheQuasiStaticTermRules) {
  const double wavelength = 600e-9, k = 2 * pi / wavelength;
  const std::complex<double> eps(-15, 1.2);
  const double beta = ((eps - 1.0) / (eps + 1.0)).imag();
  for (double h : {0.5e-9, 1e-9}) {
    const HalfSpaceRates r = dipole_above_half_space(h, wavelength, 1.0, eps);
    const double quasi = 3 * beta / (8 * std::pow(k * h, 3));
    EXPECT_NEAR(r.perpendicular / quasi, 1.0, 2e-3) << h;
    EXPECT_NEAR(r.parallel / (0.5 * quasi), 1.0, 2e-3) << h;
  }
}

TEST(DipoleHalfSpace, GainIsRefused) {
  EXPECT_THROW(dipole_above_half_space(10e-9, 600e-9, 1.0, {-15, -1}), std::invalid_argument);
}

}  // namespace
}  // namespace yeegap::materials
