// Fill fractions: exact cases (a plane parallel to a face, a plane through the centre), and the
// voxelised volume of a sphere of radius 10 cells against 4/3 pi R^3 (the check, 0.5 %).
#include "geometry/fill_fraction.h"

#include <cmath>
#include <cstdio>

#include <gtest/gtest.h>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "geometry/transforms.h"

namespace yeegap::geometry {
namespace {

// Sum of fill fractions times cell volume over a uniform grid of n^3 cells of side h from `lo`.
double voxel_volume(const Shape& s, Vec3 lo, int n, double h, int levels) {
  double v = 0;
  for (int k = 0; k < n; ++k)
    for (int j = 0; j < n; ++j)
      for (int i = 0; i < n; ++i) {
        const Vec3 a = lo + Vec3{i * h, j * h, k * h};
        v += fill_fraction(s, {a, a + Vec3{h, h, h}}, levels);
      }
  return v * h * h * h;
}

TEST(FillFraction, PlaneParallelToAFaceIsExact) {
  const auto slab = make_slab(2, -10, 0.3e-9);  // fills z < 0.3 nm of the 1 nm cell
  EXPECT_NEAR(fill_fraction(*slab, {{0, 0, 0}, {1e-9, 1e-9, 1e-9}}), 0.3, 1e-12);
  EXPECT_EQ(fill_fraction(*slab, {{0, 0, 1e-9}, {1e-9, 1e-9, 2e-9}}), 0.0);
  EXPECT_EQ(fill_fraction(*slab, {{0, 0, -2e-9}, {1e-9, 1e-9, -1e-9}}), 1.0);
}

TEST(FillFraction, TiltedPlaneThroughTheCentreFillsHalf) {
  // Half-space below a plane through the cell centre with normal (1, 2, 3)/|.|: half the cell by
  // symmetry about the centre.
  const auto half = make_turned(make_slab(2, -10, 0), {-2, 1, 0}, std::acos(3 / std::sqrt(14.0)), {0, 0, 0});
  EXPECT_NEAR(fill_fraction(*half, {{-0.5, -0.5, -0.5}, {0.5, 0.5, 0.5}}), 0.5, 1e-12);
}

TEST(FillFraction, SphereOfTenCellsHasItsVolumeWithinHalfAPercent) {
  // Issue check: voxelised volume of a sphere of radius 10 cells within 0.5 % of 4/3 pi R^3.
  // Centre off the grid's symmetry points so no lucky cancellation helps.
  const double h = 1e-9, R = 10 * h;
  const Vec3 c{0.31 * h, 0.17 * h, 0.43 * h};
  const auto s = make_sphere(c, R);
  const double exact = 4.0 / 3.0 * constants::pi * R * R * R;
  const double v = voxel_volume(*s, {-12 * h, -12 * h, -12 * h}, 24, h, 3);
  EXPECT_NEAR(v / exact, 1.0, 0.005);
  // Refinement converges: one more level changes the volume by less than the tolerance.
  const double v4 = voxel_volume(*s, {-12 * h, -12 * h, -12 * h}, 24, h, 4);
  EXPECT_NEAR(v4 / exact, 1.0, 0.005);
  std::printf("sphere R = 10 cells: volume / (4/3 pi R^3) - 1 = %.2e (3 levels), %.2e (4 levels)\n", v / exact - 1,
              v4 / exact - 1);
}

}  // namespace
}  // namespace yeegap::geometry
