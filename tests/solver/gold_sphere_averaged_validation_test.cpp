// A gold sphere (radius 30 nm, Rakic gold in water) at 7.5 cells per radius with the whole averaged
// tensor: the plasmon peak against Mie theory (Bohren & Huffman 1983, ch. 4) within 0.2 % in wavelength
// (a tenth of a staircased run's allowance) and 2 % in height (the issue allows 5 %). Measured, with
// the staircase and the diagonal alone beside it: docs/measurements.md.
#include <gtest/gtest.h>

#include <cmath>

#include "gold_sphere_run.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

TEST(GoldSphereAveraged, PeakWithinTwoTenthsOfAPercentOfMieAtSevenAndAHalfCellsPerRadius) {
  const testing::SpherePeak p = testing::gold_sphere_peak(7.5, testing::Averaging::full);
  test_support::check_figure_against_page("README.md", "gold_sphere_averaged",
                                          test_support::fixed(100 * p.wavelength_error(), 3, true) + " %, height " +
                                              test_support::fixed(p.extinction_ratio(), 3) + " of Mie");
  EXPECT_LT(std::abs(p.wavelength_error()), 0.002);
  EXPECT_NEAR(p.extinction_ratio(), 1.0, 0.02);
}

}  // namespace
}  // namespace yeegap::solver
