// The binned body lookup gives the same material as testing every body in turn (the region left
// empty), for random points and for points on shared faces and bin edges, with overlapping bodies,
// a slab unbounded along two axes and bodies reaching out of the region.
#include "solver/media/body_lookup.h"

#include <random>

#include <gtest/gtest.h>

#include "geometry/shapes.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

constexpr double nm = 1e-9;

TEST(BodyLookup, SameAnswerAsTestingEveryBody) {
  Scene s = testing::vacuum_box({40, 40, 40}, 5 * nm, testing::all_edges(EdgeKind::cpml));
  for (int m = 1; m <= 4; ++m) s.materials.push_back(s.materials[0]);
  s.bodies.push_back({geometry::make_slab(2, -100 * nm, -60 * nm), 1, {}});
  std::mt19937 rng(7);
  std::uniform_real_distribution<double> at(-110 * nm, 110 * nm), radius(3 * nm, 25 * nm);
  for (int b = 0; b < 40; ++b)
    s.bodies.push_back({geometry::make_sphere({at(rng), at(rng), at(rng)}, radius(rng)), 1 + b % 4, {}});
  // Two boxes sharing a face at x = 0 (a point on it goes to the later one).
  s.bodies.push_back({geometry::make_box({-5 * nm, 0, 0}, {10 * nm, 20 * nm, 20 * nm}), 2, {}});
  s.bodies.push_back({geometry::make_box({5 * nm, 0, 0}, {10 * nm, 20 * nm, 20 * nm}), 3, {}});
  const geometry::Aabb region{{-100 * nm, -100 * nm, -100 * nm}, {100 * nm, 100 * nm, 100 * nm}};
  const BodyLookup binned(s, region), every(s, {});
  int inside = 0;
  for (int i = 0; i < 200000; ++i) {
    const Vec3 p{at(rng), at(rng), at(rng)};
    const int m = every.material_at(p);
    inside += m != 0;
    ASSERT_EQ(binned.material_at(p), m) << p.x << " " << p.y << " " << p.z;
  }
  EXPECT_GT(inside, 20000);  // the points do test bodies
  // Points on bin edges (multiples of the region / bins) and on the shared face.
  for (int i = -100; i <= 100; ++i) {
    const Vec3 p{i * nm, 0.5 * i * nm, 0};
    EXPECT_EQ(binned.material_at(p), every.material_at(p)) << i;
  }
}

}  // namespace
}  // namespace yeegap::solver
