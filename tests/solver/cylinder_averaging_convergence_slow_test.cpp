// Convergence of the 2D dielectric cylinder with E across its axis (dielectric_cylinder_run.h; series
// solution of Bohren & Huffman 1983, ch. 8): staircased, diagonal only, whole tensor. Asserted: the
// whole tensor beats the others at every size, with a fitted order of at least 2 over 5-14.14 cells
// per radius (Farjadpour et al. 2006). Measured series: docs/measurements.md.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <vector>

#include "dielectric_cylinder_run.h"
#include "fitted_order.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using materials::CylinderPolarization;
using testing::dielectric_cylinder_rms_error;
using test_support::fitted_order;

TEST(CylinderAveragingConvergence, FullTensorConvergesAtSecondOrderAcrossTheAxis) {
  const std::vector<double> res{5, 7.07, 10, 14.14, 20};
  std::vector<double> stair, diagonal, full;
  for (double n : res) {
    stair.push_back(dielectric_cylinder_rms_error(CylinderPolarization::te, n, false));
    diagonal.push_back(dielectric_cylinder_rms_error(CylinderPolarization::te, n, true, 0.5, false));
    full.push_back(dielectric_cylinder_rms_error(CylinderPolarization::te, n, true));
  }
  const std::vector<double> head(res.begin(), res.begin() + 4);
  auto order_over_head = [&](const std::vector<double>& e) {
    return fitted_order(head, std::vector<double>(e.begin(), e.begin() + 4));
  };
  test_support::MeasuredTable table("docs/measurements.md", "cylinder_across_axis",
                               {"cells per radius", "5", "7.07", "10", "14.14", "20", "fitted order, 5 to 14.14"});
  using Series = std::pair<std::string, const std::vector<double>*>;
  for (const auto& [name, series] :
       std::vector<Series>{{"staircase", &stair}, {"diagonal only", &diagonal}, {"whole tensor", &full}}) {
    std::vector<std::string> row{name};
    for (double e : *series) row.push_back(test_support::significant(100 * e, 3) + " %");
    row.push_back(test_support::fixed(order_over_head(*series), 2));
    table.add_row(row);
  }
  table.check_against_page();
  for (std::size_t i = 0; i < res.size(); ++i) {
    EXPECT_LT(full[i], stair[i]) << res[i];
    EXPECT_LT(full[i], diagonal[i]) << res[i];
  }
  EXPECT_GT(order_over_head(full), 2.0);
}

}  // namespace
}  // namespace yeegap::solver
