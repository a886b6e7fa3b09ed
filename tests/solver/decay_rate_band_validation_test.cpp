// Decay rate of a dipole above a perfect mirror over the whole band, in whole, half and quarter domains
// (symmetry planes through the dipole), at heights down to 2 cells, against image theory (physics.md
// 4.6; Novotny & Hecht 2006, ch. 8, form from memory). Tolerance 2 % at every frequency (the issue's),
// part of which the grid's own dipole takes (docs/measurements.md).
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "base/constants.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

constexpr double step = 25e-9;
constexpr int lateral = 64, vertical = 40;  // cells of the whole domain

enum class Cut { whole, half, quarter };
const char* cut_name(Cut c) { return c == Cut::whole ? "whole" : c == Cut::half ? "half" : "quarter"; }

double perpendicular(double u) { return 1 + 3 * (std::sin(u) / (u * u * u) - std::cos(u) / (u * u)); }
double parallel(double u) {
  return 1 - 1.5 * (std::sin(u) / u + std::cos(u) / (u * u) - std::sin(u) / (u * u * u));
}

// The metal face is z = 0; the dipole at (0, 0, h). Planes through the dipole: x = 0 for a half
// domain, x = 0 and y = 0 for a quarter, with the parity the dipole has (docs/scene.md).
DecayRateResult run(Vec3 direction, double h, Cut cut) {
  Scene s = testing::vacuum_box({lateral, lateral, vertical}, step, testing::all_edges(EdgeKind::cpml));
  s.domain.center = {0, 0, 0.5 * vertical * step};
  s.domain.edges[4] = EdgeKind::metal;
  const bool along_x = direction[0] != 0;
  if (cut != Cut::whole) {
    s.domain.size[0] *= 0.5;
    s.domain.center[0] = 0.25 * lateral * step;
    s.domain.edges[0] = along_x ? EdgeKind::mirror_odd : EdgeKind::mirror_even;
  }
  if (cut == Cut::quarter) {
    s.domain.size[1] *= 0.5;
    s.domain.center[1] = 0.25 * lateral * step;
    s.domain.edges[2] = EdgeKind::mirror_even;
  }
  DipoleSpec dip;
  dip.position = {0, 0, h};
  dip.direction = direction;
  dip.waveform.omega_min = 2 * pi * c0 / (60 * step);
  dip.waveform.omega_max = 2 * pi * c0 / (18 * step);
  s.dipoles.push_back(dip);
  DecayRateSpec rate;
  rate.name = "rate";
  for (int cells : {20, 24, 30, 36, 44, 52}) rate.omegas.push_back(2 * pi * c0 / (cells * step));
  s.decay_rates.push_back(rate);
  s.stop.energy_below = 1e-7;
  const RunResults r = Simulation(s).run();
  EXPECT_EQ(r.summary.stop_reason, "energy_below");
  return r.decay_rates.at(0);
}

// Returns the lowest and highest P/P0 over image theory, minus 1.
std::pair<double, double> expect_image_theory(Vec3 direction, double h_cells, Cut cut) {
  const double h = h_cells * step;
  const bool perp = direction[2] != 0;
  const DecayRateResult r = run(direction, h, cut);
  EXPECT_EQ(r.total.size(), 6u);
  std::pair<double, double> range{1e300, -1e300};
  for (std::size_t q = 0; q < r.omegas.size(); ++q) {
    const double u = 2 * (r.omegas[q] / c0) * h, expected = perp ? perpendicular(u) : parallel(u);
    std::printf("%s %s h = %.1f cells, lambda = %.0f cells: P/P0 = %.5f, image theory %.5f (%+.2f %%)\n",
                perp ? "perpendicular" : "parallel", cut_name(cut), h_cells, 2 * pi * c0 / r.omegas[q] / step,
                r.total[q], expected, 100 * (r.total[q] / expected - 1));
    EXPECT_NEAR(r.total[q] / expected, 1.0, 0.02) << cut_name(cut) << " at lambda = " << 2 * pi * c0 / r.omegas[q] / step
                                                  << " cells";
    range = {std::min(range.first, r.total[q] / expected - 1), std::max(range.second, r.total[q] / expected - 1)};
  }
  return range;
}

// docs/measurements.md quotes each case's range over the band and its heights.
void quote_range(const std::string& name, std::vector<std::pair<double, double>> ranges) {
  double low = 1e300, high = -1e300;
  for (const auto& [a, b] : ranges) low = std::min(low, a), high = std::max(high, b);
  test_support::check_figure_against_page("docs/measurements.md", name,
                                          test_support::fixed(100 * low, 2, true) + " to " +
                                              test_support::fixed(100 * high, 2, true) + " %");
}

TEST(DecayRateBand, ParallelDipoleInQuarterDomainMatchesImageTheoryOverTheBand) {
  quote_range("decay_rate_band_parallel_quarter", {expect_image_theory({1, 0, 0}, 2.0, Cut::quarter),
                                   expect_image_theory({1, 0, 0}, 5.0, Cut::quarter)});
}
TEST(DecayRateBand, ParallelDipoleInHalfDomainMatchesImageTheoryOverTheBand) {
  quote_range("decay_rate_band_parallel_half", {expect_image_theory({1, 0, 0}, 2.0, Cut::half),
                                expect_image_theory({1, 0, 0}, 5.0, Cut::half)});
}
TEST(DecayRateBand, ParallelDipoleInWholeDomainMatchesImageTheoryOverTheBand) {
  quote_range("decay_rate_band_parallel_whole", {expect_image_theory({1, 0, 0}, 2.0, Cut::whole)});
}
TEST(DecayRateBand, PerpendicularDipoleInQuarterDomainMatchesImageTheoryOverTheBand) {
  quote_range("decay_rate_band_perpendicular_quarter", {expect_image_theory({0, 0, 1}, 2.5, Cut::quarter),
                                       expect_image_theory({0, 0, 1}, 5.5, Cut::quarter)});
}
TEST(DecayRateBand, PerpendicularDipoleInHalfDomainMatchesImageTheoryOverTheBand) {
  quote_range("decay_rate_band_perpendicular_half", {expect_image_theory({0, 0, 1}, 2.5, Cut::half)});
}
TEST(DecayRateBand, PerpendicularDipoleInWholeDomainMatchesImageTheoryOverTheBand) {
  quote_range("decay_rate_band_perpendicular_whole", {expect_image_theory({0, 0, 1}, 2.5, Cut::whole)});
}

}  // namespace
}  // namespace yeegap::solver
