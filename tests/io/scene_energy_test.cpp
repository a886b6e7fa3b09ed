// The energy output as read from a scene (io/scene/scene_outputs.cpp, docs/scene.md `energy`): its
// box, and the mistakes the reader refuses with the place and what was expected.
#include <string>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "io/scene/scene_reader.h"
#include "scene_refusal.h"

namespace {

using ::testing::HasSubstr;
using yeegap::io::read_scene_text;

const std::string head = R"(scene: {version: 1}
domain: {size: 800 nm, step: 20 nm}
excitation:
  - dipole: {position: [0, 0, 0], direction: z, band: {from: 500 nm, to: 800 nm}}
stop: {energy_below: 1e-5}
outputs:
)";

std::string failure_of(const std::string& outputs) { return yeegap::io::testing::scene_refusal(head + outputs).what(); }

TEST(SceneEnergy, ReadsItsBox) {
  const auto s = read_scene_text(head + "  - energy: {name: inner, box: {from: [-100 nm, -50 nm, 0], to: [100 nm, 50 nm, 60 nm]}}\n",
                                 "ok.yaml");
  ASSERT_EQ(s.energies.size(), 1u);
  EXPECT_EQ(s.energies[0].name, "inner");
  EXPECT_NEAR(s.energies[0].region.lo.y, -50e-9, 1e-18);
  EXPECT_NEAR(s.energies[0].region.hi.z, 60e-9, 1e-18);
}

TEST(SceneEnergy, RefusesAMissingBoxAFlatBoxAndAnUnknownKey) {
  EXPECT_THAT(failure_of("  - energy: {name: inner}\n"), HasSubstr("missing key 'box'"));
  EXPECT_THAT(failure_of("  - energy: {name: inner, box: {from: [0, 0, 0], to: [100 nm, 100 nm, 0]}}\n"),
              HasSubstr("positive extent"));
  EXPECT_THAT(failure_of("  - energy: {name: inner, plane: {axis: z, at: 0}, box: {from: [0, 0, 0], to: [1 nm, 1 nm, 1 nm]}}\n"),
              HasSubstr("unknown key 'plane'"));
}

}  // namespace
