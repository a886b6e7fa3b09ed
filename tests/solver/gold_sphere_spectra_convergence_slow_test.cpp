// The gold sphere's whole spectra as the cells shrink, staircase beside averaging: the small red tail
// (600-800 nm) shows the surface treatment. Asserted: from 10 to 15 cells per radius each averaged
// spectrum's largest error relative to its peak falls, and the staircase at 10 is further from Mie
// than averaging at 10 (why averaging is the recommended setting). Its table is docs/measurements.md's.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "gold_sphere_run.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

struct Errors {
  double of_peak[3] = {0, 0, 0};   // largest |FDTD - Mie| / peak, per quantity
  double tail_local[3] = {0, 0, 0};  // largest (FDTD - Mie) / Mie over 600-800 nm, signed
};

Errors errors(double cells, testing::Averaging a) {
  std::vector<double> lambdas;
  for (double l = 450e-9; l <= 800.1e-9; l += 10e-9) lambdas.push_back(l);
  const testing::SphereSpectra s = testing::gold_sphere_spectra(cells, a, lambdas);
  const std::vector<double>* fdtd[] = {&s.extinction, &s.scattering, &s.absorption};
  const std::vector<double>* mie[] = {&s.mie_extinction, &s.mie_scattering, &s.mie_absorption};
  Errors e;
  for (int q = 0; q < 3; ++q) {
    const double peak = *std::max_element(mie[q]->begin(), mie[q]->end());
    for (std::size_t i = 0; i < lambdas.size(); ++i) {
      const double diff = (*fdtd[q])[i] - (*mie[q])[i];
      e.of_peak[q] = std::max(e.of_peak[q], std::abs(diff) / peak);
      if (lambdas[i] >= 600e-9 && std::abs(diff / (*mie[q])[i]) > std::abs(e.tail_local[q])) e.tail_local[q] = diff / (*mie[q])[i];
    }
  }
  std::printf("R/cell %4.1f %-8s: of the peak ext %.2f %% sca %.2f %% abs %.2f %%; red tail (600-800 nm) local "
              "ext %+.1f %% sca %+.1f %% abs %+.1f %%\n",
              cells, testing::name(a), 100 * e.of_peak[0], 100 * e.of_peak[1], 100 * e.of_peak[2], 100 * e.tail_local[0],
              100 * e.tail_local[1], 100 * e.tail_local[2]);
  std::fflush(stdout);
  return e;
}

TEST(GoldSphereSpectraConvergence, AveragingConvergesAndBeatsTheStaircaseOverTheWholeBand) {
  const Errors staircase10 = errors(10, testing::Averaging::off);
  const Errors averaged10 = errors(10, testing::Averaging::full);
  const Errors averaged15 = errors(15, testing::Averaging::full);
  test_support::MeasuredTable table(
      "docs/measurements.md", "gold_sphere_spectra",
      {"surface, cells per radius", "extinction: largest error / peak", "scattering", "absorption",
       "extinction: red tail, largest error / local value", "scattering", "absorption"});
  for (const auto& [name, e] : std::vector<std::pair<std::string, const Errors*>>{
           {"staircase, 10", &staircase10}, {"whole tensor, 10", &averaged10}, {"whole tensor, 15", &averaged15}}) {
    std::vector<std::string> row{name};
    for (double x : e->of_peak) row.push_back(test_support::fixed(100 * x, 2) + " %");
    for (double x : e->tail_local) row.push_back(test_support::fixed(100 * x, 1, true) + " %");
    table.add_row(row);
  }
  table.check_against_page();
  for (int q = 0; q < 3; ++q) {
    EXPECT_LT(averaged15.of_peak[q], averaged10.of_peak[q]) << q;
    EXPECT_LT(averaged10.of_peak[q], staircase10.of_peak[q]) << q;
  }
}

}  // namespace
}  // namespace yeegap::solver
