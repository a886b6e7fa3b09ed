// Direction quadratures (solver/outputs/sphere_quadrature.h): the n-point Gauss-Legendre rule integrates
// polynomials up to degree 2n - 1 exactly (Abramowitz & Stegun 1964, 25.4.29), so the sphere rule
// gives the exact solid angle and exact moments of the direction, and the cone rule the cap's solid
// angle 2 pi (1 - cos alpha) (elementary geometry).
#include <gtest/gtest.h>

#include <cmath>

#include "base/constants.h"
#include "solver/outputs/sphere_quadrature.h"

namespace yeegap::solver {
namespace {

using constants::pi;

TEST(SphereQuadrature, GaussLegendreIntegratesDegree2nMinus1Exactly) {
  std::vector<double> x, w;
  gauss_legendre(6, x, w);
  for (int p = 0; p <= 11; ++p) {
    double s = 0;
    for (std::size_t i = 0; i < x.size(); ++i) s += w[i] * std::pow(x[i], p);
    const double exact = p % 2 ? 0.0 : 2.0 / (p + 1);
    EXPECT_NEAR(s, exact, 1e-14) << "x^" << p;
  }
}

TEST(SphereQuadrature, SphereRuleGivesFourPiAndTheMomentsOfTheDirection) {
  const DirectionSet s = sphere_directions(8, 18);
  double area = 0, zz = 0, xxyy = 0, x4 = 0;
  for (std::size_t i = 0; i < s.weights.size(); ++i) {
    const Vec3 d = s.directions[i];
    EXPECT_NEAR(norm(d), 1.0, 1e-14);
    area += s.weights[i];
    zz += s.weights[i] * d.z * d.z;
    xxyy += s.weights[i] * d.x * d.x * d.y * d.y;
    x4 += s.weights[i] * std::pow(d.x, 4);
  }
  EXPECT_NEAR(area, 4 * pi, 1e-13);
  EXPECT_NEAR(zz, 4 * pi / 3, 1e-13);       // the integral of z^2 over the unit sphere
  EXPECT_NEAR(xxyy, 4 * pi / 15, 1e-13);    // of x^2 y^2
  EXPECT_NEAR(x4, 4 * pi / 5, 1e-13);       // of x^4
}

TEST(SphereQuadrature, ConeRuleGivesTheCapSolidAngleAboutAnyAxis) {
  const double alpha = 0.7;
  const Vec3 axis{1 / std::sqrt(3.0), -1 / std::sqrt(3.0), 1 / std::sqrt(3.0)};
  const DirectionSet c = cone_directions(axis, alpha, 6, 14);
  double area = 0, along = 0;
  for (std::size_t i = 0; i < c.weights.size(); ++i) {
    area += c.weights[i];
    along += c.weights[i] * dot(c.directions[i], axis);
    EXPECT_GE(dot(c.directions[i], axis), std::cos(alpha) - 1e-14);
  }
  EXPECT_NEAR(area, 2 * pi * (1 - std::cos(alpha)), 1e-13);
  EXPECT_NEAR(along, pi * std::pow(std::sin(alpha), 2), 1e-13);  // integral of cos(theta) over the cap
}

}  // namespace
}  // namespace yeegap::solver
