// A gold sphere (radius 30 nm, Rakic gold in water) at 7.5 cells per radius with subcell averaging
// of the whole tensor (solver/media/subcell_dispersive_cross_terms.h): the plasmon extinction peak
// against Mie theory for the same permittivity model (Bohren & Huffman 1983, ch. 4;
// tests/solver/gold_sphere_run.h). Measured +0.041 % in wavelength and 1.002 of Mie in height;
// the diagonal of the averaged tensor alone gave +1.18 % and 0.937, the staircase +0.32 % and 0.906
// (tests/solver/gold_sphere_convergence_slow_test.cpp has the series). Asserted: within 0.2 % in
// wavelength (a tenth of the 1.5 % the antenna issue allows a staircased run) and 2 % in height
// (the issue allows 5 %).
#include <gtest/gtest.h>

#include <cmath>

#include "gold_sphere_run.h"

namespace yeegap::solver {
namespace {

TEST(GoldSphereAveraged, PeakWithinTwoTenthsOfAPercentOfMieAtSevenAndAHalfCellsPerRadius) {
  const testing::SpherePeak p = testing::gold_sphere_peak(7.5, testing::Averaging::full);
  EXPECT_LT(std::abs(p.wavelength_error()), 0.002);
  EXPECT_NEAR(p.extinction_ratio(), 1.0, 0.02);
}

}  // namespace
}  // namespace yeegap::solver
