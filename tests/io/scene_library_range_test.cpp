// A library entry is valid over the wavelength range its published fit covers
// (materials/library.h). A scene whose sources reach outside that range for a material it uses gets a
// warning through the note sink when it is read; it still loads, and nothing is said otherwise.
#include <string>
#include <vector>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "io/scene/scene_reader.h"

namespace {

using ::testing::HasSubstr;

// Au_critical_points is recorded as valid from 400 to 1000 nm (library_metals.cpp).
std::string scene_with(const std::string& band, const std::string& body_material = "gold",
                       const std::string& extra_source = "") {
  return R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
materials:
  glass: {index: 1.5}
  gold: {library: Au_critical_points}
bodies:
  - {shape: sphere, material: )" + body_material + R"(, center: [0, 0, 0], radius: 40 nm}
excitation:
  - dipole: {position: [0, 0, 100 nm], direction: z, )" + band + "}\n" + extra_source + R"(stop: {after: 100 fs}
)";
}

std::vector<std::string> notes_of(const std::string& text) {
  std::vector<std::string> notes;
  const auto scene = yeegap::io::read_scene_text(text, "range.yaml", {},
                                                 [&](const std::string& m) { notes.push_back(m); });
  EXPECT_EQ(scene.materials.at(1).library, "Au_critical_points");
  return notes;
}

TEST(SceneLibraryRange, BandReachingBelowTheRangeWarnsNamingTheRange) {
  const auto notes = notes_of(scene_with("band: {from: 350 nm, to: 900 nm}"));
  ASSERT_EQ(notes.size(), 1u);
  EXPECT_THAT(notes[0], HasSubstr("range.yaml:5:3: warning: materials.gold: library entry 'Au_critical_points' is "
                                  "fitted over 400 nm to 1000 nm, but the sources cover 350 nm to 900 nm"));
  EXPECT_THAT(notes[0], HasSubstr("Etchegoin"));  // the source, so the user can look the range up
}

TEST(SceneLibraryRange, ContinuousWaveBeyondTheRangeWarns) {
  const auto notes = notes_of(scene_with("frequency: 1.1 eV"));  // 1127 nm
  ASSERT_EQ(notes.size(), 1u);
  EXPECT_THAT(notes[0], HasSubstr("the sources cover 1127.13 nm to 1127.13 nm"));
}

TEST(SceneLibraryRange, BandInsideTheRangeSaysNothing) {
  EXPECT_TRUE(notes_of(scene_with("band: {from: 400 nm, to: 1000 nm}")).empty());
  EXPECT_TRUE(notes_of(scene_with("band: {from: 3.0 eV, to: 1.5 eV}")).empty());  // 413 to 827 nm
}

TEST(SceneLibraryRange, SecondSourceOutsideTheRangeWarnsForTheCombinedBand) {
  const std::string second =
      "  - dipole: {position: [0, 0, -100 nm], direction: x, band: {from: 600 nm, to: 1200 nm}}\n";
  const auto notes = notes_of(scene_with("band: {from: 450 nm, to: 900 nm}", "gold", second));
  ASSERT_EQ(notes.size(), 1u);
  EXPECT_THAT(notes[0], HasSubstr("the sources cover 450 nm to 1200 nm"));
}

TEST(SceneLibraryRange, UnusedLibraryMaterialSaysNothing) {
  EXPECT_TRUE(notes_of(scene_with("band: {from: 300 nm, to: 900 nm}", "glass")).empty());
}

}  // namespace
