// Conductance per unit area of a planar barrier against the check values of physics.md 1.5-1.7
// (computed there from the textbook formulas) and against Simmons' closed forms. Each assertion
// names its source and its tolerance.
#include <gtest/gtest.h>

#include <cmath>

#include "base/constants.h"
#include "materials/tunnelling_barrier.h"
#include "materials/tunnelling_conductance.h"
#include "materials/tunnelling_model.h"
#include "materials/tunnelling_simmons.h"

namespace yeegap::materials {
namespace {

constexpr double eV = constants::eV;
constexpr double angstrom = 1e-10;
// Au-like jellium of the physics.md 1.6 table: E_F = 5.53 eV, W = 5.1 eV, V0 = 10.63 eV, no image force.
constexpr double fermi = 5.53 * eV, work = 5.1 * eV, height = 10.63 * eV;

double relative(double a, double b) { return std::abs(a - b) / std::abs(b); }

// |value - printed| within half a unit of the printed value's last digit: the value rounds to it.
void expect_rounds_to(double value, double printed, int significant_digits, const char* what, double l_A) {
  const double unit = std::pow(10.0, std::floor(std::log10(std::abs(printed))) - (significant_digits - 1));
  EXPECT_LE(std::abs(value - printed), 0.5 * unit) << what << " at l = " << l_A << " A: " << value << " vs " << printed;
}

double integral_eV(double l) {
  return integrate_transmission([&](double e) { return rectangular_transmission(e, height, l); }, fermi) / eV;
}

TEST(ConductancePrefactor, MatchesTheDerivedValue) {
  // physics.md 1.5 [V-calc]: e^2 m/(2 pi^2 hbar^3) = 1.61831e14 S m^-2 eV^-1, to 1e-5 relative.
  EXPECT_LT(relative(conductance_prefactor() * eV, 1.61831e14), 1e-5);
  // The same number as G0 * m/(2 pi hbar^2) (Landauer form, physics.md 1.5), G0 = 2 e^2/h. CODATA
  // 2018 rounds hbar to 10 digits independently of the exact h, so the two forms agree to ~1e-9.
  const double g0 = 2.0 * constants::e_charge * constants::e_charge / constants::h_planck;
  const double dos = constants::m_e / (2.0 * constants::pi * constants::hbar * constants::hbar);  // J^-1 m^-2
  EXPECT_LT(relative(g0 * dos, conductance_prefactor()), 2e-9);
  // ... and the 2-D density of states per spin quoted there: 2.08866e-2 eV^-1 A^-2.
  EXPECT_LT(relative(dos * eV * angstrom * angstrom, 2.08866e-2), 1e-5);
}

TEST(RectangularBarrier, ReproducesThePhysicsNotesTransmission) {
  // physics.md 1.6 check [V-calc]: V0 = 10.63 eV, E = 5.53 eV, a = 3 A -> T = 3.852e-3, within 0.1 %.
  EXPECT_LT(relative(rectangular_transmission(fermi, height, 3.0 * angstrom), 3.852e-3), 1e-3);
}

TEST(RectangularBarrier, ReproducesThePhysicsNotesConductanceAtFiveAngstrom) {
  // physics.md 1.6 check [V-calc]: G_A(l = 5 A) = 5.488e9 S/m^2 within 0.5 %.
  const double g = conductance_per_area([&](double e) { return rectangular_transmission(e, height, 5 * angstrom); }, fermi);
  EXPECT_LT(relative(g, 5.488e9), 5e-3);
}

struct TableRow {
  double l_A, t_fermi, integral, g_a, wkb, sigma0, gamma;
};

TEST(RectangularBarrier, ReproducesEveryRowOfThePhysicsNotesTable) {
  // physics.md 1.6 table [V-calc] (4000-point midpoint rule there): each value must round to the
  // printed one. gamma_g uses hbar omega_p = 9 eV; "WKB approx" is the Simmons/WKB formula of 1.5.
  const TableRow rows[] = {
      {1, 3.272e-1, 9.042e-1, 1.463e14, 7.05e13, 1.463e4, 1.13e17},
      {2, 3.829e-2, 7.087e-2, 1.147e13, 3.49e12, 2.294e3, 7.22e17},
      {3, 3.852e-3, 5.356e-3, 8.668e11, 2.30e11, 2.600e2, 6.37e18},
      {4, 3.815e-4, 4.190e-4, 6.781e10, 1.70e10, 2.712e1, 6.10e19},
      {5, 3.773e-5, 3.391e-5, 5.488e9, 1.35e9, 2.744e0, 6.03e20},
      {6, 3.730e-6, 2.822e-6, 4.566e8, 1.11e8, 2.740e-1, 6.04e21},
      {8, 3.646e-8, 2.079e-8, 3.364e6, 8.14e5, 2.691e-3, 6.15e23},
      {10, 3.565e-10, 1.623e-10, 2.627e4, 6.37e3, 2.627e-5, 6.30e25},
  };
  const double omega_p = 9.0 * constants::eV_to_rad_per_s;
  for (const TableRow& r : rows) {
    const double l = r.l_A * angstrom;
    const double integral = integral_eV(l);
    const double g_a = conductance_prefactor() * integral * eV;
    expect_rounds_to(rectangular_transmission(fermi, height, l), r.t_fermi, 4, "T(E_F)", r.l_A);
    expect_rounds_to(integral, r.integral, 4, "integral of T", r.l_A);
    expect_rounds_to(g_a, r.g_a, 4, "G_A", r.l_A);
    expect_rounds_to(simmons_conductance_per_area(work, l), r.wkb, 3, "WKB G_A", r.l_A);
    expect_rounds_to(l * g_a, r.sigma0, 4, "sigma0", r.l_A);
    expect_rounds_to(damping_from_conductivity(omega_p, l * g_a), r.gamma, 3, "gamma_g", r.l_A);
  }
}

TEST(TransmissionIntegral, IsConvergedBelowOnePartPerMillion) {
  // Against a 200000-point midpoint rule, whose own error (h^2/24 f''/f ~ 1e-9 here) is far below
  // the 1e-6 asked for; at 1 A, 5 A and 15 A (an integrand rising by e^19 over [0, E_F]).
  for (double l_A : {1.0, 5.0, 15.0}) {
    const double l = l_A * angstrom;
    const int n = 200000;
    double midpoint = 0;
    for (int i = 0; i < n; ++i) midpoint += rectangular_transmission((i + 0.5) * fermi / n, height, l);
    midpoint *= fermi / n / eV;
    EXPECT_LT(relative(integral_eV(l), midpoint), 1e-6) << "l = " << l_A << " A";
  }
}

TEST(RectangularBarrier, ConductanceFallsAboutADecadePerAngstrom) {
  // Common practice (the STM rule of thumb, physics.md 1.3: exp(2 kappa_F 1 A) = 10.1 for W = 5.1 eV):
  // G_A(l)/G_A(l + 1 A) between 5 and 20 for l from 3 to 10 A.
  for (double l_A = 3.0; l_A < 10.0; l_A += 1.0) {
    const double ratio = integral_eV(l_A * angstrom) / integral_eV((l_A + 1.0) * angstrom);
    EXPECT_GT(ratio, 5.0) << "l = " << l_A << " A";
    EXPECT_LT(ratio, 20.0) << "l = " << l_A << " A";
  }
}

TEST(SimmonsFormula, MatchesTheWkbIntegralItLinearises) {
  // Simmons' low-bias formula (J. Appl. Phys. 34, 1793 (1963); physics.md 1.5, 1.7) is the integral
  // of the WKB transmission exp(-2 kappa(E) l) with kappa linearised about E_F. Against that
  // integral, computed numerically for the same rectangular barrier: within 20 % for l > 3 A.
  for (double l_A : {3.5, 5.0, 7.0, 10.0, 15.0}) {
    const double l = l_A * angstrom;
    const BarrierProfile p = rectangular_profile(height, l, 1);
    const double wkb_numeric = conductance_per_area([&](double e) { return wkb_transmission(p, e); }, fermi);
    EXPECT_LT(relative(simmons_conductance_per_area(work, l), wkb_numeric), 0.2) << "l = " << l_A << " A";
  }
}

TEST(SimmonsFormula, UnderestimatesTheExactIntegralByTheThickBarrierPrefactor) {
  // The exact T carries the prefactor 16 E (V0 - E)/V0^2 that WKB drops (Griffiths, Introduction
  // to Quantum Mechanics, 2005, ch. 2, thick-barrier limit of the exact formula): 3.99 at E_F here,
  // so exact integral / Simmons must be that factor within 20 % for l > 3 A (measured 3.90-4.13).
  // physics.md 1.6 notes the factor 2 to 4: Simmons is not within 20 % of the exact integral, and
  // the first assertion shows it.
  const double prefactor = 16.0 * fermi * work / (height * height);
  for (double l_A : {3.5, 5.0, 7.0, 10.0, 15.0}) {
    const double l = l_A * angstrom;
    const double exact = conductance_prefactor() * integral_eV(l) * eV;
    const double ratio = exact / simmons_conductance_per_area(work, l);
    EXPECT_GT(ratio, 2.0) << "l = " << l_A << " A";
    EXPECT_LT(std::abs(ratio / prefactor - 1.0), 0.2) << "l = " << l_A << " A, ratio " << ratio;
  }
}

struct SimmonsRow {
  double s_A, lambda_eV, s1_A, delta_s_A, phi_bar_eV, g_image;
};

TEST(SimmonsImageBarrier, ReproducesThePhysicsNotesTable) {
  // physics.md 1.7 [V-calc], phi0 = 5.1 eV, K = 1; values round to the printed digits. The
  // headline check: phi_bar(s = 10 A) = 2.074 eV within 0.01 eV.
  EXPECT_NEAR(simmons_image_barrier(work, 10 * angstrom, 1.0).mean_height / eV, 2.074, 0.01);
  const SimmonsRow rows[] = {
      {6, 0.832, 1.174, 3.652, 0.657, 3.38e12},
      {8, 0.624, 1.174, 5.652, 1.525, 5.41e10},
      {10, 0.499, 1.174, 7.652, 2.074, 7.42e8},
      {15, 0.333, 1.174, 12.652, 2.863, 1.26e4},
  };
  for (const SimmonsRow& r : rows) {
    const SimmonsBarrier b = simmons_image_barrier(work, r.s_A * angstrom, 1.0);
    EXPECT_FALSE(b.collapsed);
    expect_rounds_to(b.lambda / eV, r.lambda_eV, 3, "lambda", r.s_A);
    expect_rounds_to(b.s1 / angstrom, r.s1_A, 4, "s1", r.s_A);
    expect_rounds_to(b.effective_width / angstrom, r.delta_s_A, r.delta_s_A < 10 ? 4 : 5, "Delta_s", r.s_A);
    expect_rounds_to(b.mean_height / eV, r.phi_bar_eV, r.phi_bar_eV < 1 ? 3 : 4, "phi_bar", r.s_A);
    expect_rounds_to(simmons_conductance_per_area(b.mean_height, b.effective_width), r.g_image, 3, "G_A image",
                     r.s_A);
  }
  // At 5 A the image force closes the barrier (phi_bar = -0.013 eV): no conductance formula.
  const SimmonsBarrier closed = simmons_image_barrier(work, 5 * angstrom, 1.0);
  EXPECT_TRUE(closed.collapsed);
  EXPECT_NEAR(closed.mean_height / eV, -0.013, 0.0005);
  EXPECT_TRUE(std::isnan(simmons_conductance_per_area(closed.mean_height, closed.effective_width)));
}

}  // namespace
}  // namespace yeegap::materials
