// A well-formed scene reads into the expected SI numbers: units, edges, materials and poles, shapes,
// sources, frequency lists and outputs, overrides, and the example scene's stated geometry. Expected
// values are computed here from the unit definitions (E = hbar omega, omega = 2 pi c / lambda), not
// copied from the reader's output.
#include <algorithm>
#include <array>
#include <cmath>
#include <string>

#include <gtest/gtest.h>

#include "base/constants.h"
#include "base/errors.h"
#include "io/scene/scene_reader.h"

namespace {

using yeegap::Vec3;
using yeegap::io::read_scene_text;
using yeegap::solver::Component;
using yeegap::solver::EdgeKind;
namespace constants = yeegap::constants;

constexpr double nm = 1e-9;
const double two_pi = 2.0 * constants::pi;
double omega_of_wavelength(double lambda) { return two_pi * constants::c0 / lambda; }
double omega_of_eV(double energy) { return energy * constants::e_charge / constants::hbar; }

// Relative comparison: the reader multiplies by unit factors, so the last bit may differ.
void expect_close(double actual, double expected, const char* what) {
  EXPECT_NEAR(actual, expected, 1e-12 * std::abs(expected)) << what;
}
void expect_vec(const Vec3& actual, const Vec3& expected, const char* what) {
  for (int a = 0; a < 3; ++a) EXPECT_NEAR(actual[a], expected[a], 1e-12 * (norm(expected) + 1e-30)) << what << " axis " << a;
}

// 1-based number of the first line of `text` that contains `fragment`.
int line_of(const std::string& text, const std::string& fragment) {
  const std::size_t at = text.find(fragment);
  EXPECT_NE(at, std::string::npos) << fragment;
  return 1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<long>(at), '\n'));
}

const std::string full_scene = R"(scene:
  version: 1
  title: every block at once
domain:
  size: [400 nm, 300 nm, 0.2 um]
  center: [0, 0, 10 nm]
  step: [5 nm, 5 nm, 4 nm]
  edges: {x: periodic, y_low: metal, y_high: cpml}
  cpml: {cells: 10, grading_order: 4, reflection: 1e-6, kappa_max: 2, alpha_max: 0.5 S/m}
  background: glass
  stability_fraction: 0.9
  time_step: 0.005 fs
materials:
  glass: {index: 1.5}
  lossy: {permittivity: 2.25, conductivity: 1e4 S/m}
  wall: {perfect_conductor: true}
  metal:
    poles:
      eps_inf: 1.5
      drude: [{plasma_frequency: 9 eV, damping: 70 meV}]
      lorentz:
        - {strength: 1.2, resonance: 3 eV, damping: 0.5 eV}
bodies:
  - {shape: sphere, material: metal, center: [10 nm, 0, 0], radius: 40 nm}
  - shape: box
    material: lossy
    center: [0, 0, 0]
    size: [20 nm, 30 nm, 40 nm]
  - {shape: slab, material: wall, axis: z, from: -80 nm, to: -60 nm}
  - {shape: cylinder, material: vacuum, center: [0, 0, 0], axis: [1, 1, 0], radius: 5 nm, length: 50 nm}
excitation:
  - dipole: {position: [0, 0, 50 nm], direction: [0, 3, 4], moment: 2 e nm, band: {from: 800 nm, to: 500 nm}}
  - dipole: {position: [0, 0, 60 nm], direction: -x, frequency: 500 THz, ramp: 20 fs}
outputs:
  - probe: {name: p1, position: [0, 0, 50 nm], components: [Ex, Hz]}
  - field_map: {name: map, plane: {axis: z, at: 0 nm}, frequencies: {from: 500 nm, to: 800 nm, count: 31}}
  - field_map:
      name: vol
      region: {from: [-10 nm, -10 nm, -10 nm], to: [10 nm, 10 nm, 10 nm]}
      frequencies: [2 eV, 600 nm, 1e15 rad/s]
      components: Ez
  - flux: {name: up, plane: {axis: z, at: 90 nm}, frequencies: [600 nm]}
  - flux: {name: around, box: {from: [-50 nm, -50 nm, -50 nm], to: [50 nm, 50 nm, 50 nm]}, frequencies: 1.5 eV}
stop: {after: 0.2 ps, energy_below: 1e-5, max_steps: 5000}
)";

const std::string small_scene = R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
bodies:
  - {shape: sphere, material: gold, center: [0, 0, 0], radius: 60 nm}
materials:
  gold: {permittivity: 4}
excitation:
  dipole: {position: [0, 0, 100 nm], direction: z, frequency: 600 nm}
stop: {after: 100 fs}
)";

TEST(SceneReader, ConvertsDomainLengthsToMetres) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  EXPECT_EQ(s.version, 1);
  EXPECT_EQ(s.title, "every block at once");
  EXPECT_EQ(s.file, "full.yaml");
  EXPECT_EQ(s.text, full_scene);
  expect_vec(s.domain.size, {400 * nm, 300 * nm, 0.2e-6}, "size");
  expect_vec(s.domain.center, {0, 0, 10 * nm}, "center (a bare number is nm)");
  expect_vec(s.domain.step, {5 * nm, 5 * nm, 4 * nm}, "step");
}

TEST(SceneReader, ReadsEdgesPerAxisAndPerFaceWithAbsorberForFacesNotNamed) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  const std::array<EdgeKind, 6> expected = {EdgeKind::periodic, EdgeKind::periodic, EdgeKind::metal,
                                            EdgeKind::cpml, EdgeKind::cpml, EdgeKind::cpml};
  EXPECT_EQ(s.domain.edges, expected);
}

TEST(SceneReader, ReadsAbsorberAndTimeStepSettings) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  EXPECT_EQ(s.domain.cpml.cells, 10);
  EXPECT_EQ(s.domain.cpml.grading_order, 4.0);
  EXPECT_EQ(s.domain.cpml.reflection, 1e-6);
  EXPECT_EQ(s.domain.cpml.kappa_max, 2.0);
  EXPECT_EQ(s.domain.cpml.alpha_max, 0.5);
  EXPECT_EQ(s.domain.stability_fraction, 0.9);
  expect_close(s.domain.time_step, 0.005e-15, "time_step");
}

TEST(SceneReader, KeepsMaterialsInFileOrderAndAppendsBuiltInVacuumWhenUsed) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  ASSERT_EQ(s.materials.size(), 5u);
  EXPECT_EQ(s.materials[0].name, "glass");
  EXPECT_EQ(s.materials[4].name, "vacuum");
  EXPECT_EQ(s.domain.background, 0);
  expect_close(s.materials[0].poles.eps_inf, 1.5 * 1.5, "index 1.5 -> eps 2.25");
  EXPECT_EQ(s.materials[1].poles.eps_inf, 2.25);
  EXPECT_EQ(s.materials[1].poles.conductivity, 1e4);
  EXPECT_TRUE(s.materials[2].perfect_conductor);
  EXPECT_FALSE(s.materials[1].perfect_conductor);
  EXPECT_EQ(s.materials[4].poles.eps_inf, 1.0);
  EXPECT_FALSE(s.materials[4].poles.dispersive());
  EXPECT_EQ(s.materials[1].where.line, line_of(full_scene, "lossy:"));
}

TEST(SceneReader, ConvertsPoleParametersFromElectronVoltsToRadiansPerSecond) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  const auto& poles = s.materials[3].poles;
  EXPECT_EQ(poles.eps_inf, 1.5);
  ASSERT_EQ(poles.drude.size(), 1u);
  ASSERT_EQ(poles.lorentz.size(), 1u);
  expect_close(poles.drude[0].omega_p, omega_of_eV(9.0), "plasma frequency");
  expect_close(poles.drude[0].gamma, omega_of_eV(0.070), "damping in meV");
  EXPECT_EQ(poles.lorentz[0].delta_eps, 1.2);
  expect_close(poles.lorentz[0].omega_0, omega_of_eV(3.0), "resonance");
  expect_close(poles.lorentz[0].gamma, omega_of_eV(0.5), "lorentz damping");
}

TEST(SceneReader, BuildsEachShapeWithItsSizesAndMaterial) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  ASSERT_EQ(s.bodies.size(), 4u);
  EXPECT_EQ(s.bodies[0].material, 3);
  EXPECT_EQ(s.bodies[3].material, 4);  // the built-in vacuum
  const auto& sphere = *s.bodies[0].shape;
  expect_close(sphere.signed_distance({10 * nm, 0, 0}), -40 * nm, "sphere centre");
  EXPECT_NEAR(sphere.signed_distance({50 * nm, 0, 0}), 0.0, 1e-18);
  const auto& box = *s.bodies[1].shape;
  expect_close(box.signed_distance({0, 0, 0}), -10 * nm, "box: half its smallest size inside");
  expect_close(box.signed_distance({0, 0, 30 * nm}), 10 * nm, "box: 10 nm above its top");
  const auto& slab = *s.bodies[2].shape;
  expect_close(slab.signed_distance({0, 0, -70 * nm}), -10 * nm, "slab middle");
  expect_close(slab.signed_distance({1e-3, -1e-3, -50 * nm}), 10 * nm, "slab: unbounded sideways");
  // The cylinder's axis is [1, 1, 0] normalised: its end cap is 25 nm from the centre along it.
  const auto& cylinder = *s.bodies[3].shape;
  const double d = 25 * nm / std::sqrt(2.0);
  EXPECT_NEAR(cylinder.signed_distance({d, d, 0}), 0.0, 1e-18);
  expect_close(cylinder.signed_distance({0, 0, 0}), -5 * nm, "cylinder: radius from the axis");
  EXPECT_EQ(s.bodies[1].where.line, line_of(full_scene, "shape: box"));
}

TEST(SceneReader, ReadsDipoleDirectionMomentAndBand) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  ASSERT_EQ(s.dipoles.size(), 2u);
  const auto& pulse = s.dipoles[0];
  expect_vec(pulse.position, {0, 0, 50 * nm}, "position");
  expect_vec(pulse.direction, {0, 0.6, 0.8}, "direction [0, 3, 4] normalised");
  expect_close(pulse.moment, 2 * constants::e_charge * nm, "2 e nm");
  EXPECT_EQ(pulse.waveform.kind, yeegap::solver::Waveform::Kind::pulse);
  // Written from 800 nm to 500 nm: the band is the same whichever end comes first.
  expect_close(pulse.waveform.omega_min, omega_of_wavelength(800 * nm), "band low");
  expect_close(pulse.waveform.omega_max, omega_of_wavelength(500 * nm), "band high");
  const auto& cw = s.dipoles[1];
  expect_vec(cw.direction, {-1, 0, 0}, "-x");
  EXPECT_EQ(cw.waveform.kind, yeegap::solver::Waveform::Kind::continuous);
  expect_close(cw.waveform.omega_min, two_pi * 500e12, "500 THz");
  EXPECT_EQ(cw.waveform.omega_max, cw.waveform.omega_min);
  expect_close(cw.waveform.ramp_time, 20e-15, "ramp");
}

TEST(SceneReader, ContinuousWaveWithoutRampTurnsOnOverTenPeriods) {
  // docs/scene.md documents this default.
  const auto s = read_scene_text(small_scene, "small.yaml");
  ASSERT_EQ(s.dipoles.size(), 1u);  // a single block stands for a list of one
  const double period = 600 * nm / constants::c0;
  expect_close(s.dipoles[0].waveform.ramp_time, 10 * period, "ramp");
  expect_close(s.dipoles[0].moment, 1e-30, "default moment");
}

TEST(SceneReader, FrequencyRangeIsEvenlySpacedInFrequencyFromFirstToLast) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  const auto& omegas = s.field_maps[0].omegas;
  ASSERT_EQ(omegas.size(), 31u);
  expect_close(omegas.front(), omega_of_wavelength(500 * nm), "from");
  expect_close(omegas.back(), omega_of_wavelength(800 * nm), "to");
  const double step = (omegas.back() - omegas.front()) / 30.0;
  for (std::size_t i = 1; i < omegas.size(); ++i)
    EXPECT_NEAR(omegas[i] - omegas[i - 1], step, 1e-9 * std::abs(step)) << "interval " << i;
}

TEST(SceneReader, FrequencyListTakesEachSpectralUnitInItsOwnMeaning) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  const auto& omegas = s.field_maps[1].omegas;
  ASSERT_EQ(omegas.size(), 3u);
  expect_close(omegas[0], omega_of_eV(2.0), "2 eV");
  expect_close(omegas[1], omega_of_wavelength(600 * nm), "600 nm");
  expect_close(omegas[2], 1e15, "rad/s");
  ASSERT_EQ(s.fluxes[1].omegas.size(), 1u);  // a single value is a list of one
  expect_close(s.fluxes[1].omegas[0], omega_of_eV(1.5), "1.5 eV");
}

TEST(SceneReader, ReadsOutputRegionsAndComponents) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  ASSERT_EQ(s.probes.size(), 1u);
  ASSERT_EQ(s.field_maps.size(), 2u);
  ASSERT_EQ(s.fluxes.size(), 2u);
  EXPECT_EQ(s.probes[0].name, "p1");
  EXPECT_EQ(s.probes[0].components, (std::vector<Component>{Component::Ex, Component::Hz}));
  // A plane spans the whole domain across its two other axes; the domain is centred at z = 10 nm.
  const auto& plane = s.field_maps[0].region;
  expect_vec(plane.lo, {-200 * nm, -150 * nm, 0}, "plane lo");
  expect_vec(plane.hi, {200 * nm, 150 * nm, 0}, "plane hi");
  EXPECT_EQ(s.field_maps[0].components, (std::vector<Component>{Component::Ex, Component::Ey, Component::Ez}));
  EXPECT_EQ(s.field_maps[1].components, (std::vector<Component>{Component::Ez}));
  expect_vec(s.field_maps[1].region.lo, {-10 * nm, -10 * nm, -10 * nm}, "region lo");
  expect_close(s.fluxes[0].region.lo.z, 90 * nm, "flux plane");
  expect_close(s.fluxes[0].region.hi.z, 90 * nm, "flux plane");
  expect_vec(s.fluxes[1].region.hi, {50 * nm, 50 * nm, 50 * nm}, "box hi");
}

TEST(SceneReader, ReadsStopConditions) {
  const auto s = read_scene_text(full_scene, "full.yaml");
  expect_close(s.stop.after, 0.2e-12, "after");
  EXPECT_EQ(s.stop.energy_below, 1e-5);
  EXPECT_EQ(s.stop.max_steps, 5000);
}

TEST(SceneReader, SceneWithoutBackgroundUsesBuiltInVacuum) {
  const auto s = read_scene_text(small_scene, "small.yaml");
  ASSERT_EQ(s.materials.size(), 2u);
  EXPECT_EQ(s.materials[s.domain.background].name, "vacuum");
  EXPECT_EQ(s.materials[s.domain.background].poles.eps_inf, 1.0);
  EXPECT_EQ(s.bodies[0].material, 0);  // bodies may come before the materials block in the file
  for (auto e : s.domain.edges) EXPECT_EQ(e, EdgeKind::cpml);
  expect_vec(s.domain.size, {400 * nm, 400 * nm, 400 * nm}, "one size for all axes");
}

TEST(SceneReader, OverridesReplaceAndAddValuesBeforeValidation) {
  const auto s = read_scene_text(small_scene, "small.yaml",
                                 {"domain.step=2 nm", "bodies[0].radius=40 nm", "stop.max_steps=7",
                                  "domain.edges={x: periodic, y: periodic}", "excitation.dipole.direction=[1, 0, 0]",
                                  "materials.gold.permittivity = 9"});
  expect_vec(s.domain.step, {2 * nm, 2 * nm, 2 * nm}, "step");
  expect_close(s.bodies[0].shape->signed_distance({0, 0, 0}), -40 * nm, "radius");
  EXPECT_EQ(s.stop.max_steps, 7);
  EXPECT_EQ(s.domain.edges[0], EdgeKind::periodic);
  EXPECT_EQ(s.domain.edges[3], EdgeKind::periodic);
  EXPECT_EQ(s.domain.edges[4], EdgeKind::cpml);
  expect_vec(s.dipoles[0].direction, {1, 0, 0}, "direction");
  EXPECT_EQ(s.materials[0].poles.eps_inf, 9.0);
  EXPECT_EQ(s.text, small_scene);  // the stored text is the file as written
}

TEST(SceneReader, LaterOverrideOfTheSameKeyWins) {
  const auto s = read_scene_text(small_scene, "small.yaml", {"domain.step=2 nm", "domain.step=4 nm"});
  expect_close(s.domain.step.x, 4 * nm, "step");
}

TEST(SceneReader, ExampleDipoleNearSphereHasTheGeometryItsCommentsState) {
  const auto s = yeegap::io::read_scene_file(std::string(YEEGAP_SOURCE_DIR) + "/examples/dipole_near_sphere.yaml");
  for (int a = 0; a < 3; ++a) EXPECT_NEAR(s.domain.size[a] / s.domain.step[a], 80.0, 1e-9) << "cells along " << a;
  for (auto e : s.domain.edges) EXPECT_EQ(e, EdgeKind::cpml);
  ASSERT_EQ(s.bodies.size(), 1u);
  ASSERT_EQ(s.dipoles.size(), 1u);
  const auto& sphere = *s.bodies[0].shape;
  const auto& dipole = s.dipoles[0];
  expect_close(sphere.signed_distance(dipole.position), 20 * nm, "dipole 20 nm from the surface");
  expect_close(s.materials[s.bodies[0].material].poles.eps_inf, 4.0, "index 2.0");
  expect_vec(dipole.direction, {0, 0, 1}, "z dipole");
  expect_close(dipole.waveform.omega_min, omega_of_wavelength(900 * nm), "band");
  expect_close(dipole.waveform.omega_max, omega_of_wavelength(450 * nm), "band");
  EXPECT_EQ(s.stop.energy_below, 1e-5);
  ASSERT_EQ(s.probes.size(), 1u);
  expect_vec(s.probes[0].position, dipole.position, "probe at the dipole");
  ASSERT_EQ(s.fluxes.size(), 2u);
  // The small box holds the dipole and no part of the sphere; the large one holds both, and
  // stays clear of the absorber layers.
  const auto inside = [](const yeegap::solver::Region& r, const Vec3& p) {
    for (int a = 0; a < 3; ++a)
      if (!(p[a] > r.lo[a] && p[a] < r.hi[a])) return false;
    return true;
  };
  const auto sphere_box = sphere.bounds();
  EXPECT_TRUE(inside(s.fluxes[0].region, dipole.position));
  EXPECT_GT(s.fluxes[0].region.lo.z, sphere_box.hi.z);
  EXPECT_TRUE(inside(s.fluxes[1].region, dipole.position));
  EXPECT_TRUE(inside(s.fluxes[1].region, sphere_box.lo));
  EXPECT_TRUE(inside(s.fluxes[1].region, sphere_box.hi));
  const double absorber = s.domain.cpml.cells * s.domain.step.x;
  for (int a = 0; a < 3; ++a) {
    EXPECT_LT(s.fluxes[1].region.hi[a], 0.5 * s.domain.size[a] - absorber);
    EXPECT_GT(s.fluxes[1].region.lo[a], -0.5 * s.domain.size[a] + absorber);
  }
  // The field map's plane holds both the dipole and the sphere centre.
  ASSERT_EQ(s.field_maps.size(), 1u);
  const auto& plane = s.field_maps[0].region;
  EXPECT_EQ(plane.lo.y, plane.hi.y);
  EXPECT_EQ(dipole.position.y, plane.lo.y);
  EXPECT_EQ(0.5 * (sphere_box.lo.y + sphere_box.hi.y), plane.lo.y);
  EXPECT_EQ(s.field_maps[0].omegas.size(), 3u);
}

}  // namespace
