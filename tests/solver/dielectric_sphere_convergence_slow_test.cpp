// Convergence of a dielectric sphere's scattering (dielectric_sphere_run.h) staircased and averaged,
// against Mie theory (Bohren & Huffman 1983); Farjadpour et al., Opt. Lett. 31, 2972 (2006) expect
// second order with the full tensor. Asserted: the full tensor beats the others at every size, with a
// fitted order above 1.8. Its table of the three series is
// docs/measurements.md's.
#include <gtest/gtest.h>

#include <cmath>

#include "dielectric_sphere_run.h"
#include "fitted_order.h"
#include "measured_table.h"

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
  auto order = [&](const std::vector<double>& e) { return test_support::fitted_order(resolutions, e); };
  test_support::MeasuredTable table("docs/measurements.md", "dielectric_sphere",
                               {"cells per radius", "4", "5", "6.25", "8.33", "12.5", "fitted order"});
  for (const auto& [name, series] :
       std::vector<std::pair<std::string, const std::vector<double>*>>{
           {"staircase", &plain}, {"diagonal only", &diagonal}, {"whole tensor", &averaged}}) {
    std::vector<std::string> row{name};
    for (double e : *series) row.push_back(test_support::significant(100 * e, 3) + " %");
    row.push_back(test_support::fixed(order(*series), 2));
    table.add_row(row);
  }
  table.check_against_page();
  for (std::size_t i = 0; i < resolutions.size(); ++i) {
    EXPECT_LT(averaged[i], plain[i]) << resolutions[i];
    EXPECT_LT(averaged[i], diagonal[i]) << resolutions[i];
  }
  EXPECT_GT(order(averaged), 1.8);
}

}  // namespace
}  // namespace yeegap::solver
