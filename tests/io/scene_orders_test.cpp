// The `orders` output as read from a scene (io/scene/scene_outputs.cpp, docs/scene.md): it takes a name,
// needs a plane_wave, and refuses other keys and a second orders output with the place and what
// was expected.
#include <string>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/errors.h"
#include "io/scene/scene_reader.h"
#include "scene_refusal.h"

namespace {

using ::testing::HasSubstr;
using yeegap::io::read_scene_text;

const std::string head = R"(scene: {version: 1}
materials:
  glass: {index: 1.5}
domain:
  size: [600 nm, 10 nm, 1000 nm]
  step: 10 nm
  edges: {x: bloch, y: periodic, z: cpml}
bodies:
  - {shape: box, material: glass, center: [0, 0, 0], size: [300 nm, 20 nm, 100 nm]}
stop: {energy_below: 1e-6}
)";
const std::string wave = "excitation:\n  - plane_wave: {polarization: p, angle: 10 deg, band: {from: 500 nm, to: 700 nm}}\n";

std::string failure_of(const std::string& text) { return yeegap::io::testing::scene_refusal(text).what(); }

TEST(SceneOrders, ReadsANamedOrdersOutputBesideAPlaneWave) {
  const auto s = read_scene_text(head + wave + "outputs:\n  - orders: {name: grating}\n", "good.yaml");
  ASSERT_EQ(s.orders.size(), 1u);
  EXPECT_EQ(s.orders[0].name, "grating");
  EXPECT_GT(s.orders[0].where.line, 0);
}

TEST(SceneOrders, RefusesOrdersWithoutAPlaneWaveOtherKeysAndASecondOne) {
  const std::string dipole = "excitation:\n  - dipole: {position: [0, 0, 200 nm], direction: x, band: {from: 500 nm, to: 700 nm}}\n";
  const std::string e1 = failure_of(head + dipole + "outputs:\n  - orders: {name: grating}\n");
  EXPECT_THAT(e1, HasSubstr("bad.yaml:"));
  EXPECT_THAT(e1, HasSubstr("need a plane wave"));
  EXPECT_THAT(failure_of(head + wave + "outputs:\n  - orders: {name: grating, plane: {axis: z, at: 0}}\n"),
              HasSubstr("plane"));
  EXPECT_THAT(failure_of(head + wave + "outputs:\n  - orders: {}\n"), HasSubstr("missing key 'name'"));
  EXPECT_THAT(failure_of(head + wave + "outputs:\n  - orders: {name: a}\n  - orders: {name: b}\n"),
              HasSubstr("already has an orders output"));
  const std::string scan = "excitation:\n  - plane_wave: {polarization: p, wavelength: 633 nm, angles: [10 deg, 20 deg]}\n";
  EXPECT_THAT(failure_of(head + scan + "outputs:\n  - orders: {name: grating}\n"), HasSubstr("not for an angle scan"));
}

}  // namespace
