// A weakly damped Drude metal whose surface runs through two absorbing layers that meet (an absorber
// corner) grows there after the pulse (docs/reliability.md row 50: a surface wave near 5 eV, about
// 80 steps a period here, doubling every 400 steps). The run must stop as "diverged", naming the
// layers, while the growth is still small beside the pulse; the same scene with gold (whose
// interband loss damps that wave) must ring down and stop as "energy_below". Numbers invented for the test.
#include <gtest/gtest.h>

#include <cstdio>
#include <string>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/library.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

constexpr double hbar_ev = 6.582119569e-16;  // eV s (CODATA 2018)

// A quarter domain, 200 x 200 x 260 nm at 5 nm: mirror planes through a z dipole 10 nm above the
// metal, whose surface is 1 nm below a node plane (its topmost E location is Ez: the unstable case).
Scene corner_scene(const materials::PoleSet& metal_poles) {
  const double step = 5e-9;
  const int lateral = 40, metal_cells = 20, vacuum_cells = 20, absorber = 12;
  const int nz = metal_cells + vacuum_cells + absorber;
  Scene s = testing::vacuum_box({lateral, lateral, nz}, step, testing::all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = absorber;
  s.domain.center = {0.5 * lateral * step, 0.5 * lateral * step, (0.5 * nz - metal_cells) * step};
  s.domain.edges[0] = s.domain.edges[2] = EdgeKind::mirror_even;
  s.domain.edges[4] = EdgeKind::metal;
  MaterialSpec metal;
  metal.name = "metal";
  metal.poles = metal_poles;
  s.materials.push_back(metal);
  s.bodies.push_back({geometry::make_slab(2, -1.0, -1e-9), 1, {}});
  DipoleSpec dip;
  dip.position = {0, 0, 10e-9};
  dip.waveform.omega_min = 2 * pi * c0 / 850e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 420e-9;
  s.dipoles.push_back(dip);
  s.stop.energy_below = 1e-5;
  s.stop.max_steps = 12000;
  return s;
}

TEST(AbsorberCornerGrowth, WeaklyDampedDrudeStopsAsDivergedWhileTheGrowthIsSmall) {
  materials::PoleSet drude;
  drude.drude.push_back({9.0 / hbar_ev, 0.1 / hbar_ev});
  Simulation sim(corner_scene(drude));
  const RunResults r = sim.run();
  std::printf("stopped at step %ld (%s), field energy %.3g of its peak\n", r.summary.steps, r.summary.stop_reason.c_str(),
              r.summary.final_energy_fraction);
  EXPECT_EQ(r.summary.stop_reason, "diverged");
  // Caught while the growing wave holds under a tenth of the pulse's peak field energy (the runaway
  // check, at 1000 times the peak, would stop it about 2000 steps later).
  EXPECT_LT(r.summary.final_energy_fraction, 0.1);
  EXPECT_NE(r.summary.divergence.find("inside the absorbing layers of x and y"), std::string::npos)
      << r.summary.divergence;
}

TEST(AbsorberCornerGrowth, GoldRingsDownUntouched) {
  const materials::LibraryEntry* au = materials::find_material("Au");
  ASSERT_NE(au, nullptr);
  Simulation sim(corner_scene(au->poles));
  const RunResults r = sim.run();
  EXPECT_EQ(r.summary.stop_reason, "energy_below");
}

}  // namespace
}  // namespace yeegap::solver
