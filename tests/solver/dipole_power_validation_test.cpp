// A point dipole in vacuum radiates the Hertzian-dipole (Larmor) power
//   P = eta0 k^2 |I l|^2 / (12 pi)     (peak phasors; Jackson, Classical Electrodynamics, 3rd ed.,
//   1999, eq. 9.24; Balanis, Antenna Theory, 3rd ed., 2005, eq. 4-18),
// measured here as the flux through a closed box around it, from running DFTs of the fields and
// of the source current. The tolerance: 2 % at 20 or more cells per wavelength.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "base/constants.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

TEST(DipolePower, FluxThroughClosedBoxMatchesLarmorWithin2Percent) {
  const double d = 25e-9;
  Scene s = testing::vacuum_box({64, 64, 64}, d, testing::all_edges(EdgeKind::cpml));
  DipoleSpec dip;
  dip.direction = {0, 0, 1};
  dip.waveform.omega_min = 2 * pi * c0 / 900e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 400e-9;
  s.dipoles.push_back(dip);
  FluxSpec box;
  box.name = "box";
  box.region = {{-250e-9, -250e-9, -250e-9}, {250e-9, 250e-9, 250e-9}};
  // 20, 24 and 28 cells per wavelength.
  for (double lambda : {500e-9, 600e-9, 700e-9}) box.omegas.push_back(2 * pi * c0 / lambda);
  s.fluxes.push_back(box);
  s.stop.energy_below = 1e-6;
  Simulation sim(s);
  const RunResults r = sim.run();
  ASSERT_EQ(r.summary.stop_reason, "energy_below");
  std::string figure;
  for (std::size_t q = 0; q < box.omegas.size(); ++q) {
    const double k = box.omegas[q] / c0;
    // Source spectra are listed over the union of all output frequencies, in ascending order.
    const auto at = std::find(r.source_omegas.begin(), r.source_omegas.end(), box.omegas[q]);
    ASSERT_NE(at, r.source_omegas.end());
    const double il = std::abs(r.source_spectra[0][at - r.source_omegas.begin()]);
    const double larmor = constants::eta0 * k * k * il * il / (12 * pi);
    const double ratio = r.fluxes[0].power[q] / larmor;
    std::printf("lambda = %.0f nm (%.0f cells): P_flux / P_Larmor = %.5f\n", 2 * pi / k * 1e9, 2 * pi / k / d, ratio);
    figure += (q ? ", " : "") + test_support::fixed(100 * (ratio - 1), 2, true) + " % (" +
              test_support::fixed(2 * pi / k / d, 0) + (q ? ")" : " cells/λ)");
    EXPECT_NEAR(ratio, 1.0, 0.02);
  }
  test_support::check_figure_against_page("README.md", "dipole_power_larmor", figure);
}

}  // namespace
}  // namespace yeegap::solver
