// The plane_wave excitation and bloch edges as read from a scene (io/scene/scene_plane_wave.cpp,
// io/scene/scene_domain.cpp, docs/scene.md): defaults, angle units, a band with its table, one wavelength
// with an angle scan, and the mistakes the reader refuses with the place and what was expected.
#include <cmath>
#include <string>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/constants.h"
#include "base/errors.h"
#include "io/scene/scene_reader.h"
#include "scene_refusal.h"

namespace {

using ::testing::HasSubstr;
using yeegap::io::read_scene_text;
using yeegap::constants::c0;
using yeegap::constants::pi;

const std::string head = R"(scene: {version: 1}
materials:
  glass: {index: 1.515}
domain:
  size: [10 nm, 10 nm, 1000 nm]
  step: 1 nm
  edges: {x: bloch, y: bloch, z: cpml}
bodies:
  - {shape: slab, material: glass, axis: z, from: -600 nm, to: -100 nm}
stop: {energy_below: 1e-6}
excitation:
)";

std::string failure_of(const std::string& excitation, const std::string& start = head) {
  return yeegap::io::testing::scene_refusal(start + excitation).what();
}

TEST(ScenePlaneWave, ReadsBlochEdgesABandAndItsTable) {
  const auto s = read_scene_text(head + R"(  - plane_wave:
      from: high
      polarization: s
      angle: 45 deg
      azimuth: 0.5 rad
      band: {from: 500 nm, to: 700 nm}
      frequencies: {from: 520 nm, to: 680 nm, count: 9}
      reference: 600 nm
      position: 400 nm
)", "ok.yaml");
  EXPECT_TRUE(s.domain.bloch[0] && s.domain.bloch[1] && !s.domain.bloch[2]);
  EXPECT_EQ(s.domain.edges[0], yeegap::solver::EdgeKind::periodic);
  ASSERT_EQ(s.bloch_waves.size(), 1u);
  const auto& w = s.bloch_waves[0];
  EXPECT_EQ(w.axis, 2);
  EXPECT_EQ(w.sign, -1);
  EXPECT_FALSE(w.p_polarized);
  EXPECT_NEAR(w.angle, pi / 4, 1e-15);
  EXPECT_NEAR(w.azimuth, 0.5, 1e-15);
  EXPECT_EQ(w.omegas.size(), 9u);
  EXPECT_NEAR(w.reference_omega, 2 * pi * c0 / 600e-9, 1e3);
  EXPECT_TRUE(w.position_given);
  EXPECT_NEAR(w.position, 400e-9, 1e-18);
  EXPECT_FALSE(w.single_frequency);
}

TEST(ScenePlaneWave, ReadsAnAngleScanAtOneWavelength) {
  const auto s = read_scene_text(head + R"(  - plane_wave: {polarization: p, wavelength: 633 nm, angles: {from: 40 deg, to: 80 deg, count: 81}}
)", "ok.yaml");
  const auto& w = s.bloch_waves.at(0);
  EXPECT_EQ(w.sign, +1);  // from: low by default
  EXPECT_TRUE(w.p_polarized);
  EXPECT_TRUE(w.single_frequency);
  ASSERT_EQ(w.scan_angles.size(), 81u);
  EXPECT_NEAR(w.scan_angles.front(), 40 * pi / 180, 1e-15);
  EXPECT_NEAR(w.scan_angles[40], 60 * pi / 180, 1e-15);
  EXPECT_NEAR(w.scan_angles.back(), 80 * pi / 180, 1e-15);
  ASSERT_EQ(w.omegas.size(), 1u);
  EXPECT_NEAR(w.omegas[0], 2 * pi * c0 / 633e-9, 1e3);
}

TEST(ScenePlaneWave, RefusesMistakesWithThePlaceAndWhatWasExpected) {
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: q, wavelength: 633 nm}\n"), HasSubstr("polarization"));
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, wavelength: 633 nm, angle: 45}\n"),
              HasSubstr("the unit says which"));
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, wavelength: 633 nm, angle: 95 deg}\n"),
              HasSubstr("up to 89 deg"));
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, angle: 45 deg}\n"), HasSubstr("missing key 'band'"));
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, band: {from: 500 nm, to: 700 nm}, angles: [40 deg, 50 deg]}\n"),
              HasSubstr("one 'wavelength'"));
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, wavelength: 633 nm, angle: 4 deg, angles: [40 deg, 50 deg]}\n"),
              HasSubstr("not both"));
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, wavelength: 633 nm, position: 900 nm}\n"),
              HasSubstr("outside the domain"));
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, wavelength: 633 nm, colour: red}\n"), HasSubstr("colour"));
  std::string bad_edges = head;
  bad_edges.replace(bad_edges.find("{x: bloch, y: bloch"), 19, "{x_low: bloch, x_high: periodic, y: bloch");
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, wavelength: 633 nm}\n", bad_edges),
              HasSubstr("bloch applies to both faces"));
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, wavelength: 633 nm}\n"
                         "  - plane_wave: {polarization: s, wavelength: 633 nm}\n"),
              HasSubstr("one plane_wave"));
  // Every message names the file and line.
  EXPECT_THAT(failure_of("  - plane_wave: {polarization: p, wavelength: 633 nm, angle: 95 deg}\n"), HasSubstr("bad.yaml:"));
}

}  // namespace
