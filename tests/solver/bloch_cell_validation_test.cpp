// Bloch-periodic cells (physics.md 3.7): the halo copies rotate the real and imaginary parts by
// exp(+-i k L), and a plane wave in an empty cell is a pure Bloch wave exp(i k_x x) whose phase
// between the two periodic faces is exactly k_x L, entering through a plane that leaks nothing.
// Bloch condition: F(x + L) = F(x) exp(i k L) with fields ~ exp(-i omega t) (Taflove & Hagness
// 2005, ch. 13, periodic structures; physics.md 3.7).
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <limits>
#include <random>

#include "base/constants.h"
#include "solver/engine/bloch_halos.h"
#include "solver/runs/bloch_run.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;
using cplx = std::complex<double>;
constexpr double nm = 1e-9;
constexpr double deg = pi / 180;

TEST(BlochHalos, CopiesCarryThePhaseAndCoupleTheImaginaryPart) {
  Grid g;
  g.n = {8, 3, 4};
  for (int a = 0; a < 3; ++a)
    for (int i = 0; i <= g.n[a]; ++i) g.nodes[a].push_back(10 * nm * i);
  g.periodic = {true, true, false};
  DomainSpec d;
  d.bloch = {true, false, false};
  d.bloch_wavevector = {1.3e7, 0, 0};  // rad/m: phase 1.04 rad over the 80 nm period
  const BlockLayout L = BlockLayout::of(g.n);
  Fields re(L), im(L);
  std::mt19937 rng(7);
  std::uniform_real_distribution<double> u(-1, 1);
  for (int c = 0; c < 6; ++c)
    for (int k = 0; k < g.n[2]; ++k)
      for (int j = 0; j < g.n[1]; ++j)
        for (int i = 0; i < g.n[0]; ++i) {
          re.c[c][L.at(i, j, k)] = static_cast<real>(u(rng));
          // Component Ez has no imaginary part: its halo's imaginary part comes from the coupling alone.
          im.c[c][L.at(i, j, k)] = c == 2 ? real(0) : static_cast<real>(u(rng));
        }
  const double phi = d.bloch_wavevector.x * 80 * nm;
  EXPECT_NEAR(bloch_phase(g, d, 0), phi, 1e-15);
  fill_bloch_halos(re, im, g, d, true);
  fill_bloch_halos(re, im, g, d, false);
  // Each halo value is the exact complex product rounded once to the storage type.
  const double tol = 4 * std::numeric_limits<real>::epsilon();
  for (int c = 0; c < 6; ++c)
    for (int k = 0; k < g.n[2]; ++k)
      for (int j = 0; j < g.n[1]; ++j) {
        const bool electric = c < 3;
        const int src = electric ? 0 : g.n[0] - 1, dst = electric ? g.n[0] : -1;
        const cplx f(re.c[c][L.at(src, j, k)], im.c[c][L.at(src, j, k)]);
        const cplx expected = f * std::polar(1.0, electric ? phi : -phi);
        const cplx got(re.c[c][L.at(dst, j, k)], im.c[c][L.at(dst, j, k)]);
        EXPECT_NEAR(got.real(), expected.real(), tol) << c;
        EXPECT_NEAR(got.imag(), expected.imag(), tol) << c;
        if (c == 2) {
          EXPECT_GT(std::abs(got.imag()), 0.0);  // sin(phi) re: the parts are coupled
        }
      }
}

TEST(BlochHalos, OneCellAxisMakesTheLateralWavenumberExact) {
  // On a one-cell axis the phase is 2 asin(k h / 2), so the Yee lateral difference
  // (2/h) sin(phi/2) equals k (Taflove & Hagness 2005, ch. 4).
  Grid g;
  g.n = {1, 1, 4};
  g.nodes = {std::vector<double>{0, 7 * nm}, std::vector<double>{0, 7 * nm}, std::vector<double>{0, 1, 2, 3, 4}};
  g.periodic = {true, true, false};
  DomainSpec d;
  d.bloch = {true, true, false};
  d.bloch_wavevector = {2.1e7, -0.9e7, 0};
  for (int a = 0; a < 2; ++a)
    EXPECT_NEAR(2 / (7 * nm) * std::sin(0.5 * bloch_phase(g, d, a)), d.bloch_wavevector[a], 1e-9 * 2.1e7);
}

TEST(BlochCell, EmptyCellCarriesAPureBlochWaveWithPhaseKxLAcrossThePeriod) {
  // 16 cells of 10 nm along x (period 160 nm), vacuum, s-polarized plane wave at 30 deg, 600 nm.
  Scene s = testing::vacuum_box({16, 1, 100}, 10 * nm, {EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic,
                                                        EdgeKind::periodic, EdgeKind::cpml, EdgeKind::cpml});
  s.domain.bloch = {true, true, false};
  s.domain.cpml.cells = 20;
  s.domain.gap_cells = 0;
  const double omega = 2 * pi * c0 / (600 * nm);
  BlochWaveSpec w;
  w.angle = 30 * deg;
  w.p_polarized = false;
  w.reference_omega = omega;
  w.omegas = {omega};
  w.single_frequency = true;
  s.bloch_waves = {w};
  FieldMapSpec map;
  map.name = "line";
  map.region.lo = {-80 * nm, 0, 200 * nm};
  map.region.hi = {80 * nm, 0, 200 * nm};
  map.omegas = {omega};
  map.components = {Component::Ey};
  s.field_maps = {map};
  s.stop.energy_below = 1e-7;
  BlochRun run(s);
  const double kx = std::sin(30 * deg) * omega / c0;
  EXPECT_NEAR(run.real_part().scene().domain.bloch_wavevector.x, kx, 1e-9 * kx);
  const RunResults r = run.run();
  const auto& v = r.field_maps.at(0).values.at(0).at(0);
  const auto& x = r.field_maps.at(0).x;
  ASSERT_EQ(x.size(), 17u);
  // Physics.md 3.7 check: the phase between the two periodic faces is exactly k_x L (1e-12).
  const double L = 160 * nm;
  EXPECT_NEAR(std::arg(v.back() / v.front()), std::remainder(kx * L, 2 * pi), 1e-12);
  EXPECT_NEAR(std::abs(v.back() / v.front()), 1.0, 1e-12);
  // Inside the period the grid carries the wave on its own: E(x_i) = E(x_0) exp(i k_x (x_i - x_0)),
  // the phase increasing with x (the wave travels towards +x for k_x > 0). Float storage of the
  // fields limits this to about 1e-6; 1e-5 leaves room for the DFT's round-off.
  for (std::size_t i = 0; i < x.size(); ++i) {
    const cplx expected = v.front() * std::polar(1.0, kx * (x[i] - x.front()));
    EXPECT_LT(std::abs(v[i] - expected), 1e-5 * std::abs(v.front())) << i;
  }
  // One way only, leak-free: with nothing to reflect, the reflected-power plane sees nothing
  // (100 dB below the incident power), and all the incident power arrives at the far side.
  const ReflectanceResult& t = r.reflectance.at(0);
  EXPECT_LT(std::abs(t.reflectance[0]), 1e-10);
  EXPECT_NEAR(t.transmittance[0], 1.0, 1e-5);
  EXPECT_NEAR(t.angles[0], 30 * deg, 1e-12);
}

}  // namespace
}  // namespace yeegap::solver
