// Results do not depend on the thread count (DEVELOPERS.md): every cell is written by one thread and
// reductions run in a fixed order, so 1 and 2 threads must agree bit for bit.
#include <gtest/gtest.h>
#include <omp.h>

#include "geometry/shapes.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

RunResults run_with_threads(int threads) {
  const double d = 10e-9;
  Scene s = testing::vacuum_box({40, 40, 40}, d, testing::all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = 8;
  MaterialSpec glass;
  glass.name = "glass";
  glass.poles.eps_inf = 2.25;
  glass.poles.conductivity = 1e4;  // a little loss, so the lossy coefficients run too
  s.materials.push_back(glass);
  s.bodies.push_back({geometry::make_sphere({0, 0, -30e-9}, 60e-9), 1, {}});
  DipoleSpec dip;
  dip.position = {3e-9, -2e-9, 70e-9};
  dip.direction = {1, 0, 1};
  dip.waveform.omega_min = 2e15;
  dip.waveform.omega_max = 5e15;
  s.dipoles.push_back(dip);
  s.probes.push_back({"p", {50e-9, 40e-9, -20e-9}, {Component::Ex, Component::Hz}, {}});
  FluxSpec box;
  box.name = "box";
  box.region = {{-100e-9, -100e-9, -100e-9}, {100e-9, 100e-9, 100e-9}};
  box.omegas = {3e15, 4e15};
  s.fluxes.push_back(box);
  s.stop.after = 400 * 1.9e-17;
  omp_set_num_threads(threads);
  Simulation sim(s);
  RunResults r = sim.run();
  omp_set_num_threads(omp_get_num_procs());
  return r;
}

TEST(ThreadDeterminism, OneAndTwoThreadsGiveBitIdenticalResults) {
  const RunResults one = run_with_threads(1);
  const RunResults two = run_with_threads(2);
  ASSERT_EQ(one.summary.steps, two.summary.steps);
  for (int c = 0; c < 2; ++c) {
    ASSERT_EQ(one.probes[0].values[c].size(), two.probes[0].values[c].size());
    for (std::size_t n = 0; n < one.probes[0].values[c].size(); ++n)
      ASSERT_EQ(one.probes[0].values[c][n], two.probes[0].values[c][n]) << "component " << c << " sample " << n;
  }
  double peak = 0;
  for (double v : one.probes[0].values[0]) peak = std::max(peak, std::abs(v));
  EXPECT_GT(peak, 0) << "the probe must see the field, or the comparison proves nothing";
  for (std::size_t q = 0; q < one.fluxes[0].power.size(); ++q) EXPECT_EQ(one.fluxes[0].power[q], two.fluxes[0].power[q]);
}

}  // namespace
}  // namespace yeegap::solver
