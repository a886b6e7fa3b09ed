// An empty total-field/scattered-field box: outside it the grid must stay (almost) empty, inside
// it must carry the incident wave. Pass mark from the issue: scattered region <= -50 dB of the
// incident amplitude (physics.md 3.6 asks 60 dB; with an exactly matched 1D line we expect float
// round-off, far below either).
#include <gtest/gtest.h>

#include <cmath>

#include "base/constants.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

double peak(const std::vector<double>& v) {
  double m = 0;
  for (double x : v) m = std::max(m, std::abs(x));
  return m;
}

struct Leak {
  double outside_dB;   // worst |E| outside relative to the incident peak inside
  double inside_peak;  // |E| peak inside, V/m
};

Leak empty_box(int axis, int sign, Vec3 pol, Component probe_comp, double index = 1) {
  const double d = 10e-9;
  Scene s = testing::vacuum_box({40, 40, 40}, d, testing::all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = 8;
  s.materials[0].poles.eps_inf = index * index;
  PlaneWaveSpec w;
  w.box = {{-100e-9, -100e-9, -100e-9}, {100e-9, 100e-9, 100e-9}};
  w.axis = axis;
  w.sign = sign;
  w.polarization = pol;
  w.waveform.omega_min = 2 * pi * c0 / 900e-9;
  w.waveform.omega_max = 2 * pi * c0 / 300e-9;
  s.plane_waves.push_back(w);
  // Probes outside every face, at edges and corners, and one inside.
  const std::vector<Vec3> outside = {{0, 0, 130e-9}, {0, 0, -130e-9}, {130e-9, 0, 0}, {-130e-9, 0, 0},
                                     {0, 130e-9, 0}, {0, -130e-9, 0}, {120e-9, 120e-9, 0}, {120e-9, 120e-9, 120e-9},
                                     {-115e-9, 105e-9, -112e-9}};
  for (std::size_t q = 0; q < outside.size(); ++q)
    s.probes.push_back({"out" + std::to_string(q), outside[q], {Component::Ex, Component::Ey, Component::Ez}, {}});
  s.probes.push_back({"in", {10e-9, -20e-9, 30e-9}, {probe_comp}, {}});
  s.stop.after = index * 1800 * 0.99 * d / (c0 * std::sqrt(3.0));
  Simulation sim(s);
  const RunResults r = sim.run();
  const double inside = peak(r.probes.back().values[0]);
  double worst = 0;
  for (std::size_t q = 0; q + 1 < r.probes.size(); ++q)
    for (const auto& v : r.probes[q].values) worst = std::max(worst, peak(v));
  return {20 * std::log10(worst / inside), inside};
}

TEST(Tfsf, EmptyBoxLeaksLessThanMinus50dBAlongMinusZ) {
  const Leak l = empty_box(2, -1, {1, 0, 0}, Component::Ex);
  std::printf("plane wave along -z, E along x: scattered region %.1f dB, inside peak %.4f V/m\n", l.outside_dB, l.inside_peak);
  test_support::check_figure_against_page("README.md", "tfsf_leak_minus_z", test_support::fixed(l.outside_dB, 0) + " dB");
  EXPECT_LT(l.outside_dB, -50.0);
  // The incident pulse A s(t) peaks near A = 1 V/m (s is a Gaussian-modulated sine, |s| < 1).
  EXPECT_GT(l.inside_peak, 0.9);
  EXPECT_LT(l.inside_peak, 1.0 + 1e-3);
}

TEST(Tfsf, EmptyBoxLeaksLessThanMinus50dBAlongPlusXWithObliquePolarization) {
  const Leak l = empty_box(0, +1, {0, 0.6, 0.8}, Component::Ez);
  std::printf("plane wave along +x, E along (0, 0.6, 0.8): scattered region %.1f dB\n", l.outside_dB);
  test_support::check_figure_against_page("README.md", "tfsf_leak_oblique", test_support::fixed(l.outside_dB, 0) + " dB");
  EXPECT_LT(l.outside_dB, -50.0);
  EXPECT_GT(l.inside_peak, 0.8 * 0.9);
}

// The background a plane-wave box accepts besides vacuum: a constant index (water, 1.333; the
// stand-in the refusal of a dispersive background suggests). The line is matched to it as well.
TEST(Tfsf, EmptyBoxInAConstantIndexBackgroundLeaksLessThanMinus50dB) {
  const Leak l = empty_box(2, +1, {0, 1, 0}, Component::Ey, 1.333);
  std::printf("plane wave along +z in n = 1.333: scattered region %.1f dB, inside peak %.4f V/m\n", l.outside_dB,
              l.inside_peak);
  test_support::check_figure_against_page("README.md", "tfsf_leak_water", test_support::fixed(l.outside_dB, 0) + " dB");
  EXPECT_LT(l.outside_dB, -50.0);
  EXPECT_GT(l.inside_peak, 0.9);
  EXPECT_LT(l.inside_peak, 1.0 + 1e-3);
}

}  // namespace
}  // namespace yeegap::solver
