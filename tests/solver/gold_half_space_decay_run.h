// A dipole above a flat gold half-space in a quarter domain: its total decay rate over 450-800 nm
// from the run beside Sommerfeld's integral for the same permittivity (materials/dipole_half_space.h).
// The gold runs through the lateral absorbers, which take up the surface plasmons it launches.
#pragma once

#include <cmath>
#include <cstdio>
#include <vector>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/dipole_half_space.h"
#include "materials/library.h"
#include "materials/pole_set.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver::testing {

struct HalfSpaceDecay {
  std::vector<double> wavelengths, fdtd, sommerfeld;  // m; P / P0
  long steps = 0;
  std::string stop_reason;
  double worst() const {  // the largest relative deviation, with its sign
    double w = 0;
    for (std::size_t i = 0; i < fdtd.size(); ++i)
      if (std::abs(fdtd[i] / sommerfeld[i] - 1) > std::abs(w)) w = fdtd[i] / sommerfeld[i] - 1;
    return w;
  }
};

/// `step` m; the dipole `height_cells` cells above the gold face (a node plane; gold down to a
/// perfect-conductor bottom 100 nm below), along z (perpendicular) or x; the interior `lateral_nm`
/// from the dipole to the lateral absorbers and `above_nm` up to the top one. The run lasts until
/// the field energy is 1e-10 of its peak: stopped at 1e-7 the 750-800 nm rates rippled by 8 %.
inline HalfSpaceDecay dipole_above_gold(double step, double height_cells, bool perpendicular, bool averaging,
                                        double lateral_nm = 340, double above_nm = 300) {
  using constants::c0;
  using constants::pi;
  const int absorber = 12;
  const int metal_cells = static_cast<int>(std::lround(100e-9 / step));
  const int lateral = static_cast<int>(std::lround(lateral_nm * 1e-9 / step)) + absorber;
  const int nz = metal_cells + static_cast<int>(std::lround(above_nm * 1e-9 / step)) + absorber;
  Scene s = vacuum_box({lateral, lateral, nz}, step, all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = absorber;
  s.domain.center = {0.5 * lateral * step, 0.5 * lateral * step, (0.5 * nz - metal_cells) * step};
  s.domain.edges[0] = perpendicular ? EdgeKind::mirror_even : EdgeKind::mirror_odd;
  s.domain.edges[2] = EdgeKind::mirror_even;
  s.domain.edges[4] = EdgeKind::metal;
  MaterialSpec gold;
  gold.name = "gold";
  gold.poles = materials::find_material("Au")->poles;
  s.materials.push_back(gold);
  s.bodies.push_back({geometry::make_slab(2, -1.0, 0.0), 1, {}});
  DipoleSpec dip;
  dip.position = {0, 0, height_cells * step};
  dip.direction = perpendicular ? Vec3{0, 0, 1} : Vec3{1, 0, 0};
  dip.waveform.omega_min = 2 * pi * c0 / 850e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 420e-9;
  s.dipoles.push_back(dip);
  s.stop.energy_below = 1e-10;
  s.domain.averaging = averaging;
  DecayRateSpec rate;
  rate.name = "rate";
  HalfSpaceDecay out;
  for (double l = 450e-9; l <= 800.1e-9; l += 50e-9) out.wavelengths.push_back(l), rate.omegas.push_back(2 * pi * c0 / l);
  s.decay_rates.push_back(rate);
  Simulation sim(s);
  const RunResults r = sim.run();
  out.fdtd = r.decay_rates.at(0).total;
  out.steps = r.summary.steps;
  out.stop_reason = r.summary.stop_reason;
  for (double l : out.wavelengths) {
    const auto eps = materials::permittivity(gold.poles, 2 * pi * c0 / l);
    const auto ref = materials::dipole_above_half_space(height_cells * step, l, 1.0, eps);
    out.sommerfeld.push_back(perpendicular ? ref.perpendicular : ref.parallel);
  }
  for (std::size_t i = 0; i < out.fdtd.size(); ++i)
    std::printf("%s, h = %g cells of %g nm, %.0f nm: P/P0 = %.4f, Sommerfeld %.4f (%+.2f %%)\n",
                perpendicular ? "perpendicular" : "parallel", height_cells, step * 1e9, out.wavelengths[i] * 1e9,
                out.fdtd[i], out.sommerfeld[i], 100 * (out.fdtd[i] / out.sommerfeld[i] - 1));
  std::printf("  stop %s after %ld steps\n", out.stop_reason.c_str(), out.steps);
  std::fflush(stdout);
  return out;
}

}  // namespace yeegap::solver::testing
