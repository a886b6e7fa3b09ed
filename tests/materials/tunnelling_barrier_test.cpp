// Barrier transmission: the profile (log-derivative transfer) method against the exact rectangular
// formula and against a naive amplitude transfer matrix, the limits of the exact formula, WKB, and
// the Simmons image-rounded profile. Sources beside each assertion.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <vector>

#include "base/constants.h"
#include "materials/tunnelling_barrier.h"
#include "materials/tunnelling_conductance.h"

namespace yeegap::materials {
namespace {

constexpr double eV = constants::eV;
constexpr double angstrom = 1e-10;
// Au-like jellium of physics.md 1.6: E_F = 5.53 eV, W = 5.1 eV, V0 = E_F + W.
constexpr double fermi = 5.53 * eV, work = 5.1 * eV, height = 10.63 * eV;

double relative(double a, double b) { return std::abs(a - b) / std::abs(b); }

TEST(TransferMatrix, MatchesExactRectangularFormulaOverEnergiesAndWidths) {
  // Exact formula: Griffiths, Introduction to Quantum Mechanics (2nd ed. 2005), ch. 2, the
  // rectangular-barrier problem (from memory; physics.md 1.6). The profile method is exact for
  // piecewise-constant profiles, so any slab count must agree to 1e-6 relative (measured 2e-13).
  const double energies_eV[] = {0.05, 0.5, 2.0, 5.53, 9.0, 10.6, 10.63, 10.7, 12.0, 20.0, 40.0};
  const double widths_A[] = {0.3, 1.0, 3.0, 5.0, 10.0, 15.0};
  for (int slabs : {1, 7, 400}) {
    for (double w : widths_A) {
      const BarrierProfile p = rectangular_profile(height, w * angstrom, slabs);
      for (double e : energies_eV) {
        const double exact = rectangular_transmission(e * eV, height, w * angstrom);
        EXPECT_LT(relative(profile_transmission(p, e * eV), exact), 1e-6)
            << "E = " << e << " eV, a = " << w << " A, " << slabs << " slabs, exact T = " << exact;
      }
    }
  }
}

TEST(TransferMatrix, StaysAccurateForThickBarriersFarBelowTheTop) {
  // l = 1.5 nm and more, E well below V0: T down to ~1e-60, where (psi, psi') transfer would
  // overflow or lose T in the rounding of R = 1 - T. Exact formula as above (Griffiths 2005).
  for (double w : {15.0, 20.0, 50.0}) {
    const BarrierProfile p = rectangular_profile(height, w * angstrom, 3000);
    for (double e : {0.01, 0.5, 3.0}) {
      const double exact = rectangular_transmission(e * eV, height, w * angstrom);
      ASSERT_GT(exact, 0.0);
      EXPECT_LT(exact, 1e-12);
      EXPECT_LT(relative(profile_transmission(p, e * eV), exact), 1e-6) << "E = " << e << " eV, a = " << w << " A";
    }
  }
}

// An independent reference: amplitude transfer matrices (A, B of A e^{ikz} + B e^{-ikz} in each
// slab, matching psi and psi' at every interface), in complex arithmetic. Correct but unstable for
// thick barriers, so used only on a thin profile. Standard construction (Merzbacher, Quantum
// Mechanics, 3rd ed. 1998, the chapter on sectionally constant potentials).
double naive_transmission(const std::vector<double>& potential, double width, double energy) {
  using cplx = std::complex<double>;
  const double d = width / static_cast<double>(potential.size());
  const auto wavenumber = [&](double v) {
    return std::sqrt(cplx(2.0 * constants::m_e * (energy - v), 0.0)) / constants::hbar;
  };
  // M maps (A, B) on the right of the structure to (A, B) on the left.
  cplx m00 = 1, m01 = 0, m10 = 0, m11 = 1;
  std::vector<double> layers = potential;
  layers.push_back(0.0);  // the right metal
  double z = 0;
  cplx k_left = wavenumber(0.0);
  for (double v : layers) {
    const cplx k_right = wavenumber(v);
    // Interface at z: (A_l e^{i k_l z} + B_l e^{-i k_l z}) = same with k_r, and derivatives.
    const cplx el = std::exp(cplx(0, 1) * k_left * z), er = std::exp(cplx(0, 1) * k_right * z);
    const cplx r = k_right / k_left;
    const cplx a00 = 0.5 * (1.0 + r) * er / el, a01 = 0.5 * (1.0 - r) / (er * el);
    const cplx a10 = 0.5 * (1.0 - r) * er * el, a11 = 0.5 * (1.0 + r) * el / er;
    const cplx n00 = m00 * a00 + m01 * a10, n01 = m00 * a01 + m01 * a11;
    const cplx n10 = m10 * a00 + m11 * a10, n11 = m10 * a01 + m11 * a11;
    m00 = n00, m01 = n01, m10 = n10, m11 = n11;
    k_left = k_right;
    z += d;
  }
  // Right: (t, 0); left: (1, r) => t = 1/m00; same k on both sides.
  return 1.0 / std::norm(m00);
}

TEST(TransferMatrix, AgreesWithNaiveAmplitudeMatricesOnAStepProfile) {
  // A thin irregular profile with wells (V < E) and barriers: both methods are exact for it.
  const std::vector<double> potential = {3.0 * eV, 8.0 * eV, 12.0 * eV, 0.5 * eV, 6.0 * eV, 11.0 * eV};
  const BarrierProfile p{3.0 * angstrom, potential};
  for (double e : {0.3, 2.0, 4.0, 5.53, 7.0, 11.5, 14.0}) {
    const double reference = naive_transmission(potential, p.width, e * eV);
    EXPECT_LT(relative(profile_transmission(p, e * eV), reference), 1e-9) << "E = " << e << " eV";
  }
}

TEST(RectangularBarrier, ReachesTheTextbookValueAtTheBarrierTop) {
  // E = V0: T = [1 + m V0 a^2/(2 hbar^2)]^-1 (Griffiths 2005, rectangular-barrier problem;
  // physics.md 1.6).
  const double a = 3.0 * angstrom;
  const double at_top = 1.0 / (1.0 + constants::m_e * height * a * a / (2.0 * constants::hbar * constants::hbar));
  EXPECT_LT(relative(rectangular_transmission(height, height, a), at_top), 1e-12);
  // ... and the formulas below and above the top join it continuously.
  EXPECT_LT(relative(rectangular_transmission(height * (1 - 1e-9), height, a), at_top), 1e-7);
  EXPECT_LT(relative(rectangular_transmission(height * (1 + 1e-9), height, a), at_top), 1e-7);
}

TEST(RectangularBarrier, IsTransparentAtResonancesAboveTheTop) {
  // Above V0, T = 1 whenever q a = n pi (Griffiths 2005, ch. 2, the transmission resonances).
  const double a = 5.0 * angstrom;
  for (int n = 1; n <= 3; ++n) {
    const double q = n * constants::pi / a;
    const double e = height + constants::hbar * constants::hbar * q * q / (2.0 * constants::m_e);
    EXPECT_NEAR(rectangular_transmission(e, height, a), 1.0, 1e-12) << "n = " << n;
    // Half-way between resonances the barrier reflects: the test above is not trivially 1.
    const double q_mid = (n + 0.5) * constants::pi / a;
    const double e_mid = height + constants::hbar * constants::hbar * q_mid * q_mid / (2.0 * constants::m_e);
    EXPECT_LT(rectangular_transmission(e_mid, height, a), 0.999) << "n = " << n;
  }
}

TEST(Wkb, MissesOnlyThePrefactorOfTheExactResultForThickBarriers) {
  // Thick-barrier limit of the exact formula: T -> 16 E (V0 - E)/V0^2 exp(-2 q a) (Griffiths 2005,
  // rectangular-barrier problem; Merzbacher 1998), and exp(-2 q a) is WKB for a rectangular barrier.
  // At q a > 15 the neglected terms are below exp(-30): tolerance 1e-6.
  const double a = 15.0 * angstrom;
  const BarrierProfile p = rectangular_profile(height, a, 1);
  for (double e : {1.0, 3.0, 5.53, 8.0}) {
    const double prefactor = 16.0 * e * eV * (height - e * eV) / (height * height);
    EXPECT_LT(relative(rectangular_transmission(e * eV, height, a) / wkb_transmission(p, e * eV), prefactor), 1e-6)
        << "E = " << e << " eV";
  }
}

TEST(ImageRoundedProfile, FollowsSimmonsFormulaClampedAtTheBandBottom) {
  // phi(x) = W - 1.15 lambda s^2/(x (s - x)), lambda = e^2 ln2/(8 pi K eps0 s)
  // (Simmons, J. Appl. Phys. 34, 1793 (1963); physics.md 1.7: lambda = 4.9905/(K s[A]) eV).
  const double s = 10.0 * angstrom;
  const BarrierProfile p = image_rounded_profile(fermi, work, s, 1.0, 0.01 * angstrom);
  ASSERT_EQ(p.potential.size(), 1000u);
  const double lambda = 4.9905 / 10.0 * eV;
  double top = 0;
  for (size_t i = 0; i < p.potential.size(); ++i) {
    const double x = (i + 0.5) * 0.01 * angstrom;
    const double expected = std::max(0.0, fermi + work - 1.15 * lambda * s * s / (x * (s - x)));
    EXPECT_NEAR(p.potential[i], expected, 1e-4 * eV) << "x = " << x / angstrom << " A";
    EXPECT_NEAR(p.potential[i], p.potential[p.potential.size() - 1 - i], 1e-12 * eV);  // symmetric gap
    top = std::max(top, p.potential[i]);
  }
  // Clamped next to each surface, and the top lowered by 4.6 lambda (x = s/2) below E_F + W.
  EXPECT_EQ(p.potential.front(), 0.0);
  EXPECT_NEAR(top, fermi + work - 4.6 * lambda, 1e-3 * eV);
}

TEST(ImageRoundedProfile, LetsMoreCurrentThroughThanTheRectangularBarrier) {
  // The image force only lowers and thins the barrier (Simmons 1963), so G_A must rise, by orders
  // of magnitude near 1 nm (physics.md 1.7 table: 7.42e8 vs 6.37e3 S/m^2 in Simmons' approximation).
  for (double w : {6.0, 8.0, 10.0}) {
    const BarrierProfile image = image_rounded_profile(fermi, work, w * angstrom, 1.0, 0.01 * angstrom);
    const double g_image = conductance_per_area([&](double e) { return profile_transmission(image, e); }, fermi);
    const double g_rect =
        conductance_per_area([&](double e) { return rectangular_transmission(e, height, w * angstrom); }, fermi);
    EXPECT_GT(g_image, 10.0 * g_rect) << "l = " << w << " A";
  }
}

TEST(ImageRoundedProfile, ConductanceConvergesAsSlabsThin) {
  // Midpoint sampling of a smooth profile: error O(h^2). Halving 0.01 A slabs must change G_A by
  // less than 1e-4 relative (measured about 1.4e-5), and the change must shrink on a further halving.
  const double w = 8.0 * angstrom;
  auto g = [&](double slab) {
    const BarrierProfile p = image_rounded_profile(fermi, work, w, 1.0, slab);
    return conductance_per_area([&](double e) { return profile_transmission(p, e); }, fermi);
  };
  const double g1 = g(0.02 * angstrom), g2 = g(0.01 * angstrom), g3 = g(0.005 * angstrom);
  EXPECT_LT(relative(g2, g3), 1e-4);
  EXPECT_LT(relative(g2, g3), relative(g1, g2));
}

}  // namespace
}  // namespace yeegap::materials
