// Plane waves in Bloch cells against closed-form optics: the Fresnel reflectance of one glass face for
// s and p and Brewster's angle, and a slab at fixed in-plane wavevector, each frequency at its own angle
// (physics.md 3.7). Reference: Born & Wolf 1999, secs. 1.5-1.6 (from memory), via transfer_matrix.h,
// itself checked against the Fresnel formulas in tests/materials/transfer_matrix_test.cpp.
#include <gtest/gtest.h>

#include <cmath>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/transfer_matrix.h"
#include "solver/runs/bloch_run.h"
#include "test_scenes.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;
constexpr double deg = pi / 180;
constexpr double nm = 1e-9;

double omega_of(double lambda) { return 2 * pi * c0 / lambda; }

// A laterally uniform stack along z, one lateral cell of `step`, Bloch edges on x and y; medium 0
// is air, 1 glass (n = 1.5). Cells of `step` along z over `length` plus the absorbers.
Scene stack_scene(double step, double length, int absorber_cells) {
  Scene s;
  s.file = "test";
  s.domain.step = {step, step, step};
  s.domain.size = {step, step, length + 2 * absorber_cells * step};
  s.domain.edges = {EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic,
                    EdgeKind::periodic, EdgeKind::cpml, EdgeKind::cpml};
  s.domain.bloch = {true, true, false};
  s.domain.cpml.cells = absorber_cells;
  s.domain.gap_cells = 0;
  MaterialSpec air;
  air.name = "air";
  MaterialSpec glass;
  glass.name = "glass";
  glass.poles.eps_inf = 2.25;
  s.materials = {air, glass};
  s.stop.after = 200e-15;
  return s;
}

BlochWaveSpec wave(double angle, bool p, double lambda_lo, double lambda_hi, std::vector<double> lambdas) {
  BlochWaveSpec w;
  w.axis = 2;
  w.sign = +1;
  w.angle = angle;
  w.p_polarized = p;
  w.waveform.omega_min = omega_of(lambda_hi);
  w.waveform.omega_max = omega_of(lambda_lo);
  for (double l : lambdas) w.omegas.push_back(omega_of(l));
  return w;
}

// Closed-form Fresnel reflectance (Born & Wolf 1999, sec. 1.5.2, from memory; the same formulas
// as tests/materials/transfer_matrix_test.cpp).
double fresnel_R(double n1, double n2, double theta, bool p) {
  const double ci = std::cos(theta), st = n1 * std::sin(theta) / n2, ct = std::sqrt(1 - st * st);
  const double r = p ? (n2 * ci - n1 * ct) / (n2 * ci + n1 * ct) : (n1 * ci - n2 * ct) / (n1 * ci + n2 * ct);
  return r * r;
}

// One run per angle with a narrow band around 600 nm: with k_par fixed, a broad pulse would reach
// grazing incidence at its low-frequency edge, where waves leave the cell slowly and the absorber
// works poorly (physics.md 3.7: "at grazing incidence the method degrades").
ReflectanceResult interface_run(double angle, bool p) {
  Scene s = stack_scene(4 * nm, 800 * nm, 20);
  s.bodies.push_back({geometry::make_slab(2, 0.0, 1.0), 1, {}, "glass"});  // into the far absorber
  s.bloch_waves.push_back(wave(angle, p, 585 * nm, 615 * nm, {600 * nm}));
  s.bloch_waves[0].reference_omega = omega_of(600 * nm);
  s.stop.after = 500e-15;
  BlochRun run(s);
  const RunResults r = run.run();
  EXPECT_EQ(r.reflectance.size(), 1u);
  return r.reflectance.at(0);
}

TEST(BlochPlaneWave, AirGlassInterfaceGivesFresnelReflectanceForSAndP) {
  double worst = 0;
  for (bool p : {false, true})
    for (double angle_deg : {0.0, 30.0, 70.0}) {
      const ReflectanceResult t = interface_run(angle_deg * deg, p);
      const double theta = t.angles[0];
      EXPECT_NEAR(theta, angle_deg * deg, 1e-12);  // the output frequency is the reference one
      const materials::Multilayer m{1.0, {}, 2.25};
      const auto tmm = materials::stack_response(m, t.omegas[0], theta, p ? materials::Polarization::p
                                                                           : materials::Polarization::s);
      // Tolerance 1e-3 (physics.md 3.7 check). Yee dispersion at 100 cells per wavelength in
      // glass changes the impedances by about (k h)^2 / 24 = 1.6e-4 relative (Taflove & Hagness
      // 2005, ch. 4), well inside it.
      EXPECT_NEAR(t.reflectance[0], fresnel_R(1.0, 1.5, theta, p), 1e-3) << (p ? "p " : "s ") << angle_deg;
      EXPECT_NEAR(t.reflectance[0], tmm.R, 1e-3);
      EXPECT_NEAR(t.transmittance[0], tmm.T, 1e-3);
      EXPECT_NEAR(t.absorptance[0], 0.0, 1e-3);  // lossless: R + T = 1
      worst = std::max(worst, std::abs(t.reflectance[0] - fresnel_R(1.0, 1.5, theta, p)));
    }
  test_support::check_figure_against_page("README.md", "fresnel_interface",
                                          "within " + test_support::scientific(worst, 1));
}

TEST(BlochPlaneWave, PPolarizedReflectionVanishesAtBrewsterAngle) {
  // Brewster's angle tan theta_B = n2 / n1 (Born & Wolf 1999, sec. 1.5.3, from memory): 56.31 deg
  // for air to n = 1.5. At 45 deg R_p = 0.0085 (Fresnel), so the bound below discriminates.
  const double brewster = std::atan(1.5);
  const ReflectanceResult at = interface_run(brewster, true);
  test_support::check_figure_against_page("README.md", "fresnel_brewster",
                                          test_support::scientific(at.reflectance[0], 1));
  EXPECT_LT(at.reflectance[0], 1e-4);
  const ReflectanceResult below = interface_run(45 * deg, true);
  EXPECT_NEAR(below.reflectance[0], fresnel_R(1.0, 1.5, 45 * deg, true), 1e-3);
  EXPECT_GT(below.reflectance[0], 50 * at.reflectance[0]);
  const ReflectanceResult s_at = interface_run(brewster, false);
  EXPECT_NEAR(s_at.reflectance[0], fresnel_R(1.0, 1.5, brewster, false), 1e-3);  // 0.1479: s does not vanish
}

TEST(BlochPlaneWave, GlassToAirBeyondTheCriticalAngleReflectsEverything) {
  // Total internal reflection from n = 1.5 into air beyond asin(1/1.5) = 41.8 deg (Born & Wolf
  // 1999, sec. 1.5.4, from memory): R = 1, T = 0; below it, Fresnel. The incident medium is a glass
  // slab that runs into the absorber on the entry side (a prism), the background air.
  for (double angle_deg : {30.0, 50.0}) {
    // The air side is 1 um deep: the evanescent tail (1/e depth 170 nm at 50 deg) must not reach the
    // absorber, whose CFS loss would otherwise draw power out of it.
    Scene s = stack_scene(4 * nm, 1400 * nm, 20);
    s.bodies.push_back({geometry::make_slab(2, -1.0, -300 * nm), 1, {}, "prism"});
    s.bloch_waves.push_back(wave(angle_deg * deg, false, 585 * nm, 615 * nm, {600 * nm}));
    s.stop.after = 500e-15;
    const ReflectanceResult t = BlochRun(s).run().reflectance.at(0);
    const double expected = angle_deg < 41 ? fresnel_R(1.5, 1.0, angle_deg * deg, false) : 1.0;
    EXPECT_NEAR(t.reflectance[0], expected, 1e-3) << angle_deg;
    EXPECT_NEAR(t.incident_index, 1.5, 1e-12);
    if (angle_deg > 41) {
      EXPECT_NEAR(t.transmittance[0], 0.0, 1e-4);
    }
  }
}

TEST(BlochPlaneWave, SlabAtFixedInPlaneWavevectorMatchesEachFrequencyAtItsOwnAngle) {
  // A 300 nm slab of n = 1.5 in air, lit by a broad pulse (500-700 nm) whose in-plane wavevector is
  // set by 45 deg at 600 nm. Each frequency travels at sin theta(omega) = c k_par / omega (from 38
  // to 53 deg here). Frequencies near c k_par (grazing, 849 nm) never leave the cell; the band keeps
  // them in the pulse's far tail (5e-4 of its peak amplitude): the reflectance must match the slab's transfer-matrix value at that angle,
  // within 1e-3 (physics.md 3.7 check; Born & Wolf 1999, sec. 1.6).
  Scene s = stack_scene(2 * nm, 900 * nm, 30);
  s.bodies.push_back({geometry::make_slab(2, -150 * nm, 150 * nm), 1, {}, "slab"});
  double worst = 0;
  std::vector<double> lambdas;
  for (double l = 520; l <= 680; l += 20) lambdas.push_back(l * nm);
  for (bool p : {false, true}) {
    s.bloch_waves = {wave(45 * deg, p, 500 * nm, 700 * nm, lambdas)};
    s.bloch_waves[0].reference_omega = omega_of(600 * nm);
    s.stop.after = 250e-15;
    const ReflectanceResult t = BlochRun(s).run().reflectance.at(0);
    double spread = 0;
    for (std::size_t q = 0; q < t.omegas.size(); ++q) {
      const double theta = std::asin(std::sin(45 * deg) * omega_of(600 * nm) / t.omegas[q]);
      EXPECT_NEAR(t.angles[q], theta, 1e-12);
      const materials::Multilayer m{1.0, {{2.25, 300 * nm}}, 1.0};
      const auto tmm = materials::stack_response(m, t.omegas[q], theta, p ? materials::Polarization::p
                                                                           : materials::Polarization::s);
      EXPECT_NEAR(t.reflectance[q], tmm.R, 1e-3) << (p ? "p " : "s ") << lambdas[q] / nm << " nm";
      EXPECT_NEAR(t.transmittance[q], tmm.T, 1e-3);
      spread = std::max(spread, std::abs(tmm.R - t.reflectance.front()));
      worst = std::max({worst, std::abs(t.reflectance[q] - tmm.R), std::abs(t.transmittance[q] - tmm.T)});
    }
    EXPECT_GT(spread, 0.01);  // the reflectance does vary across the band: the check discriminates
  }
  test_support::check_figure_against_page("README.md", "fresnel_slab_fixed_k",
                                          "within " + test_support::scientific(worst, 1));
}

}  // namespace
}  // namespace yeegap::solver
