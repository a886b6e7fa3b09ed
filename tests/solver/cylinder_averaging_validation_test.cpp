// Subcell averaging on a curved surface, in 2D: a dielectric cylinder (dielectric_cylinder_run.h)
// against the series solution (Bohren & Huffman 1983, ch. 8). Tolerances: E along the axis within
// 0.1 % at 5 cells per radius; E across it within 0.1 % at 10, and the off-diagonal terms at least
// ten times better than the diagonal alone there. Measured: docs/measurements.md.
#include <gtest/gtest.h>

#include "dielectric_cylinder_run.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using materials::CylinderPolarization;
using testing::dielectric_cylinder_rms_error;

TEST(CylinderAveraging, AxisParallelFieldIsExactAtFiveCellsPerRadius) {
  const double on = dielectric_cylinder_rms_error(CylinderPolarization::tm, 5, true);
  const double off = dielectric_cylinder_rms_error(CylinderPolarization::tm, 5, false);
  test_support::check_figure_against_page("README.md", "cylinder_averaging_along",
                                          test_support::significant(100 * on, 2) + " % (staircase " +
                                              test_support::significant(100 * off, 2) + " %)");
  EXPECT_LT(on, 0.001);
  EXPECT_GT(off, 0.001);  // the staircase misses it: the check discriminates
}

TEST(CylinderAveraging, CrossFieldErrorIsBelowTheStaircase) {
  std::string figure;
  for (double cells : {5.0, 10.0}) {
    const double on = dielectric_cylinder_rms_error(CylinderPolarization::te, cells, true);
    const double off = dielectric_cylinder_rms_error(CylinderPolarization::te, cells, false);
    EXPECT_LT(on, off) << cells;
    figure += (figure.empty() ? "" : "; ") + test_support::significant(100 * on, 2) + " % at " +
              test_support::fixed(cells, 0) + " (staircase " + test_support::significant(100 * off, 2) + " %)";
  }
  test_support::check_figure_against_page("README.md", "cylinder_averaging_across", figure);
}

TEST(CylinderAveraging, OffDiagonalTermsMakeTheCrossFieldAccurateAtTenCellsPerRadius) {
  const double full = dielectric_cylinder_rms_error(CylinderPolarization::te, 10, true);
  const double diagonal = dielectric_cylinder_rms_error(CylinderPolarization::te, 10, true, 0.5, /*cross_terms=*/false);
  test_support::check_figure_against_page("README.md", "cylinder_averaging_diagonal_alone",
                                          test_support::significant(100 * diagonal, 3) + " %");
  EXPECT_LT(full, 0.001);
  EXPECT_LT(10 * full, diagonal);
}

}  // namespace
}  // namespace yeegap::solver
