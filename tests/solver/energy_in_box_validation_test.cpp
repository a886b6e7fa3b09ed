// The energy-in-a-box output against a sheet of current in vacuum (a dipole in a grid with two
// invariant axes): each side carries away E = eta0 K(t - |z|/c) / 2, from the jump of tangential H
// across a surface current, n x (H2 - H1) = K (Jackson, Classical Electrodynamics, 3rd ed., 1999,
// sec. I.5, from memory), with E = eta0 H in each outgoing wave; so once the pulse is over the box holds
// W = A (eta0 / 2) int K(t)^2 dt with K = I l / A over the cell's cross-section A, split equally
// between electric and magnetic energy as in any plane wave (Jackson, Classical Electrodynamics,
// 3rd ed., 1999, sec. 7.1), and constant while the pulse is inside (Poynting's theorem).
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstring>

#include "base/constants.h"
#include "solver/engine/simulation.h"
#include "solver/engine/simulation_state.h"
#include "solver/sources/waveform.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

const std::vector<double>& values(const Record& r, const char* name) {
  const Quantity* q = r.find(name);
  EXPECT_NE(q, nullptr) << name;
  return std::get<std::vector<double>>(q->values);
}

const double d = 5e-9;  // cell size

/// A sheet of x-directed current at z = 0 (a dipole in a grid with invariant x and y), pulsed over
/// 400-1000 nm (80 cells per wavelength at the short end), and an energy box |z| <= box_half.
Scene current_sheet(int cells, double box_half) {
  Scene s = testing::vacuum_box({1, 1, cells}, d,
                                {EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic,
                                 EdgeKind::cpml, EdgeKind::cpml});
  DipoleSpec dip;
  dip.direction = {1, 0, 0};
  dip.moment = 1e-30;
  dip.waveform.omega_min = 2 * pi * c0 / 1000e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 400e-9;
  s.dipoles.push_back(dip);
  EnergySpec box;
  box.name = "slab";
  box.region = {{-1, -1, -box_half}, {1, 1, box_half}};
  s.energies.push_back(box);
  return s;
}

TEST(EnergyInBox, CurrentSheetPulseHoldsTheRadiatedEnergyHalfElectricHalfMagnetic) {
  Scene s = current_sheet(4000, 7e-6);
  const DipoleSpec& dip = s.dipoles[0];
  const SourceTime pulse(dip.waveform);
  s.stop.after = pulse.end_time() + 4e-15;
  Simulation sim(s);
  const RunResults r = sim.run();
  ASSERT_EQ(r.records.size(), 1u);
  const Record& e = r.records[0];
  EXPECT_EQ(e.kind, "energy");
  const auto &t = values(e, "time"), &electric = values(e, "electric"), &magnetic = values(e, "magnetic"),
             &total = values(e, "total"), &th = values(e, "magnetic_time");
  ASSERT_GT(t.size(), 100u);
  ASSERT_EQ(th.size(), t.size());
  EXPECT_LT(th[10], t[10]);  // H half a step before E
  EXPECT_GT(th[11], t[10]);

  // W = (eta0 / (2 A)) int (I l)^2 dt, A = d^2 the cell's cross-section across the invariant axes.
  double integral = 0;
  const int n = 200000;
  const double h = pulse.end_time() / n;
  for (int i = 0; i <= n; ++i) {
    const double il = dip.moment * pulse.current(i * h);
    integral += (i == 0 || i == n ? 0.5 : 1.0) * il * il * h;
  }
  const double expected = constants::eta0 / (2 * d * d) * integral;

  // After the pulse (and before its front, about c (t - 3 fs) from the sheet, reaches the box's faces).
  double lo = 1e300, hi = 0;
  for (std::size_t k = 0; k < t.size(); ++k) {
    if (t[k] < pulse.end_time() + 0.5e-15) continue;
    lo = std::min(lo, total[k]);
    hi = std::max(hi, total[k]);
    EXPECT_NEAR(electric[k] / magnetic[k], 1.0, 0.01) << "at t = " << t[k];
  }
  std::printf("W_box / W_sheet = %.6f, spread over the window %.2e\n", total.back() / expected, (hi - lo) / hi);
  EXPECT_NEAR(total.back() / expected, 1.0, 0.005);  // measured 1.0008 at 80 cells per shortest wavelength
  EXPECT_LT((hi - lo) / hi, 1e-3);
  ASSERT_EQ(e.headlines.size(), 3u);
  EXPECT_EQ(e.headlines[0].name, "total_peak");
  EXPECT_GE(e.headlines[0].value, hi);
}

// A run stopped halfway and carried on from its checkpoint arrays (as `yeegap run --resume` does)
// records the same series, bit for bit, as one never stopped.
TEST(EnergyInBox, AResumedRunRecordsTheSameSeries) {
  const Scene s = current_sheet(200, 200e-9);
  const int half = 300;
  Simulation whole(s), first(s), resumed(s);
  for (int n = 0; n < half; ++n) whole.step(), first.step();
  resumed.restore_counters(first.state_counters());
  const std::vector<StateArray> from = first.state_arrays().list(), to = resumed.state_arrays().list();
  ASSERT_EQ(from.size(), to.size());
  bool carried = false;
  for (std::size_t a = 0; a < from.size(); ++a) {
    ASSERT_EQ(from[a].name, to[a].name);
    ASSERT_EQ(from[a].bytes(), to[a].bytes()) << from[a].name;
    if (from[a].bytes() > 0) std::memcpy(to[a].data, from[a].data, from[a].bytes());
    carried = carried || from[a].name.find("energy") != std::string::npos;
  }
  EXPECT_TRUE(carried);
  for (int n = 0; n < half; ++n) whole.step(), resumed.step();
  const RunResults a = whole.results(), b = resumed.results();
  ASSERT_EQ(a.records.size(), 1u);
  ASSERT_EQ(b.records.size(), 1u);
  for (const char* q : {"time", "electric", "magnetic_time", "magnetic", "total"}) {
    EXPECT_EQ(values(a.records[0], q).size(), std::size_t(2 * half)) << q;
    EXPECT_EQ(values(a.records[0], q), values(b.records[0], q)) << q;
  }
  EXPECT_GT(values(a.records[0], "total").back(), 0.0);
}

}  // namespace
}  // namespace yeegap::solver
