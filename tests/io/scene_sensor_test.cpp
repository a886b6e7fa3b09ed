// The sensor output as read from a scene (io/scene/scene_outputs.cpp, docs/scene.md): the sensing medium
// by name, delta_n and its default, and the mistakes refused with the place and what was expected.
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
  glass: {index: 1.5151}
  gold: {library: Au_critical_points}
  water: {index: 1.3317}
  metal: {perfect_conductor: true}
  spare: {index: 1.45}
domain: {size: [2 nm, 2 nm, 600 nm], step: 2 nm, background: water, edges: {x: bloch, y: bloch, z: cpml}}
bodies:
  - {shape: slab, axis: z, from: -300 nm, to: 0 nm, material: glass}
  - {shape: slab, axis: z, from: 0 nm, to: 50 nm, material: gold}
  - {shape: slab, axis: z, from: 250 nm, to: 300 nm, material: metal}
excitation:
  - plane_wave: {from: low, polarization: p, wavelength: 633 nm, angles: {from: 60 deg, to: 85 deg, count: 26}}
stop: {energy_below: 1e-5}
outputs:
)";

std::string failure_of(const std::string& outputs, const std::string& start = head) {
  return yeegap::io::testing::scene_refusal(start + outputs).what();
}

TEST(SceneSensor, ReadsTheMediumByNameAndDeltaN) {
  const auto s = read_scene_text(head + "  - sensor: {name: chip, medium: water, delta_n: 0.002}\n", "ok.yaml");
  ASSERT_EQ(s.sensors.size(), 1u);
  EXPECT_EQ(s.sensors[0].name, "chip");
  EXPECT_EQ(s.materials[static_cast<std::size_t>(s.sensors[0].medium)].name, "water");
  EXPECT_DOUBLE_EQ(s.sensors[0].delta_n, 0.002);
  const auto d = read_scene_text(head + "  - sensor: {name: chip, medium: gold}\n", "ok.yaml");
  EXPECT_DOUBLE_EQ(d.sensors[0].delta_n, 1e-3);  // the default
}

TEST(SceneSensor, RefusesUnknownUnusedAndConductingMediaAndBadDeltaN) {
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: watr}\n"),
              HasSubstr("bad.yaml:17:34: outputs[0].sensor.medium: unknown material 'watr'; did you mean 'water'?"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: spare}\n"), HasSubstr("'spare' fills nothing"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: metal}\n"), HasSubstr("is a perfect conductor"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water, delta_n: 0}\n"), HasSubstr("delta_n"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water, delta_n: 0.5}\n"),
              HasSubstr("delta_n must be at most 0.1"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water, delta: 0.001}\n"), HasSubstr("delta_n"));
  EXPECT_THAT(failure_of("  - sensor: {name: a, medium: water}\n  - sensor: {name: b, medium: water}\n"),
              HasSubstr("only one sensor output"));
  EXPECT_THAT(failure_of("  - sensor: {medium: water}\n"), HasSubstr("missing key 'name'"));
}

TEST(SceneSensor, ReadsABindingMaterialAndRefusesOneThatIsNoBody) {
  const auto s = read_scene_text(head + "  - sensor: {name: chip, medium: water, binding: gold}\n", "ok.yaml");
  EXPECT_EQ(s.materials[static_cast<std::size_t>(s.sensors[0].binding)].name, "gold");
  EXPECT_EQ(read_scene_text(head + "  - sensor: {name: chip, medium: water}\n", "ok.yaml").sensors[0].binding, -1);
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water, binding: spare}\n"),
              HasSubstr("bad.yaml:17:50: outputs[0].sensor.binding: 'spare' must be the material of a body"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: gold, binding: water}\n"),
              HasSubstr("'water' must be the material of a body (the bound layer) and not the background"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water, binding: water}\n"),
              HasSubstr("must differ from the sensing medium 'water'"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water, binding: glas}\n"), HasSubstr("did you mean 'glass'?"));
}

TEST(SceneSensor, RefusesASceneWithoutAnAngleScan) {
  // The sensor repeats the plane wave's angle scan: a dipole, or a plane wave at one angle, has none.
  std::string dipole = head, one_angle = head;
  const std::string wave =
      "  - plane_wave: {from: low, polarization: p, wavelength: 633 nm, angles: {from: 60 deg, to: 85 deg, count: 26}}\n";
  dipole.replace(dipole.find(wave), wave.size(),
                 "  - dipole: {position: [0, 0, 100 nm], direction: z, band: {from: 600 nm, to: 700 nm}}\n");
  one_angle.replace(one_angle.find(wave), wave.size(),
                    "  - plane_wave: {from: low, polarization: p, wavelength: 633 nm, angle: 70 deg}\n");
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water}\n", dipole),
              HasSubstr("bad.yaml:17:5: outputs[0].sensor: a sensor output repeats an angle scan: it needs a "
                        "plane_wave excitation with 'angles'"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water}\n", dipole), HasSubstr("got no plane_wave"));
  EXPECT_THAT(failure_of("  - sensor: {name: chip, medium: water}\n", one_angle),
              HasSubstr("got a plane_wave with one 'angle'"));
}

}  // namespace
