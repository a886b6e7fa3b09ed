// A rectangular cavity with perfectly conducting walls: resonances at the Yee grid's discrete
// mode frequencies [sin(w dt/2)/(c dt)]^2 = sum_a [sin(k_a d/2)/d]^2 with k_a = m_a pi / L_a
// (continuum modes: Pozar, Microwave Engineering, 4th ed., 2012, sec. 6.3; grid correction:
// Taflove & Hagness 2005, ch. 4). And a lossless closed cavity keeps its energy bounded.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>

#include "base/constants.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

constexpr double d = 10e-9;
const std::array<int, 3> cells = {10, 12, 14};

double discrete_mode(std::array<int, 3> m, double dt) {
  double s = 0;
  for (int a = 0; a < 3; ++a) s += std::pow(std::sin(m[a] * pi / (cells[a] * d) * d / 2) / d, 2);
  return 2.0 / dt * std::asin(c0 * dt * std::sqrt(s));
}
double continuum_mode(std::array<int, 3> m) {
  double s = 0;
  for (int a = 0; a < 3; ++a) s += std::pow(m[a] * pi / (cells[a] * d), 2);
  return c0 * std::sqrt(s);
}

// |sum x_n w_n exp(i omega n dt)| with a Hann window w.
double windowed_spectrum(const std::vector<double>& x, double dt, double omega) {
  std::complex<double> s = 0;
  const double N = static_cast<double>(x.size());
  for (std::size_t n = 0; n < x.size(); ++n)
    s += x[n] * (0.5 - 0.5 * std::cos(2 * pi * n / (N - 1))) * std::polar(1.0, omega * n * dt);
  return std::abs(s);
}

// Golden-section search for the spectral peak inside [lo, hi].
double peak_omega(const std::vector<double>& x, double dt, double lo, double hi) {
  const double r = (std::sqrt(5.0) - 1) / 2;
  double a = lo, b = hi, c = b - r * (b - a), e = a + r * (b - a);
  double fc = windowed_spectrum(x, dt, c), fe = windowed_spectrum(x, dt, e);
  for (int it = 0; it < 80; ++it) {
    if (fc > fe) b = e, e = c, fe = fc, c = b - r * (b - a), fc = windowed_spectrum(x, dt, c);
    else a = c, c = e, fc = fe, e = a + r * (b - a), fe = windowed_spectrum(x, dt, e);
  }
  return 0.5 * (a + b);
}

Scene cavity_scene() {
  Scene s = testing::vacuum_box(cells, d, testing::all_edges(EdgeKind::metal));
  DipoleSpec dip;
  dip.position = {-23e-9, -31e-9, 7e-9};  // off every symmetry plane, so all Ez modes are driven
  dip.direction = {0, 0, 1};
  // Band around the three lowest p = 0 modes (about 1.2e16 to 2.2e16 rad/s for 10 nm cells).
  dip.waveform.omega_min = 0.6e16;
  dip.waveform.omega_max = 3.0e16;
  s.dipoles.push_back(dip);
  ProbeSpec probe;
  probe.name = "p";
  probe.position = {31e-9, 17e-9, -9e-9};
  probe.components = {Component::Ez};
  s.probes.push_back(probe);
  return s;
}

TEST(PecCavity, LowestModesSitAtDiscreteGridFrequencies) {
  Simulation sim(cavity_scene());
  for (int n = 0; n < 65536; ++n) sim.step();
  const ProbeResult p = sim.results().probes.at(0);
  // Skip the source's active time so only free ringing is analysed.
  const std::size_t first = 2000;
  std::vector<double> x(p.values[0].begin() + first, p.values[0].end());
  // Modes with an Ez component and no other mode within 2 % (the (1,2,0) mode is left out: the
  // (1,1,2) mode lies 0.6 % below it and would bias the peak search).
  for (std::array<int, 3> m : {std::array<int, 3>{1, 1, 0}, {1, 1, 1}, {2, 1, 0}}) {
    const double expected = discrete_mode(m, sim.dt());
    const double found = peak_omega(x, sim.dt(), 0.995 * expected, 1.005 * expected);
    SCOPED_TRACE(::testing::PrintToString(m));
    EXPECT_NEAR(found / expected, 1.0, 1e-4);
    // For the in-plane modes the grid correction is several times the tolerance, so the check tells
    // grid from continuum. (Along the cube diagonal, near the 3D Courant limit, space and time
    // errors nearly cancel: (1,1,1) is only 3e-4 off the continuum, so it gets no such check.)
    if (m[2] == 0) {
      EXPECT_GT(std::abs(found / continuum_mode(m) - 1.0), 1e-3);
    }
  }
}

// The Yee scheme's exact discrete invariant in a lossless, source-free, closed region:
//   W^n = 1/2 sum [eps0 E^n . E^n + mu0 H^{n-1/2} . H^{n+1/2}] dV
// (Taflove & Hagness 2005, ch. 4, energy argument for the stability bound).
// W^n after one more step: call with the fields at step n (E^n, H^{n-1/2}).
double energy_now(Simulation& sim) {
  const std::array<AlignedVector<real>, 3> h_old = {sim.fields().c[3], sim.fields().c[4], sim.fields().c[5]};
  // W^n needs H^{n+1/2}: advance H only by taking a step and pairing the old E with both H.
  const std::array<AlignedVector<real>, 3> e_now = {sim.fields().c[0], sim.fields().c[1], sim.fields().c[2]};
  sim.step();
  const Grid& g = sim.grid();
  const Fields& f = sim.fields();
  const double v = d * d * d;
  double w = 0;
  for (int k = 0; k < g.n[2]; ++k)
    for (int j = 0; j < g.n[1]; ++j)
      for (int i = 0; i < g.n[0]; ++i) {
        const auto o = f.layout.at(i, j, k);
        for (int c = 0; c < 3; ++c)
          w += 0.5 * v * (constants::eps0 * double(e_now[c][o]) * e_now[c][o] + constants::mu0 * double(h_old[c][o]) * f.c[3 + c][o]);
      }
  return w;
}

TEST(PecCavity, LosslessCavityEnergyStaysBoundedOver1e5Steps) {
  Simulation sim(cavity_scene());
  for (int n = 0; n < 3000; ++n) sim.step();  // the pulse is over well before this
  const double start = energy_now(sim);
  ASSERT_GT(start, 0);
  double lo = start, hi = start;
  while (sim.steps_done() < 103000) {
    for (int n = 0; n < 499; ++n) sim.step();
    const double e = energy_now(sim);
    lo = std::min(lo, e);
    hi = std::max(hi, e);
  }
  // The invariant is exact in exact arithmetic; float fields add rounding noise of about 1e-7 per
  // step that may random-walk, so 1e-3 over 1e5 steps still catches any growing mode.
  EXPECT_LT(hi / start, 1.0 + 1e-3);
  EXPECT_GT(lo / start, 1.0 - 1e-3);
}

}  // namespace
}  // namespace yeegap::solver
