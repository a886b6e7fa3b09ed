// The domain key 'averaging' (docs/scene.md): off (the staircase) by default, 'on' for subcell
// averaging, and any other word refused at its value with the choices named.
#include <string>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/errors.h"
#include "io/scene/scene_reader.h"

namespace {

using ::testing::HasSubstr;
using yeegap::io::read_scene_text;

std::string scene_with(const std::string& domain_extra) {
  return R"(scene: {version: 1}
domain:
  size: 400 nm
  step: 5 nm
)" + domain_extra + R"(
excitation:
  - dipole: {position: [0, 0, 150 nm], direction: z, band: {from: 500 nm, to: 800 nm}}
stop: {after: 10 fs}
)";
}

TEST(SceneAveraging, IsOffByDefaultAndOnWhenAsked) {
  EXPECT_FALSE(read_scene_text(scene_with(""), "a.yaml").domain.averaging);
  EXPECT_TRUE(read_scene_text(scene_with("  averaging: on"), "a.yaml").domain.averaging);
  EXPECT_FALSE(read_scene_text(scene_with("  averaging: off"), "a.yaml").domain.averaging);
}

TEST(SceneAveraging, AnyOtherWordIsRefusedAtItsValue) {
  try {
    read_scene_text(scene_with("  averaging: maybe"), "bad.yaml");
    FAIL() << "accepted 'maybe'";
  } catch (const yeegap::SceneError& e) {
    const std::string what = e.what();
    EXPECT_THAT(what, HasSubstr("bad.yaml:5:14"));
    EXPECT_THAT(what, HasSubstr("on, off"));
  }
}

}  // namespace
