// The time loop's guard against diverging fields (solver/engine/time_loop.cpp): a non-finite value or a
// runaway growth after the sources have ended stops the run within the guard's interval (50 steps,
// 20 with a decay stop), with stop_reason "diverged" and a description of where. The faults are
// injected between two steps through the run's between-steps hook.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <limits>
#include <string>

#include "base/constants.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

constexpr double step = 10e-9;

// A periodic vacuum box (no absorber, so nothing clips the spreading region near the middle).
Scene periodic_box(int cells) {
  Scene s = testing::vacuum_box({cells, cells, cells}, step, testing::all_edges(EdgeKind::periodic));
  s.stop.after = 400 * 0.99 * step / (c0 * std::sqrt(3.0));  // about 400 steps
  return s;
}

// Runs the scene, calling `inject` once when the run has made `at_step` steps.
RunResults run_with_fault(Simulation& sim, long at_step, const std::function<void(Fields&)>& inject) {
  return sim.run({}, [&] {
    if (sim.steps_done() == at_step) inject(sim.fields());
    return false;
  });
}

TEST(DivergenceGuard, NotANumberStopsTheRunWithinFiftyStepsAndNamesWhereItStarted) {
  Simulation sim(periodic_box(120));
  const BlockLayout& L = sim.fields().layout;
  const long at = 10;
  const RunResults r = run_with_fault(sim, at, [&](Fields& f) {
    f.c[2][L.at(60, 50, 70)] = std::numeric_limits<real>::quiet_NaN();
  });
  EXPECT_EQ(r.summary.stop_reason, "diverged");
  EXPECT_GT(r.summary.steps, at);
  EXPECT_LE(r.summary.steps, at + 50);
  // The region spreads one cell per step each way, so its centre is where the value was put.
  EXPECT_NE(r.summary.divergence.find("centred at cell (60, 50, 70)"), std::string::npos) << r.summary.divergence;
  EXPECT_NE(r.summary.divergence.find("in 'vacuum'"), std::string::npos) << r.summary.divergence;
}

TEST(DivergenceGuard, RunawayGrowthAfterTheSourceStopsTheRunAtTheLargestField) {
  Scene s = testing::vacuum_box({40, 40, 40}, step, testing::all_edges(EdgeKind::cpml));
  DipoleSpec dip;
  dip.waveform.omega_min = 2 * pi * c0 / (30 * step);
  dip.waveform.omega_max = 2 * pi * c0 / (12 * step);
  s.dipoles.push_back(dip);
  const double source_end = SourceTime(dip.waveform).end_time();
  s.stop.after = source_end + 400 * 0.99 * step / (c0 * std::sqrt(3.0));  // no decay rule: the 50-step guard
  Simulation sim(s);
  const long at = static_cast<long>(source_end / sim.dt()) + 40;
  const BlockLayout& L = sim.fields().layout;
  double peak = 0;  // field energy, J, sampled every step up to the fault
  const RunResults r = sim.run({}, [&] {
    if (sim.steps_done() < at) peak = std::max(peak, sim.field_energy());
    if (sim.steps_done() == at) {
      // One Ey value holding 1e6 times the run's peak energy: far beyond the guard's factor 1000.
      const double volume = step * step * step;
      sim.fields().c[1][L.at(25, 14, 22)] = static_cast<real>(std::sqrt(2 * 1e6 * peak / (constants::eps0 * volume)));
    }
    return false;
  });
  ASSERT_GT(peak, 0);
  EXPECT_EQ(r.summary.stop_reason, "diverged");
  EXPECT_LE(r.summary.steps, at + 50);
  EXPECT_NE(r.summary.divergence.find("largest field E"), std::string::npos) << r.summary.divergence;
  // The fault spreads to its neighbours within the steps before the guard looks, but a lone E
  // value also holds a static part (its discrete divergence never changes in the Yee scheme), so
  // the largest value stays where it was put.
  EXPECT_NE(r.summary.divergence.find("Ey = "), std::string::npos) << r.summary.divergence;
  EXPECT_NE(r.summary.divergence.find("at cell (25, 14, 22)"), std::string::npos) << r.summary.divergence;
  EXPECT_NE(r.summary.divergence.find("in 'vacuum'"), std::string::npos) << r.summary.divergence;
  std::printf("%s\n", r.summary.divergence.c_str());
}

TEST(DivergenceGuard, ASoundRunIsNotStopped) {
  // The same dipole without a fault decays as usual: the guard does not mistake the field's own
  // ring-down or the sloshing of energy for growth.
  Scene s = testing::vacuum_box({40, 40, 40}, step, testing::all_edges(EdgeKind::cpml));
  DipoleSpec dip;
  dip.waveform.omega_min = 2 * pi * c0 / (30 * step);
  dip.waveform.omega_max = 2 * pi * c0 / (12 * step);
  s.dipoles.push_back(dip);
  s.stop.energy_below = 1e-6;
  const RunResults r = Simulation(s).run();
  EXPECT_EQ(r.summary.stop_reason, "energy_below");
  EXPECT_TRUE(r.summary.divergence.empty());
}

}  // namespace
}  // namespace yeegap::solver
