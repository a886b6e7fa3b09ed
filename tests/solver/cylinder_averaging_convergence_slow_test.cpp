// Convergence of the 2D dielectric cylinder with E across its axis (dielectric_cylinder_run.h; series
// solution of Bohren & Huffman 1983, ch. 8): staircased, diagonal only, whole tensor. Asserted: the
// whole tensor beats the others at every size, with a fitted order of at least 2 over 5-14.14 cells
// per radius (Farjadpour et al. 2006). Measured series: docs/measurements.md.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <vector>

#include "dielectric_cylinder_run.h"

namespace yeegap::solver {
namespace {

using materials::CylinderPolarization;
using testing::dielectric_cylinder_rms_error;

double fitted_order(const std::vector<double>& x, const std::vector<double>& e) {
  double sx = 0, sy = 0, sxx = 0, sxy = 0;
  const double n = static_cast<double>(e.size());
  for (std::size_t i = 0; i < e.size(); ++i) {
    const double lx = std::log(x[i]), ly = std::log(e[i]);
    sx += lx, sy += ly, sxx += lx * lx, sxy += lx * ly;
  }
  return -(n * sxy - sx * sy) / (n * sxx - sx * sx);
}

TEST(CylinderAveragingConvergence, FullTensorConvergesAtSecondOrderAcrossTheAxis) {
  const std::vector<double> res{5, 7.07, 10, 14.14, 20};
  std::vector<double> stair, diagonal, full;
  for (double n : res) {
    stair.push_back(dielectric_cylinder_rms_error(CylinderPolarization::te, n, false));
    diagonal.push_back(dielectric_cylinder_rms_error(CylinderPolarization::te, n, true, 0.5, false));
    full.push_back(dielectric_cylinder_rms_error(CylinderPolarization::te, n, true));
  }
  std::printf("\n R/cell | staircase %% | diagonal %% | full %%\n");
  for (std::size_t i = 0; i < res.size(); ++i)
    std::printf(" %6.2f | %8.3f | %8.3f | %8.3f\n", res[i], 100 * stair[i], 100 * diagonal[i], 100 * full[i]);
  const std::vector<double> head(res.begin(), res.begin() + 4), full_head(full.begin(), full.begin() + 4);
  std::printf("fitted order: diagonal %.2f (all), full %.2f (5-14.14)\n", fitted_order(res, diagonal),
              fitted_order(head, full_head));
  for (std::size_t i = 0; i < res.size(); ++i) {
    EXPECT_LT(full[i], stair[i]) << res[i];
    EXPECT_LT(full[i], diagonal[i]) << res[i];
  }
  EXPECT_GT(fitted_order(head, full_head), 2.0);
}

}  // namespace
}  // namespace yeegap::solver
