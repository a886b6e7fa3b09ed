// Placement notes: a body outside the domain, a bounded body reaching into an absorbing layer and a
// dipole inside a metal are noted; a slab through the layers, a body well inside and a dipole in
// the background are not.
#include "solver/engine/placement_notes.h"

#include <gtest/gtest.h>

#include "geometry/shapes.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

constexpr double nm = 1e-9;

bool has(const std::vector<std::string>& notes, const std::string& text) {
  for (const auto& n : notes)
    if (n.find(text) != std::string::npos) return true;
  return false;
}

TEST(PlacementNotes, OutsideInTheLayerAndInsideAMetalAreNoted) {
  Scene s = testing::vacuum_box({40, 40, 40}, 5 * nm, testing::all_edges(EdgeKind::cpml));
  s.domain.cpml.cells = 8;  // the interior runs from -60 nm to 60 nm
  MaterialSpec metal = s.materials[0];
  metal.name = "metal";
  metal.poles.drude.push_back({1.2e16, 1e14});
  s.materials.push_back(metal);
  const Grid g = Grid::uniform(s.domain);
  s.bodies.push_back({geometry::make_sphere({0, 0, 0}, 20 * nm), 1, {}});            // well inside
  s.bodies.push_back({geometry::make_slab(2, -200 * nm, -50 * nm), 1, {}});          // a film through the layer
  EXPECT_TRUE(placement_notes(s, g).empty());
  s.bodies.push_back({geometry::make_sphere({0, 0, 300 * nm}, 20 * nm), 1, {}});     // beyond z+
  s.bodies.push_back({geometry::make_sphere({70 * nm, 0, 0}, 15 * nm), 1, {}});      // into the x+ layer
  DipoleSpec d;
  d.position = {0, 0, 5 * nm};  // inside the first sphere
  s.dipoles.push_back(d);
  d.position = {0, 30 * nm, 30 * nm};  // in the background
  s.dipoles.push_back(d);
  const auto notes = placement_notes(s, g);
  EXPECT_EQ(notes.size(), 3u);
  EXPECT_TRUE(has(notes, "body 2 (metal) lies wholly outside the domain"));
  EXPECT_TRUE(has(notes, "body 3 (metal) reaches into the absorbing layer at face x+"));
  EXPECT_TRUE(has(notes, "dipole 0 sits inside body 0 (metal), a conductor"));
}

}  // namespace
}  // namespace yeegap::solver
