// Convergence of a dielectric sphere's scattering (dielectric_sphere_run.h) staircased and averaged,
// against Mie theory (Bohren & Huffman 1983); Farjadpour et al., Opt. Lett. 31, 2972 (2006) expect
// second order with the full tensor. Asserted: the full tensor beats the others at every size, with a
// fitted order above 1.8. Prints the three series (docs/measurements.md).
#include <gtest/gtest.h>

#include <cmath>

#include "dielectric_sphere_run.h"

namespace yeegap::solver {
namespace {

TEST(DielectricSphereConvergence, FullTensorAveragingConvergesAtSecondOrderAndBeatsTheStaircaseEverywhere) {
  const std::vector<double> resolutions{4, 5, 6.25, 8.33, 12.5};
  std::vector<double> plain, diagonal, averaged;
  for (double n : resolutions) {
    plain.push_back(testing::dielectric_sphere_rms_error(n, false));
    diagonal.push_back(testing::dielectric_sphere_rms_error(n, true, /*cross_terms=*/false));
    averaged.push_back(testing::dielectric_sphere_rms_error(n, true));
  }
  std::printf("\n R/cell | staircase RMS %% | diagonal only %% | full tensor %%\n");
  for (std::size_t i = 0; i < resolutions.size(); ++i)
    std::printf(" %6.2f | %8.3f | %8.3f | %8.3f\n", resolutions[i], 100 * plain[i], 100 * diagonal[i],
                100 * averaged[i]);
  auto order = [&](const std::vector<double>& e) {
    double sx = 0, sy = 0, sxx = 0, sxy = 0;
    const double n = static_cast<double>(e.size());
    for (std::size_t i = 0; i < e.size(); ++i) {
      const double x = std::log(resolutions[i]), y = std::log(e[i]);
      sx += x, sy += y, sxx += x * x, sxy += x * y;
    }
    return -(n * sxy - sx * sy) / (n * sxx - sx * sx);
  };
  std::printf("fitted order: staircase %.2f, diagonal %.2f, full %.2f\n", order(plain), order(diagonal),
              order(averaged));
  for (std::size_t i = 0; i < resolutions.size(); ++i) {
    EXPECT_LT(averaged[i], plain[i]) << resolutions[i];
    EXPECT_LT(averaged[i], diagonal[i]) << resolutions[i];
  }
  EXPECT_GT(order(averaged), 1.8);
}

}  // namespace
}  // namespace yeegap::solver
