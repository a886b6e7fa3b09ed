// Reflection of the default CPML (Roden & Gedney, Microw. Opt. Technol. Lett. 27, 334 (2000)):
// a run with the layer close by is compared with a reference run whose edges are so far away that
// nothing returns within the time window; the difference at a probe is the reflected wave.
// Pass mark -60 dB (Taflove & Hagness 2005, ch. 7 report -80 dB class layers; -60 dB is the
// conservative threshold physics.md 3.5 recommends: common practice).
#include <gtest/gtest.h>

#include <cmath>
#include <complex>

#include "base/constants.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

constexpr double d = 10e-9;
const double w_min = 2 * pi * c0 / 900e-9, w_max = 2 * pi * c0 / 300e-9;  // 30 to 90 cells per wavelength

std::vector<double> probe_series(std::array<int, 3> cells, Vec3 source, Vec3 dir, Vec3 probe, Component comp,
                                 long steps) {
  std::array<EdgeKind, 6> edges{};
  for (int a = 0; a < 3; ++a) {
    const EdgeKind k = cells[a] == 1 ? EdgeKind::periodic : EdgeKind::cpml;
    edges[2 * a] = edges[2 * a + 1] = k;
  }
  Scene s = testing::vacuum_box(cells, d, edges);
  DipoleSpec dip;
  dip.position = source;
  dip.direction = dir;
  dip.waveform.omega_min = w_min;
  dip.waveform.omega_max = w_max;
  s.dipoles.push_back(dip);
  s.probes.push_back({"p", probe, {comp}, {}});
  Simulation sim(s);
  for (long n = 0; n < steps; ++n) sim.step();
  return sim.results().probes[0].values[0];
}

std::complex<double> dft(const std::vector<double>& x, double omega, double dt) {
  std::complex<double> s = 0;
  for (std::size_t n = 0; n < x.size(); ++n) s += x[n] * std::polar(1.0, omega * n * dt);
  return s;
}

// Worst reflection over the band, dB: |DFT(test - reference)| / |DFT(reference)|.
double worst_reflection_dB(const std::vector<double>& test, const std::vector<double>& ref, double dt) {
  std::vector<double> diff(test.size());
  for (std::size_t n = 0; n < test.size(); ++n) diff[n] = test[n] - ref[n];
  double worst = -400;
  for (int q = 0; q <= 40; ++q) {
    const double w = w_min + (w_max - w_min) * q / 40.0;
    worst = std::max(worst, 20 * std::log10(std::abs(dft(diff, w, dt)) / std::abs(dft(ref, w, dt))));
  }
  return worst;
}

double courant_dt(int dims) { return 0.99 * d / (c0 * std::sqrt(double(dims))); }

TEST(Cpml, NormalIncidenceReflectionBelowMinus60dB) {
  // Current sheet (1x1 periodic cross-section) 30 cells from the layer; probe 10 cells from it.
  const long steps = 1500;
  const auto test = probe_series({1, 1, 124}, {0, 0, -300e-9}, {1, 0, 0}, {0, 0, 200e-9}, Component::Ex, steps);
  const auto ref = probe_series({1, 1, 2400}, {0, 0, -300e-9}, {1, 0, 0}, {0, 0, 200e-9}, Component::Ex, steps);
  const double r = worst_reflection_dB(test, ref, courant_dt(1));
  RecordProperty("worst_reflection_dB", std::to_string(r));
  std::printf("normal incidence: worst reflection over 300-900 nm (30-90 cells/wavelength): %.1f dB\n", r);
  test_support::check_figure_against_page("README.md", "cpml_normal", test_support::fixed(r, 0) + " dB");
  EXPECT_LT(r, -60.0);
}

// 2D (z invariant): a line source at (0, -300 nm) and a probe at (0, 260 nm) in an interior
// 56 cells wide: the waves reflected by the x faces reach the probe after striking them at 45
// degrees; the y faces add normal-incidence reflections.
double oblique_reflection_dB(Vec3 dir, Component comp) {
  const long steps = 900;
  const auto test = probe_series({80, 144, 1}, {0, -300e-9, 0}, dir, {0, 260e-9, 0}, comp, steps);
  const auto ref = probe_series({700, 700, 1}, {0, -300e-9, 0}, dir, {0, 260e-9, 0}, comp, steps);
  return worst_reflection_dB(test, ref, courant_dt(2));
}

TEST(Cpml, FortyFiveDegreeReflectionBelowMinus60dBForBothPolarizations) {
  const double tm = oblique_reflection_dB({0, 0, 1}, Component::Ez);
  const double te = oblique_reflection_dB({1, 0, 0}, Component::Ex);
  std::printf("45 degrees: worst reflection Ez polarization %.1f dB, in-plane polarization %.1f dB\n", tm, te);
  test_support::check_figure_against_page(
      "README.md", "cpml_45_degrees",
      test_support::fixed(tm, 0) + " dB (Ez) and " + test_support::fixed(te, 0) + " dB (in-plane)");
  EXPECT_LT(tm, -60.0);
  EXPECT_LT(te, -60.0);
}

}  // namespace
}  // namespace yeegap::solver
