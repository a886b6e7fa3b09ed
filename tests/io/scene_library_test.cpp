// `library: NAME` in a material block takes the whole model from the built-in library
// (materials/library.h); a misspelt name gets "did you mean" over the library's names, and other
// model keys beside it are refused at their own position.
#include <string>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/errors.h"
#include "io/scene/scene_reader.h"
#include "materials/library.h"
#include "scene_refusal.h"

namespace {

using ::testing::HasSubstr;
using yeegap::io::read_scene_text;

std::string scene_with(const std::string& material_block) {
  return R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
materials:
  glass: {index: 1.5}
  gold: )" + material_block + R"(
bodies:
  - {shape: sphere, material: gold, center: [0, 0, 0], radius: 40 nm}
excitation: {dipole: {position: [0, 0, 100 nm], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)";
}

yeegap::SceneError failure_of(const std::string& text) { return yeegap::io::testing::scene_refusal(text, "lib.yaml"); }

TEST(SceneLibrary, LibraryMaterialTakesEveryPoleOfTheEntry) {
  for (const char* name : {"Au", "Au_critical_points", "Ag"}) {
    const auto s = read_scene_text(scene_with(std::string("{library: ") + name + "}"), "lib.yaml");
    const yeegap::materials::PoleSet& want = yeegap::materials::find_material(name)->poles;
    const yeegap::materials::PoleSet& got = s.materials.at(1).poles;
    EXPECT_EQ(s.materials.at(1).name, "gold");
    EXPECT_EQ(got.eps_inf, want.eps_inf) << name;
    EXPECT_EQ(got.conductivity, want.conductivity) << name;
    ASSERT_EQ(got.drude.size(), want.drude.size()) << name;
    ASSERT_EQ(got.lorentz.size(), want.lorentz.size()) << name;
    ASSERT_EQ(got.critical_points.size(), want.critical_points.size()) << name;
    for (double w : {2e15, 3e15, 4e15})  // the same model at three optical frequencies, rad/s
      EXPECT_EQ(yeegap::materials::permittivity(got, w), yeegap::materials::permittivity(want, w)) << name;
  }
}

TEST(SceneLibrary, MisspeltLibraryNameSuggestsTheClosestEntry) {
  const auto e = failure_of(scene_with("{library: Au_critical_point}"));
  EXPECT_THAT(std::string(e.what()),
              HasSubstr("materials.gold.library: unknown library material 'Au_critical_point'; did you mean "
                        "'Au_critical_points'?"));
  EXPECT_EQ(e.where().line, 5);
  EXPECT_EQ(e.where().column, 19);  // at the value
}

TEST(SceneLibrary, NameFarFromEveryEntryListsTheLibrary) {
  const auto e = failure_of(scene_with("{library: unobtainium}"));
  EXPECT_THAT(std::string(e.what()), HasSubstr("unknown library material 'unobtainium'; expected one of: Ag, Au"));
}

TEST(SceneLibrary, OtherModelKeysBesideLibraryAreRefusedAtTheKey) {
  const auto e = failure_of(scene_with("{library: Au, index: 1.5}"));
  EXPECT_THAT(std::string(e.what()), HasSubstr("a library material takes its whole model from the library, found "
                                               "'index'"));
  EXPECT_EQ(e.where().line, 5);
  EXPECT_EQ(e.where().column, 23);
}

}  // namespace
