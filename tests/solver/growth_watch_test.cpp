// GrowthWatch (solver/engine/growth_watch.h) on made-up energy histories: a decay with deep dips (a
// resonance trading field and polarization energy) passes, a rebound from a small seed trips it,
// round-off noise near zero does not.
#include <gtest/gtest.h>

#include <cmath>

#include "base/constants.h"
#include "solver/engine/growth_watch.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

constexpr long window = 400, every = 20;

TEST(GrowthWatch, DecayingResonanceWithDeepDipsPasses) {
  GrowthWatch w(window);
  for (long n = 0; n < 20000; n += every) {
    // Field energy of a ringing mode: cos^2 dips to zero twice a period (period 300 steps).
    const double c = std::cos(2 * constants::pi * n / 300.0);
    EXPECT_FALSE(w.add(n, std::exp(-n / 3000.0) * c * c, 1.0)) << "step " << n;
  }
}

TEST(GrowthWatch, GrowthFromASmallSeedTripsBeforeItReachesThePeak) {
  GrowthWatch w(window);
  long tripped = -1;
  for (long n = 0; n < 20000 && tripped < 0; n += every) {
    const double pulse = std::exp(-n / 200.0);         // the pulse leaving the domain
    const double seed = 1e-6 * std::exp(n / 1000.0);  // an unstable mode, doubling every 700 steps
    if (w.add(n, pulse + seed, 1.0)) tripped = n;
  }
  ASSERT_GT(tripped, 0);
  // The sum is lowest, about 1.6e-5, near step 2600; 100 times that is reached near step 7400,
  // with the mode at 1.6e-3 of the peak.
  EXPECT_LT(tripped, 8000);
  EXPECT_LT(1e-6 * std::exp(tripped / 1000.0), 1e-2);
}

TEST(GrowthWatch, NoiseFarBelowThePeakIsIgnored) {
  GrowthWatch w(window);
  for (long n = 0; n < 20000; n += every) {
    // Round-off level: jumps by 1e4 between 1e-16 and 1e-12 of the peak.
    const double e = (n / 1000) % 2 ? 1e-12 : 1e-16;
    EXPECT_FALSE(w.add(n, e, 1.0)) << "step " << n;
  }
}

TEST(GrowthWatch, WindowSpansTwoPeriodsOfTheLowestSourceFrequency) {
  Scene s = testing::vacuum_box({10, 10, 10}, 10e-9, testing::all_edges(EdgeKind::cpml));
  const double dt = 1e-17;
  EXPECT_EQ(growth_window_steps(s, dt), 400);  // no source: the minimum
  DipoleSpec d;
  d.waveform.omega_min = 2 * constants::pi * 1e13;  // 10 THz: a period is 1e4 steps
  d.waveform.omega_max = 2 * constants::pi * 2e13;
  s.dipoles.push_back(d);
  EXPECT_NEAR(growth_window_steps(s, dt), 20000, 1);
}

}  // namespace
}  // namespace yeegap::solver
