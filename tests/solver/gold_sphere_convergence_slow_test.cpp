// Convergence of the gold-sphere plasmon peak with the cell size (gold_sphere_run.h): staircased,
// diagonal average only and whole tensor, against Mie theory (Bohren & Huffman 1983). Asserted:
// averaged at 10 cells per radius beats the staircase at 20; the whole tensor beats the diagonal at
// every size, peak extinction within 1 % of Mie. Its table of the series is
// docs/measurements.md's.
#include <gtest/gtest.h>

#include <cmath>

#include "gold_sphere_run.h"
#include "measured_table.h"

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
  test_support::MeasuredTable table("docs/measurements.md", "gold_sphere_peak",
                                    {"cells per radius", "5", "7.5", "10", "15", "20"});
  for (const auto& [name, series] :
       std::vector<std::pair<std::string, const std::vector<testing::SpherePeak>*>>{
           {"staircase", &plain}, {"diagonal only", &diagonal}, {"whole tensor", &full}}) {
    std::vector<std::string> peak{name + ": peak"}, height{name + ": height"};
    for (const auto& p : *series) {
      peak.push_back(test_support::fixed(100 * p.wavelength_error(), 3, true) + " %");
      height.push_back(test_support::fixed(p.extinction_ratio(), 3));
    }
    table.add_row(peak);
    table.add_row(height);
  }
  table.check_against_page();
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
