// The quantum-corrected-model check at its cheapest (full series: drude_dimer_gap_slow_test.cpp): the
// 2D Drude dimer of Esteban et al., Nat. Commun. 3, 825 (2012) at gaps of 0.5 and 0.15 nm on 1 nm
// cells. Asserted (thresholds from drude_dimer_2d.h, docs/gaps.md): the classical peak redshifts; at
// 0.15 nm the quantum-corrected bonding peak is gone and a charge-transfer peak sits below it.
#include <gtest/gtest.h>

#include <future>

#include "drude_dimer_2d.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using testing::DimerSettings;
using testing::DimerSpectrum;
using testing::Peak;

constexpr double nm = 1e-9;

DimerSettings coarse(double gap, bool quantum) {
  DimerSettings o;
  o.gap = gap;
  o.quantum = quantum;
  o.cell = 1 * nm;         // 10 cells per radius: peaks shift by a few per cent, the trends stay
  o.axis_cell = 0.25 * nm;
  o.count = 221;           // 0.02 eV apart
  o.energy_below = 1e-4;
  return o;
}

std::array<DimerSpectrum, 2> run_pair(double gap) {
  auto c = std::async(std::launch::async, [gap] { return testing::run_dimer(coarse(gap, false)); });
  DimerSpectrum q = testing::run_dimer(coarse(gap, true));
  return {c.get(), q};
}

TEST(DrudeDimerGap, ConductingGapReplacesTheBondingPeakByAChargeTransferPeak) {
  const double R = 10 * nm, wide = 0.5 * nm, narrow = 0.15 * nm;
  const auto [c_wide, q_wide] = run_pair(wide);
  const auto [c_narrow, q_narrow] = run_pair(narrow);
  testing::print_spectrum("classical, gap 0.50 nm", c_wide);
  testing::print_spectrum("quantum-corrected, gap 0.50 nm", q_wide);
  testing::print_spectrum("classical, gap 0.15 nm", c_narrow);
  testing::print_spectrum("quantum-corrected, gap 0.15 nm", q_narrow);

  // (a) Classical bonding peaks: near the quasi-static n = 1 mode of two cylinders (bipolar
  // coordinates, derived in drude_dimer_2d.h) within 8 % (10 cells per radius), and the narrow gap's
  // lies lower by more than half the quasi-static shift (3.81 -> 2.60 eV).
  const double e_wide = testing::bonding_mode_eV(R, wide, 1), e_narrow = testing::bonding_mode_eV(R, narrow, 1);
  const Peak b_wide = testing::strongest_peak_near(c_wide, e_wide, 0.15 * e_wide);
  const Peak b_narrow = testing::strongest_peak_near(c_narrow, e_narrow, 0.15 * e_narrow);
  std::printf("classical bonding peak: %.3f eV (quasi-static %.3f) at 0.5 nm, %.3f eV (%.3f) at 0.15 nm\n",
              b_wide.energy_eV, e_wide, b_narrow.energy_eV, e_narrow);
  ASSERT_GT(b_wide.height, 0);
  ASSERT_GT(b_narrow.height, 0);
  EXPECT_NEAR(b_wide.energy_eV / e_wide, 1.0, 0.08);
  EXPECT_NEAR(b_narrow.energy_eV / e_narrow, 1.0, 0.08);
  EXPECT_LT(b_narrow.energy_eV, b_wide.energy_eV - 0.5 * (e_wide - e_narrow));

  // The two regimes, from the gap permittivity at each bonding energy: 0.5 nm lies above every
  // threshold (the gap cannot weaken the peak by more than a few per cent), 0.15 nm below every one.
  const testing::GapThresholds th_wide = testing::gap_thresholds(b_wide.energy_eV);
  const testing::GapThresholds th_narrow = testing::gap_thresholds(b_narrow.energy_eV);
  std::printf("thresholds at %.2f / %.2f eV: weakening %.3f / %.3f nm, lossy %.3f / %.3f nm, conducting %.3f / %.3f nm\n",
              b_wide.energy_eV, b_narrow.energy_eV, th_wide.weakening / nm, th_narrow.weakening / nm,
              th_wide.lossy / nm, th_narrow.lossy / nm, th_wide.conducting / nm, th_narrow.conducting / nm);
  ASSERT_GT(wide, th_wide.weakening);
  ASSERT_LT(narrow, th_narrow.conducting);

  // (b) At 0.5 nm the quantum-corrected gap barely conducts: the same bonding peak, within a fifth
  // of a linewidth (0.02 eV), keeping at least the bound's share of its height (0.972 at 0.5 nm;
  // less 0.02 for the sampling of the peak).
  const Peak q_b_wide = testing::peak_near(q_wide, b_wide.energy_eV, 0.15);
  std::printf("quantum-corrected bonding peak at 0.5 nm: %.3f eV, height ratio %.3f (bound %.3f)\n",
              q_b_wide.energy_eV, q_b_wide.height / b_wide.height, testing::height_bound(wide));
  EXPECT_NEAR(q_b_wide.energy_eV, b_wide.energy_eV, 0.02);
  EXPECT_GT(q_b_wide.height / b_wide.height, testing::height_bound(wide) - 0.02);
  // At 0.15 nm it is gone: within 0.15 eV of the classical peak the quantum-corrected extinction
  // stays below half the classical peak (below the lossy width the gap's loss rate exceeds the
  // metal's own, which alone would halve the height; docs/gaps.md).
  const double ratio = testing::largest_extinction_near(q_narrow, b_narrow.energy_eV, 0.15) / b_narrow.height;
  std::printf("quantum-corrected within 0.15 eV of the classical peak, 0.15 nm: at most %.3f of it\n", ratio);
  EXPECT_LT(ratio, 0.5);

  // (c) The charge-transfer peak: a maximum of the quantum-corrected spectrum more than 0.3 eV below
  // the classical bonding peak, at least three times the classical extinction at its energy and at
  // least 5 % of the classical bonding peak; the non-conducting 0.5 nm gap has none.
  const Peak t_narrow = testing::charge_transfer_peak(q_narrow, c_narrow, b_narrow);
  const Peak t_wide = testing::charge_transfer_peak(q_wide, c_wide, b_wide);
  std::printf("charge-transfer peak at 0.15 nm: %.3f eV, %.2f nm (%.3f of the classical bonding peak)\n",
              t_narrow.energy_eV, t_narrow.height / nm, t_narrow.height / b_narrow.height);
  using test_support::fixed;
  test_support::check_figure_against_page(
      "docs/gaps.md", "dimer_cheap_check",
      "classical bonding peak " + fixed(b_wide.energy_eV, 3) + " eV at 0.5 nm (quasi-static " + fixed(e_wide, 3) +
          ") and " + fixed(b_narrow.energy_eV, 3) + " eV at 0.15 nm (" + fixed(e_narrow, 3) +
          "); quantum-corrected at 0.5 nm " + fixed(q_b_wide.height / b_wide.height, 3) +
          " of the classical height (bound " + fixed(testing::height_bound(wide), 3) + "); at 0.15 nm at most " +
          fixed(ratio, 3) + " of it within 0.15 eV of the classical peak; charge-transfer peak at " +
          fixed(t_narrow.energy_eV, 3) + " eV, " + fixed(t_narrow.height / nm, 2) + " nm (" +
          fixed(t_narrow.height / b_narrow.height, 3) + " of the classical bonding peak)");
  EXPECT_GT(t_narrow.height, 0) << "no charge-transfer peak at 0.15 nm";
  EXPECT_EQ(t_wide.height, 0) << "a charge-transfer peak at 0.5 nm, " << t_wide.energy_eV << " eV";
}

}  // namespace
}  // namespace yeegap::solver
