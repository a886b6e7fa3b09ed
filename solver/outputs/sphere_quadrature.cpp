// Direction quadratures (see sphere_quadrature.h). Gauss-Legendre nodes by Newton's method on
// P_n from the Chebyshev-like start cos(pi (i + 3/4) / (n + 1/2)) (Numerical Recipes, sec. 4.6).
#include "solver/outputs/sphere_quadrature.h"

#include <algorithm>
#include <cmath>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::solver {

void gauss_legendre(int n, std::vector<double>& x, std::vector<double>& w) {
  YG_CHECK(n >= 1, "a Gauss-Legendre rule needs at least one node");
  x.assign(n, 0.0);
  w.assign(n, 0.0);
  for (int i = 0; i < (n + 1) / 2; ++i) {
    double z = std::cos(constants::pi * (i + 0.75) / (n + 0.5));
    double dp = 0;
    for (int iter = 0; iter < 100; ++iter) {
      // P_n(z) by the three-term recurrence, and its derivative from P_n and P_{n-1}.
      double p1 = 1, p2 = 0;
      for (int j = 1; j <= n; ++j) {
        const double p3 = p2;
        p2 = p1;
        p1 = ((2.0 * j - 1) * z * p2 - (j - 1.0) * p3) / j;
      }
      dp = n * (z * p1 - p2) / (z * z - 1);
      const double dz = p1 / dp;
      z -= dz;
      if (std::abs(dz) < 1e-15) break;
    }
    x[i] = -z;
    x[n - 1 - i] = z;
    w[i] = w[n - 1 - i] = 2.0 / ((1 - z * z) * dp * dp);
  }
}

namespace {

// Two unit vectors completing `axis` to a right-handed frame.
void frame(const Vec3& axis, Vec3& e1, Vec3& e2) {
  const Vec3 helper = std::abs(axis.z) < 0.9 ? Vec3{0, 0, 1} : Vec3{1, 0, 0};
  const Vec3 t = cross(helper, axis);
  e1 = (1.0 / norm(t)) * t;
  e2 = cross(axis, e1);
}

DirectionSet polar_rule(const Vec3& axis, double mu_min, int n_theta, int n_phi) {
  YG_CHECK(n_phi >= 1 && mu_min < 1, "a direction rule needs phi steps and a cone of positive size");
  Vec3 e1, e2;
  frame(axis, e1, e2);
  std::vector<double> x, w;
  gauss_legendre(n_theta, x, w);
  DirectionSet s;
  const double half = 0.5 * (1 - mu_min), mid = 0.5 * (1 + mu_min), dphi = 2 * constants::pi / n_phi;
  for (int i = 0; i < n_theta; ++i) {
    const double mu = mid + half * x[i], st = std::sqrt(std::max(0.0, 1 - mu * mu));
    for (int j = 0; j < n_phi; ++j) {
      const double phi = (j + 0.5) * dphi;
      s.directions.push_back(mu * axis + st * std::cos(phi) * e1 + st * std::sin(phi) * e2);
      s.weights.push_back(half * w[i] * dphi);
    }
  }
  return s;
}

}  // namespace

DirectionSet sphere_directions(int n_theta, int n_phi) { return polar_rule({0, 0, 1}, -1.0, n_theta, n_phi); }

DirectionSet cone_directions(const Vec3& axis, double half_angle, int n_theta, int n_phi) {
  YG_CHECK(half_angle > 0 && half_angle <= constants::pi, "a cone's half angle lies in (0, pi]");
  return polar_rule(axis, std::cos(half_angle), n_theta, n_phi);
}

}  // namespace yeegap::solver
