// The scene words for shapes beyond the basic four (ellipsoid, rounded box and cylinder, cone,
// prism, mesh), the body keys move, turn, minus and array, and the domain's refine, gap_cells and
// grading: each reads into the shape or numbers it names (checked by signed distances at points
// worked out by hand), and each mistake is refused at its value.
#include <cmath>
#include <filesystem>
#include <fstream>
#include <string>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/errors.h"
#include "io/scene/scene_reader.h"
#include "scene_refusal.h"

namespace {

using ::testing::HasSubstr;
using yeegap::Vec3;
using yeegap::io::read_scene_text;

constexpr double nm = 1e-9;

std::string scene_with(const std::string& domain_extra, const std::string& bodies) {
  return R"(scene: {version: 1}
domain:
  size: 400 nm
  step: 5 nm
)" + domain_extra + R"(
excitation:
  - dipole: {position: [0, 0, 150 nm], direction: z, band: {from: 500 nm, to: 800 nm}}
stop: {after: 10 fs}
bodies:
)" + bodies;
}

double d(const yeegap::solver::Scene& s, std::size_t body, Vec3 p_nm) {
  return s.bodies.at(body).shape->signed_distance(nm * p_nm) / nm;
}

std::string failure_of(const std::string& text) { return yeegap::io::testing::scene_refusal(text).what(); }

TEST(SceneShapes, NewShapesReadIntoTheirDistances) {
  const auto s = read_scene_text(scene_with("", R"(
  - {shape: ellipsoid, material: vacuum, center: [0, 0, 0], semi_axes: [30 nm, 20 nm, 10 nm]}
  - {shape: box, material: vacuum, center: [0, 0, 0], size: [40 nm, 20 nm, 20 nm], rounding: 5 nm}
  - {shape: cylinder, material: vacuum, center: [0, 0, 0], axis: z, radius: 10 nm, length: 40 nm, rounding: 10 nm}
  - {shape: cone, material: vacuum, base: [0, 0, 0], axis: z, length: 40 nm, radius: 30 nm}
  - {shape: cone, material: vacuum, base: [0, 0, 0], axis: z, length: 40 nm, radius: 30 nm, tip_radius: 5 nm}
  - shape: prism
    material: vacuum
    axis: z
    from: -5 nm
    to: 5 nm
    outline: [[0, 0], [20 nm, 0], [20 nm, 10 nm], [10 nm, 10 nm], [10 nm, 20 nm], [0, 20 nm]]
)"), "test.yaml");
  ASSERT_EQ(s.bodies.size(), 6u);
  EXPECT_NEAR(d(s, 0, {50, 0, 0}), 20, 1e-9);
  EXPECT_NEAR(d(s, 0, {0, 0, 0}), -10, 1e-9);
  EXPECT_NEAR(d(s, 1, {20, 10, 0}), std::sqrt(50.0) - 5, 1e-9);  // rounded edge: inner edge at (15, 5)
  EXPECT_NEAR(d(s, 2, {0, 0, 25}), 5, 1e-9);                     // capsule: hemisphere top at z = 20
  EXPECT_NEAR(d(s, 2, {10, 0, 20}), std::sqrt(200.0) - 10, 1e-9);
  EXPECT_NEAR(d(s, 3, {0, 0, 45}), 5, 1e-9);                     // sharp apex at z = 40
  EXPECT_NEAR(d(s, 4, {0, 0, 45}), 5, 1e-9);                     // rounded: cap top still at z = 40
  EXPECT_NEAR(d(s, 4, {0, 0, 35}), -5, 1e-9);                    // the cap's centre
  EXPECT_NEAR(d(s, 5, {15, 15, 0}), 5, 1e-9);                    // in the L's notch
  EXPECT_NEAR(d(s, 5, {5, 5, 0}), -5, 1e-9);
}

TEST(SceneShapes, MoveTurnMinusAndArrayApplyInOrder) {
  const auto s = read_scene_text(scene_with("", R"(
  # A 40 x 20 x 20 box turned by 90 degrees about z (about its own centre), then moved by 50 nm in x.
  - {shape: box, material: vacuum, center: [0, 0, 0], size: [40 nm, 20 nm, 20 nm],
     turn: {axis: z, angle: 90 deg}, move: [50 nm, 0, 0]}
  # A sphere with a smaller one cut away (a shell), then a 3 x 1 x 1 array of it at 30 nm pitch.
  - shape: sphere
    material: vacuum
    center: [0, 0, 0]
    radius: 10 nm
    minus: {shape: sphere, center: [0, 0, 0], radius: 6 nm}
    array: {count: [3, 1, 1], pitch: [30 nm, 0, 0]}
  # Turning about a given point: the small sphere at (20, 0, 0) turned by -90 degrees about z through
  # the origin goes to (0, -20, 0).
  - {shape: sphere, material: vacuum, center: [20 nm, 0, 0], radius: 2 nm,
     turn: {axis: z, angle: -1.5707963267948966 rad, about: [0, 0, 0]}}
)"), "test.yaml");
  ASSERT_EQ(s.bodies.size(), 3u);
  EXPECT_NEAR(d(s, 0, {50, 15, 0}), -5, 1e-9);   // long side now along y
  EXPECT_NEAR(d(s, 0, {65, 0, 0}), 5, 1e-9);
  for (double x : {-30.0, 0.0, 30.0}) {
    EXPECT_NEAR(d(s, 1, {x, 0, 0}), 6, 1e-9);    // the hollow centre of each copy
    EXPECT_NEAR(d(s, 1, {x + 8, 0, 0}), -2, 1e-9);
  }
  EXPECT_GT(d(s, 1, {60, 0, 0}), 0);             // no fourth copy
  EXPECT_NEAR(d(s, 2, {0, -20, 0}), -2, 1e-9);
}

TEST(SceneShapes, MeshFileIsReadRelativeToTheSceneWithItsUnit) {
  namespace fs = std::filesystem;
  const fs::path dir = fs::path(::testing::TempDir()) / "yeegap_scene_mesh";
  fs::create_directories(dir);
  // A tetrahedron in um, outward facets.
  std::ofstream(dir / "tet.stl") << R"(solid tet
facet normal 0 0 0
 outer loop
  vertex 0 0 0
  vertex 0 0.1 0
  vertex 0.1 0 0
 endloop
endfacet
facet normal 0 0 0
 outer loop
  vertex 0 0 0
  vertex 0.1 0 0
  vertex 0 0 0.1
 endloop
endfacet
facet normal 0 0 0
 outer loop
  vertex 0 0 0
  vertex 0 0 0.1
  vertex 0 0.1 0
 endloop
endfacet
facet normal 0 0 0
 outer loop
  vertex 0.1 0 0
  vertex 0 0.1 0
  vertex 0 0 0.1
 endloop
endfacet
endsolid tet
)";
  const auto s = read_scene_text(scene_with("", "  - {shape: mesh, material: vacuum, file: tet.stl, unit: um}\n"),
                                 (dir / "scene.yaml").string());
  ASSERT_EQ(s.bodies.size(), 1u);
  EXPECT_NEAR(d(s, 0, {-10, 10, 10}), 10, 1e-6);  // 10 nm in front of the face x = 0
  EXPECT_LT(d(s, 0, {10, 10, 10}), 0);
  const std::string e = failure_of(scene_with("", "  - {shape: mesh, material: vacuum, file: none.stl, unit: nm}\n"));
  EXPECT_THAT(e, HasSubstr("cannot open the mesh file"));
  EXPECT_THAT(e, HasSubstr("bad.yaml:10:"));
  const std::string u = failure_of(scene_with("", "  - {shape: mesh, material: vacuum, file: tet.stl}\n"));
  EXPECT_THAT(u, HasSubstr("unit"));
}

TEST(SceneShapes, ShapeMistakesAreRefusedAtTheValue) {
  EXPECT_THAT(failure_of(scene_with("", "  - {shape: box, material: vacuum, center: [0, 0, 0], size: 20 nm, rounding: 12 nm}\n")),
              HasSubstr("rounding: must lie between 0 and 10 nm"));
  EXPECT_THAT(failure_of(scene_with("", "  - {shape: cone, material: vacuum, base: [0, 0, 0], axis: z, length: 40 nm, "
                                        "radius: 10 nm, tip_radius: 12 nm}\n")),
              HasSubstr("tip radius"));
  EXPECT_THAT(failure_of(scene_with("", "  - {shape: prism, material: vacuum, axis: z, from: 0, to: 5 nm, "
                                        "outline: [[0, 0], [20 nm, 20 nm], [20 nm, 0], [0, 20 nm]]}\n")),
              HasSubstr("not a simple outline: edges 0 and 2 cross"));
  EXPECT_THAT(failure_of(scene_with("", "  - {shape: sphere, material: vacuum, center: [0, 0, 0], radius: 5 nm, "
                                        "turn: {axis: z, angle: 30}}\n")),
              HasSubstr("angle like '30 deg'"));
  EXPECT_THAT(failure_of(scene_with("", "  - {shape: sphere, material: vacuum, center: [0, 0, 0], radius: 5 nm, "
                                        "array: {count: [2, 1, 1], pitch: [0, 0, 0]}}\n")),
              HasSubstr("positive length where the count is above 1"));
  EXPECT_THAT(failure_of(scene_with("", "  - {shape: sphere, material: vacuum, center: [0, 0, 0], radius: 5 nm, "
                                        "minus: {shape: sphere, material: vacuum, center: [0, 0, 0], radius: 2 nm}}\n")),
              HasSubstr("unknown key 'material'"));
  EXPECT_THAT(failure_of(scene_with("", "  - {shape: ellipsoid, material: vacuum, center: [0, 0, 0], radius: 5 nm}\n")),
              HasSubstr("an ellipsoid takes no 'radius'"));
}

TEST(SceneShapes, DomainRefineGapCellsAndGradingAreRead) {
  const auto s = read_scene_text(scene_with(R"(  refine:
    - {from: [-50 nm, -20 nm, -20 nm], to: [50 nm, 20 nm, 20 nm], step: 1 nm}
    - {from: [10 nm, 0, 0], to: [-10 nm, 5 nm, 0], step: [0.5 nm, 5 nm, 5 nm]}
  gap_cells: 6
  grading: 1.15)", "  []\n"), "test.yaml");
  const auto& d = s.domain;
  ASSERT_EQ(d.refine.size(), 2u);
  EXPECT_NEAR(d.refine[0].box.lo.x, -50 * nm, 1e-20);
  EXPECT_NEAR(d.refine[0].step.z, 1 * nm, 1e-20);
  EXPECT_NEAR(d.refine[1].box.lo.x, -10 * nm, 1e-20);  // corners in either order
  EXPECT_NEAR(d.refine[1].box.hi.x, 10 * nm, 1e-20);
  EXPECT_NEAR(d.refine[1].step.x, 0.5 * nm, 1e-20);
  EXPECT_EQ(d.gap_cells, 6);
  EXPECT_DOUBLE_EQ(d.grading_ratio, 1.15);
  const auto defaults = read_scene_text(scene_with("", "  []\n"), "test.yaml");
  EXPECT_EQ(defaults.domain.gap_cells, 4);
  EXPECT_DOUBLE_EQ(defaults.domain.grading_ratio, 1.2);
  EXPECT_TRUE(defaults.domain.refine.empty());
}

TEST(SceneShapes, DomainMistakesAreRefusedAtTheValue) {
  EXPECT_THAT(failure_of(scene_with("  refine: [{from: [0, 0, 0], to: [10 nm, 10 nm, 10 nm], step: 8 nm}]", "  []\n")),
              HasSubstr("coarser than domain.step"));
  EXPECT_THAT(failure_of(scene_with("  refine: [{from: [0, 0, 0], to: [300 nm, 10 nm, 10 nm], step: 1 nm}]", "  []\n")),
              HasSubstr("outside the domain"));
  EXPECT_THAT(failure_of(scene_with("  refine: [{from: [0, 0, 0], to: [10 nm, 10 nm, 10 nm], stp: 1 nm}]", "  []\n")),
              HasSubstr("did you mean 'step'"));
  EXPECT_THAT(failure_of(scene_with("  grading: 1", "  []\n")), HasSubstr("above 1"));
  EXPECT_THAT(failure_of(scene_with("  gap_cells: -1", "  []\n")), HasSubstr("whole number of at least 0"));
}

}  // namespace
