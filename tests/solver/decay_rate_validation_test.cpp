// Decay rate and quantum efficiency of a dipole next to a lossless sphere: with no loss all the power
// reaches the far field, so the efficiency is 1 (Novotny & Hecht 2006, sec. 8.5, definitions from
// memory), within 1 % (the issue's). Two independent routes: the total rate from a box one cell
// around the dipole, the radiative one from the far-field transform near the absorbers.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>

#include "base/constants.h"
#include "base/errors.h"
#include "geometry/shapes.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

constexpr double step = 25e-9;

// Vacuum with a sphere of index 2 and radius 6 cells at the origin, and a z dipole 3 cells above
// its top (common-practice test geometry; the numbers are a demo, not a published case).
Scene sphere_scene() {
  Scene s = testing::vacuum_box({64, 64, 64}, step, testing::all_edges(EdgeKind::cpml));
  MaterialSpec glass;
  glass.name = "index2";
  glass.poles.eps_inf = 4.0;
  s.materials.push_back(glass);
  BodySpec sphere;
  sphere.shape = geometry::make_sphere({0, 0, 0}, 6 * step);
  sphere.material = 1;
  s.bodies.push_back(sphere);
  DipoleSpec dip;
  dip.position = {0, 0, 9 * step};
  dip.direction = {0, 0, 1};
  dip.waveform.omega_min = 2 * pi * c0 / (36 * step);
  dip.waveform.omega_max = 2 * pi * c0 / (20 * step);
  s.dipoles.push_back(dip);
  FarFieldSpec far;
  far.name = "far";
  // 24, 28 and 32 cells per wavelength in vacuum (12 to 16 inside the sphere).
  for (double cells : {24.0, 28.0, 32.0}) far.omegas.push_back(2 * pi * c0 / (cells * step));
  s.far_fields.push_back(far);
  DecayRateSpec rate;
  rate.name = "rate";
  rate.radiated = "far";  // frequencies taken from the far field
  s.decay_rates.push_back(rate);
  s.stop.energy_below = 1e-6;
  return s;
}

TEST(DecayRate, LosslessSphereHasQuantumEfficiencyOneWithin1Percent) {
  const RunResults r = Simulation(sphere_scene()).run();
  ASSERT_EQ(r.summary.stop_reason, "energy_below");
  const DecayRateResult& d = r.decay_rates.at(0);
  ASSERT_EQ(d.omegas.size(), 3u);
  ASSERT_EQ(d.efficiency.size(), 3u);
  for (std::size_t q = 0; q < d.omegas.size(); ++q) {
    std::printf("lambda %.0f cells: total %.5f, radiative %.5f, efficiency %.5f\n", 2 * pi * c0 / d.omegas[q] / step,
                d.total[q], d.radiative[q], d.efficiency[q]);
    EXPECT_NEAR(d.efficiency[q], 1.0, 0.01);
    EXPECT_DOUBLE_EQ(d.efficiency[q], d.radiative[q] / d.total[q]);
  }
}

TEST(DecayRate, RefusesABoxThatReachesIntoTheSphere) {
  Scene s = sphere_scene();
  s.decay_rates[0].box_size = 8 * step;  // reaches 4 cells down from the dipole, into the sphere
  s.stop.energy_below = 0;
  s.stop.after = 1e-15;
  EXPECT_THROW(Simulation sim(s), RunError);
}

TEST(DecayRate, RefusesAnUnknownRadiatedOutput) {
  Scene s = sphere_scene();
  s.decay_rates[0].radiated = "nowhere";
  s.stop.energy_below = 0;
  s.stop.after = 1e-15;
  EXPECT_THROW(Simulation sim(s), RunError);
}

}  // namespace
}  // namespace yeegap::solver
