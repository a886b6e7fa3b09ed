// Convergence of the gold-sphere plasmon peak with the cell size: staircased, averaged with the
// diagonal of the Farjadpour et al. (Opt. Lett. 31, 2972 (2006)) tensor only, and averaged with the
// whole tensor (solver/media/subcell_dispersive_cross_terms.h), against Mie theory for the same
// permittivity model (tests/solver/gold_sphere_run.h: radius 30 nm Rakic gold in water, Bohren &
// Huffman 1983). The geometry issue's check is asserted: the averaged peak-wavelength error at
// R/cell = 10 below the staircase's at R/cell = 20.
// Measured (R/cell 5, 7.5, 10, 15, 20; all three series 5.8 min on 2 idle cores):
//   staircase  +1.59 +0.32 +0.57 +0.38 +0.23 %, extinction 0.972 0.906 0.947 0.966 0.972 of Mie
//   diagonal   +1.25 +1.18 +0.73 +0.46 +0.23 %, extinction 0.906 0.937 0.959 0.968 0.972 (first order)
//   full       +0.137 +0.041 +0.008 -0.052 -0.091 %, extinction 1.002 1.002 1.003 1.002 1.000
// The full tensor's error crosses zero near R/cell 10 and settles at a few 0.01 % below: a floor set
// by the domain, not the surface (at R/cell 20 it is -0.059 % with 16 absorbing cells and -0.041 %
// with 32, the absorber then further from the sphere's near field); the sphere's centre on a node
// instead of half a cell above changes the full series by at most 0.012 %.
// Also asserted: the full tensor's peak error is below the diagonal's at every resolution, and its
// peak extinction within 1 % of Mie at every resolution (the antenna issue asks 5 %).
#include <gtest/gtest.h>

#include <cmath>

#include "gold_sphere_run.h"

namespace yeegap::solver {
namespace {

using testing::Averaging;

TEST(GoldSphereConvergence, FullTensorAtTenCellsPerRadiusBeatsTheStaircaseAtTwenty) {
  const std::vector<double> resolutions{5, 7.5, 10, 15, 20};
  std::vector<testing::SpherePeak> plain, diagonal, full;
  for (double n : resolutions) {
    plain.push_back(testing::gold_sphere_peak(n, Averaging::off));
    diagonal.push_back(testing::gold_sphere_peak(n, Averaging::diagonal));
    full.push_back(testing::gold_sphere_peak(n, Averaging::full));
  }
  std::printf("\n R/cell | peak error %%, extinction/Mie:  staircase | diagonal only | full tensor\n");
  for (std::size_t i = 0; i < resolutions.size(); ++i)
    std::printf(" %6.1f | %+8.3f %.4f | %+8.3f %.4f | %+8.3f %.4f\n", resolutions[i], 100 * plain[i].wavelength_error(),
                plain[i].extinction_ratio(), 100 * diagonal[i].wavelength_error(), diagonal[i].extinction_ratio(),
                100 * full[i].wavelength_error(), full[i].extinction_ratio());
  const double averaged_at_10 = std::abs(full[2].wavelength_error()), staircase_at_20 = std::abs(plain[4].wavelength_error());
  std::printf("issue check, averaged error at R/cell 10 (%.3f %%) below staircase at 20 (%.3f %%)\n",
              100 * averaged_at_10, 100 * staircase_at_20);
  EXPECT_LT(averaged_at_10, staircase_at_20);
  for (std::size_t i = 0; i < resolutions.size(); ++i) {
    EXPECT_LT(std::abs(full[i].wavelength_error()), std::abs(diagonal[i].wavelength_error())) << resolutions[i];
    EXPECT_NEAR(full[i].extinction_ratio(), 1.0, 0.01) << resolutions[i];
  }
}

}  // namespace
}  // namespace yeegap::solver
