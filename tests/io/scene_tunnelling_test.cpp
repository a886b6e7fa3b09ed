// The `tunnelling` block: pairs by body name, the model switch, the metal preset and barrier, and
// errors that point at the offending text.
#include <gtest/gtest.h>

#include "base/errors.h"
#include "io/scene/scene_reader.h"

namespace yeegap::io {
namespace {

const char* const dimer = R"(scene: {version: 1}
domain: {size: 20 nm, step: 0.5 nm, edges: metal}
materials:
  gold: {library: Au}
bodies:
  - {shape: sphere, name: left, material: gold, center: [-5.2 nm, 0, 0], radius: 5 nm}
  - {shape: sphere, name: right, material: gold, center: [5.2 nm, 0, 0], radius: 5 nm}
tunnelling:
  pairs: [[left, right]]
  model: MODEL
  metal: METAL
  barrier: exponential_fit
excitation:
  - dipole: {position: [0, 0, 8 nm], direction: z, band: {from: 500 nm, to: 900 nm}}
stop: {after: 1 fs}
)";

std::string with(std::string text, const std::string& key, const std::string& value) {
  const auto at = text.find(key);
  return text.replace(at, key.size(), value);
}

TEST(SceneTunnelling, PairsByNameAndModelSwitch) {
  const auto q = read_scene_text(with(with(dimer, "MODEL", "quantum_corrected"), "METAL", "Au"), "dimer.yaml");
  ASSERT_EQ(q.tunnelling.size(), 1u);
  EXPECT_TRUE(q.tunnelling[0].quantum);
  ASSERT_EQ(q.tunnelling[0].pairs.size(), 1u);
  EXPECT_EQ(q.tunnelling[0].pairs[0][0], 0);
  EXPECT_EQ(q.tunnelling[0].pairs[0][1], 1);
  EXPECT_EQ(q.tunnelling[0].model.metal.name, "Au");
  EXPECT_GT(q.tunnelling[0].model.cutoff_width, 0);
  const auto c = read_scene_text(with(with(dimer, "MODEL", "classical"), "METAL", "Au"), "dimer.yaml");
  EXPECT_FALSE(c.tunnelling[0].quantum);
}

TEST(SceneTunnelling, UnknownBodyNameSuggestsTheClosestAndPointsAtIt) {
  std::string text = with(with(dimer, "MODEL", "classical"), "METAL", "Au");
  text = with(text, "[[left, right]]", "[[left, rigth]]");
  try {
    read_scene_text(text, "dimer.yaml");
    FAIL() << "expected a SceneError";
  } catch (const SceneError& e) {
    EXPECT_EQ(e.where().line, 9);
    EXPECT_NE(std::string(e.what()).find("did you mean 'right'"), std::string::npos) << e.what();
  }
}

TEST(SceneTunnelling, UnknownMetalPresetIsAnError) {
  try {
    read_scene_text(with(with(dimer, "MODEL", "classical"), "METAL", "Gold"), "dimer.yaml");
    FAIL() << "expected a SceneError";
  } catch (const SceneError& e) {
    EXPECT_EQ(e.where().line, 11);
    EXPECT_NE(std::string(e.what()).find("Gold"), std::string::npos) << e.what();
  }
}

TEST(SceneTunnelling, ModelWordIsChecked) {
  try {
    read_scene_text(with(with(dimer, "MODEL", "quantum"), "METAL", "Au"), "dimer.yaml");
    FAIL() << "expected a SceneError";
  } catch (const SceneError& e) {
    EXPECT_EQ(e.where().line, 10);
  }
}

}  // namespace
}  // namespace yeegap::io
