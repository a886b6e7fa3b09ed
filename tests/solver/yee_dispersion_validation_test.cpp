// A free plane standing wave in a periodic box oscillates at the frequency given by the Yee
// scheme's discrete dispersion relation (Taflove & Hagness, Computational Electrodynamics, 3rd ed.,
// 2005, ch. 4, eq. 4.12):  [sin(w dt/2)/(c dt)]^2 = sum_a [sin(k_a d_a/2)/d_a]^2.
#include <gtest/gtest.h>

#include <cmath>

#include "base/constants.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

double yee_omega(std::array<double, 3> k, double d, double dt) {
  double s = 0;
  for (double ka : k) s += std::pow(std::sin(ka * d / 2) / d, 2);
  return 2.0 / dt * std::asin(c0 * dt * std::sqrt(s));
}

struct Case {
  std::array<int, 3> cells;
  std::array<int, 3> wavenumbers;  // k_a = 2 pi m_a / L_a
};

double measured_omega(const Case& c, double step, double& dt_out, std::array<double, 3>& k) {
  Scene s = testing::vacuum_box(c.cells, step, testing::all_edges(EdgeKind::periodic));
  s.domain.stability_fraction = 0.9;
  for (int a = 0; a < 3; ++a) k[a] = 2 * pi * c.wavenumbers[a] / (c.cells[a] * step);
  Simulation sim(s);
  // E along z, k in the xy plane: Ez = cos(k . r) at the Ez locations, H = 0.
  auto& f = sim.fields();
  const Grid& g = sim.grid();
  for (int kk = 0; kk < g.n[2]; ++kk)
    for (int j = 0; j < g.n[1]; ++j)
      for (int i = 0; i < g.n[0]; ++i) {
        const Vec3 p = yee_position(g, Component::Ez, i, j, kk);
        f.at(Component::Ez, i, j, kk) = static_cast<real>(std::cos(k[0] * p.x + k[1] * p.y));
      }
  std::vector<double> x;
  for (int n = 0; n < 4000; ++n) {
    sim.step();
    x.push_back(f.at(Component::Ez, 0, 0, 0));
  }
  dt_out = sim.dt();
  return testing::recurrence_omega(x, sim.dt());
}

TEST(YeeDispersion, AxialStandingWaveFollowsDiscreteRelation) {
  const double d = 10e-9;
  double dt;
  std::array<double, 3> k;
  // 10 cells per wavelength along x: the Yee phase error is about 1 %, far above the tolerance.
  const double w = measured_omega({{10, 1, 1}, {1, 0, 0}}, d, dt, k);
  const double expected = yee_omega(k, d, dt);
  EXPECT_NEAR(w / expected, 1.0, 1e-4);
  EXPECT_GT(std::abs(w / (c0 * k[0]) - 1.0), 1e-3) << "the test must tell the grid from the continuum";
}

TEST(YeeDispersion, ObliqueStandingWaveFollowsDiscreteRelation) {
  const double d = 10e-9;
  double dt;
  std::array<double, 3> k;
  const double w = measured_omega({{12, 8, 1}, {1, 1, 0}}, d, dt, k);
  const double expected = yee_omega(k, d, dt);
  EXPECT_NEAR(w / expected, 1.0, 1e-4);
  EXPECT_GT(std::abs(w / (c0 * std::hypot(k[0], k[1])) - 1.0), 1e-3);
}

}  // namespace
}  // namespace yeegap::solver
