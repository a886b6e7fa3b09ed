// Stability of the pole updates (dispersive.cpp, dispersive_stability.cpp): any damping, as gap cells
// need (physics.md 1.4), and the bound S^2 < eps_d(pi/dt) against a von Neumann analysis of one
// Fourier mode (Taflove & Hagness 2005, ch. 4: a stable scheme's amplification matrix has spectral
// radius <= 1).
#include <gtest/gtest.h>

#include <Eigen/Eigenvalues>
#include <cmath>
#include <complex>
#include <cstdint>

#include "base/constants.h"
#include "base/errors.h"
#include "materials/library.h"
#include "solver/media/dispersive_stability.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;

constexpr double dz = 1e-9;
constexpr int cells = 64;

// The Drude part of Rakic's gold (Appl. Opt. 37, 5271 (1998)): the gap medium of the
// quantum-corrected model keeps the metal's plasma frequency and changes only the damping.
materials::DrudePole gold_drude() { return materials::find_material("Au")->poles.drude.at(0); }

// A fully periodic column filled with one material, dt = 0.99 dz/c, Ex set to a fixed
// pseudo-random pattern so every wavenumber up to the grid's Nyquist one is excited.
Scene periodic_column(const materials::PoleSet& poles, double courant = 0.99) {
  Scene s = testing::vacuum_box({1, 1, cells}, dz, testing::all_edges(EdgeKind::periodic));
  s.materials[0].name = "medium";
  s.materials[0].poles = poles;
  s.domain.time_step = courant * dz / c0;
  return s;
}

void seed_random_field(Simulation& sim) {
  std::uint32_t x = 12345;
  for (int k = 0; k < cells; ++k) {
    x = x * 1664525u + 1013904223u;  // Numerical Recipes' LCG: fixed, platform-independent
    sim.fields().at(Component::Ex, 0, 0, k) = static_cast<real>((x >> 8) / double(1 << 24) - 0.5);
  }
}

// Mean field energy over `window` steps (the energy swaps between E and H within a period).
double mean_energy(Simulation& sim, int window) {
  double sum = 0;
  for (int n = 0; n < window; ++n) {
    sim.step();
    sum += sim.field_energy();
  }
  return sum / window;
}

// Runs 1e5 steps; returns (late mean energy) / (early mean energy).
double energy_growth(Simulation& sim) {
  seed_random_field(sim);
  constexpr int window = 1000;
  const double early = mean_energy(sim, window);
  for (int n = 0; n < 100000 - 2 * window; ++n) sim.step();
  const double late = mean_energy(sim, window);
  EXPECT_TRUE(std::isfinite(late));
  return late / early;
}

double damping_for(double gamma_dt, double courant = 0.99) { return gamma_dt / (courant * dz / c0); }

TEST(DrudeStability, DampingTimesDtOfMillionRunsHundredThousandStepsWithoutGrowth) {
  for (double gamma_dt : {1e6, 1e7}) {
    materials::PoleSet p;
    p.drude.push_back({gold_drude().omega_p, damping_for(gamma_dt)});
    Simulation sim(periodic_column(p));
    const double growth = energy_growth(sim);
    std::printf("gamma dt = %.0e: late/early field energy over 1e5 steps = %.6f\n", gamma_dt, growth);
    // An instability multiplies the energy by orders of magnitude over 1e5 steps; a bounded run
    // keeps it (the medium is nearly transparent at this damping, so it barely decays).
    EXPECT_LT(growth, 1.2) << gamma_dt;
    EXPECT_GT(growth, 0.5) << "nearly lossless at gamma dt = " << gamma_dt;
  }
}

TEST(DrudeStability, PerCellDampingFromZeroToTenMillionOverDtIsStable) {
  materials::PoleSet p;
  p.drude.push_back(gold_drude());
  Simulation sim(periodic_column(p));
  const auto where = sim.dispersive().cells(0);
  ASSERT_EQ(where.size(), 3u * cells);  // Ex, Ey, Ez at every cell of the column
  // gamma dt from 0 through 1e-8 ... 1e7, one value per E location, repeating.
  std::vector<double> damping(where.size());
  for (std::size_t q = 0; q < damping.size(); ++q) {
    const int decade = static_cast<int>(q % 17);
    damping[q] = decade == 0 ? 0.0 : damping_for(std::pow(10.0, decade - 9));
  }
  sim.dispersive().set_drude_damping(0, 0, damping);
  const double growth = energy_growth(sim);
  std::printf("per-cell gamma dt in {0, 1e-8 ... 1e7}: late/early field energy = %.3e\n", growth);
  // Cells with gamma dt near 1 absorb strongly, so the energy must fall, never rise.
  EXPECT_LT(growth, 1.0);
}

// Spectral radius of one Fourier mode of the 1D scheme with one Drude pole, in the variables of
// dispersive.cpp (E, h = eta0 H, Q = dt J/eps0), eps_inf = 1, a = c dt K, K = (2/dz) sin(k dz/2):
//   Q' = alpha Q + beta E;  h' = h - i a E;  E' = E - i a h' - Q'.
double spectral_radius(double a, double wp_dt, double gamma_dt) {
  const double alpha = (1 - gamma_dt / 2) / (1 + gamma_dt / 2), beta = wp_dt * wp_dt / (1 + gamma_dt / 2);
  const std::complex<double> i(0, 1);
  Eigen::Matrix3cd m;
  m << 1 - a * a - beta, -i * a, -alpha,
       -i * a, 1, 0,
       beta, 0, alpha;
  return m.eigenvalues().cwiseAbs().maxCoeff();
}

TEST(DrudeStability, CourantBoundFromNyquistPermittivityIsSharp) {
  // A strong pole, wp dt_c = 1.5 (a test value that puts the bound at S = 0.8 exactly):
  // S^2 < 1 - (wp dt/2)^2  <=>  dt < dt_c / sqrt(1 + (wp dt_c/2)^2) = 0.8 dt_c.
  const double dt_c = dz / c0;
  const double wp = 1.5 / dt_c;
  MaterialSpec m;
  m.name = "strong";
  m.poles.drude.push_back({wp, 0.0});
  const double bound = stable_time_step({m}, dt_c) / dt_c;
  EXPECT_NEAR(bound, 0.8, 1e-9);
  // Von Neumann: below the bound every mode keeps |lambda| <= 1, for any damping; above it the
  // grid's Nyquist mode grows.
  for (double gamma_dt : {0.0, 0.1, 1.0, 1e3, 1e7}) {
    double below = 0, above = 0;
    for (int q = 1; q <= 200; ++q) {
      const double kdz_half = 0.5 * constants::pi * q / 200;  // k dz/2 in (0, pi/2]
      const double s_lo = 0.999 * bound, s_hi = 1.001 * bound;
      below = std::max(below, spectral_radius(2 * s_lo * std::sin(kdz_half), wp * s_lo * dt_c, gamma_dt));
      above = std::max(above, spectral_radius(2 * s_hi * std::sin(kdz_half), wp * s_hi * dt_c, gamma_dt));
    }
    std::printf("gamma dt = %g: spectral radius - 1 = %.3e at 0.999 x bound, %.3e at 1.001 x bound\n", gamma_dt,
                below - 1, above - 1);
    EXPECT_LE(below, 1 + 1e-12) << gamma_dt;
    // Damping weakens the coupling, so the growth above the bound shrinks as gamma dt grows
    // (1e-2 per step undamped, 2e-5 at gamma dt = 1e3), but it is there.
    EXPECT_GT(above, 1 + 1e-10) << gamma_dt;
  }
}

TEST(DrudeStability, RunJustBelowTheBoundStaysBoundedAndJustAboveIsRefused) {
  const double dt_c = dz / c0;
  materials::PoleSet p;
  p.drude.push_back({1.5 / dt_c, 0.0});  // bound S = 0.8, as above; lossless: no damping hides growth
  Simulation sim(periodic_column(p, 0.799));
  const double growth = energy_growth(sim);
  std::printf("S = 0.799 (bound 0.8), lossless strong Drude: late/early field energy = %.4f\n", growth);
  EXPECT_LT(growth, 1.2);
  try {
    Simulation refused(periodic_column(p, 0.801));
    FAIL() << "S = 0.801 is above the bound 0.8 and must be refused";
  } catch (const RunError& e) {
    // The message advises a Courant number just below the bound, and that one must run.
    const std::string msg = e.what();
    const std::string key = "domain.stability_fraction at most ";
    const auto at = msg.find(key);
    ASSERT_NE(at, std::string::npos) << msg;
    const double advised = std::stod(msg.substr(at + key.size()));
    EXPECT_GE(advised, 0.7998) << msg;
    EXPECT_LE(advised, 0.8) << msg;
    Scene ok = periodic_column(p);
    ok.domain.time_step = 0;
    ok.domain.stability_fraction = advised;
    EXPECT_NO_THROW(Simulation accepted(ok));
  }
}

TEST(DrudeStability, UnresolvedLorentzPoleIsRefused) {
  // The central-difference oscillator P'' + w0^2 P is unstable for w0 dt >= 2 (physics.md 3.2).
  const double dt = 0.99 * dz / c0;
  materials::PoleSet p;
  p.lorentz.push_back({0.1, 2.05 / dt, 0.0});
  try {
    Simulation refused(periodic_column(p));
    FAIL() << "omega_0 dt = 2.05 must be refused";
  } catch (const RunError& e) {
    EXPECT_NE(std::string(e.what()).find("omega_0 dt = 2.05"), std::string::npos) << e.what();
  }
}

// Active poles of every kind: no time step makes them stable, so the automatic step search must
// refuse them by name (before, it settled on dt = 0 and check printed a step count of -9.2e18).
// Gain is Im eps < 0 at some frequency (exp(-i omega t), physics.md 0).
TEST(DrudeStability, ActivePolesOfEveryKindAreRefusedWhateverTheStep) {
  materials::PoleSet drude_gain;
  drude_gain.drude.push_back({1.4e16, -1e14});        // negative damping
  materials::PoleSet lorentz_gain;
  lorentz_gain.lorentz.push_back({-2.0, 4e15, 1e14});  // negative strength
  materials::PoleSet critical_gain;
  critical_gain.eps_inf = 2;
  critical_gain.critical_points.push_back({-1.5, 0.5, 4e15, 1e15});  // negative amplitude
  const char* kinds[] = {"Drude", "Lorentz", "critical point"};
  int kind = 0;
  for (const materials::PoleSet& p : {drude_gain, lorentz_gain, critical_gain}) {
    SCOPED_TRACE(kinds[kind++]);
    Scene s = periodic_column(p);
    s.domain.time_step = 0;  // let the program choose: it must find that none works
    try {
      Simulation refused(s);
      FAIL() << "an active pole set must be refused";
    } catch (const RunError& e) {
      const std::string what = e.what();
      EXPECT_NE(what.find("material 'medium' cannot run at any time step"), std::string::npos) << what;
      EXPECT_NE(what.find("gain"), std::string::npos) << what;
    }
  }
}

}  // namespace
}  // namespace yeegap::solver
