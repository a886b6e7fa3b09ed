// STL import: an icosphere written as ASCII and binary STL at run time reads back to the same mesh,
// voxelises to the analytic sphere's volume within 1 % (the check), has distances within
// the polyhedron's deviation from the sphere and signs that agree with the winding number; broken
// files are refused naming the offending facets.
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <functional>

#include <fmt/format.h>

#include <gtest/gtest.h>

#include "base/constants.h"
#include "base/errors.h"
#include "geometry/fill_fraction.h"
#include "geometry/mesh_shape.h"
#include "geometry/stl_mesh.h"
#include "icosphere.h"
#include "sdf_checks.h"

namespace yeegap::geometry {
namespace {

namespace fs = std::filesystem;

std::string temp_file(const std::string& name) {
  const fs::path dir = fs::path(::testing::TempDir()) / "yeegap_stl_test";
  fs::create_directories(dir);
  return (dir / name).string();
}

std::string error_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const SceneError& e) {
    return e.what();
  }
  return "(no error)";
}

const Where here{"scene.yaml", 12, 5, "bodies[0].file"};

TEST(StlMesh, AsciiAndBinaryReadToTheSameClosedMesh) {
  const auto soup = test::icosphere({0, 0, 0}, 10, 3);  // 1280 facets, file units
  const std::string a = temp_file("sphere_ascii.stl"), b = temp_file("sphere_binary.stl");
  test::write_ascii_stl(soup, a);
  test::write_binary_stl(soup, b);
  const TriangleMesh ma = read_stl(a, 1e-9, here), mb = read_stl(b, 1e-9, here);
  ASSERT_EQ(ma.facets.size(), 1280u);
  ASSERT_EQ(mb.facets.size(), 1280u);
  EXPECT_EQ(ma.vertices.size(), 642u);  // Euler: V = F/2 + 2 for a closed triangulated sphere
  EXPECT_EQ(mb.vertices.size(), 642u);
  EXPECT_EQ(ma.facets, mb.facets);
  for (std::size_t i = 0; i < ma.vertices.size(); ++i) EXPECT_LT(norm(ma.vertices[i] - mb.vertices[i]), 1e-15);
  // The unit scales coordinates: the file's 10 is 10 nm.
  EXPECT_NEAR(norm(ma.vertices[0]), 10e-9, 1e-15);
}

TEST(StlMesh, SphereVoxelisesWithinOnePercentOfTheAnalyticVolume) {
  // Issue check: an STL sphere within 1 % of the analytic one. Radius 10 cells of 1 nm, 5120 facets.
  const double h = 1e-9, R = 10 * h;
  const Vec3 c{0.31, 0.17, 0.43};  // file units (nm): off the grid's symmetry points
  const std::string path = temp_file("sphere_r10.stl");
  test::write_binary_stl(test::icosphere(c, 10, 4), path);
  const MeshShape mesh(read_stl(path, 1e-9, here));
  double v = 0;
  for (int k = -12; k < 12; ++k)
    for (int j = -12; j < 12; ++j)
      for (int i = -12; i < 12; ++i) {
        const Vec3 lo{i * h, j * h, k * h};
        v += fill_fraction(mesh, {lo, lo + Vec3{h, h, h}});
      }
  v *= h * h * h;
  const double sphere = 4.0 / 3.0 * constants::pi * R * R * R;
  EXPECT_NEAR(v / sphere, 1.0, 0.01);
  // Sharper: the voxelised volume matches the polyhedron's own volume (its corners lie on the
  // sphere, so it is a little smaller), as for the analytic sphere in fill_fraction_test.
  const double poly = enclosed_volume(read_stl(path, 1e-9, here));
  EXPECT_NEAR(v / poly, 1.0, 0.005);
  std::printf("STL sphere: voxelised / analytic - 1 = %.2e, polyhedron / analytic - 1 = %.2e\n", v / sphere - 1,
              poly / sphere - 1);
}

TEST(StlMesh, DistanceStaysWithinThePolyhedronsDeviationFromTheSphere) {
  const auto soup = test::icosphere({0, 0, 0}, 1, 3);
  const std::string path = temp_file("sphere_unit.stl");
  test::write_binary_stl(soup, path);
  const MeshShape mesh(read_stl(path, 1.0, here));
  // The polyhedron lies between the sphere and the sphere shrunk by the deepest facet centre.
  double sag = 0;
  for (const auto& t : soup.facets) {
    const Vec3 n = cross(t[1] - t[0], t[2] - t[0]);
    sag = std::max(sag, 1 - std::abs(dot(t[0], (1.0 / norm(n)) * n)));
  }
  int far = 0;
  for (const Vec3& p : test::random_points({{-2, -2, -2}, {2, 2, 2}}, 3000, 21)) {
    const double d = mesh.exact_signed_distance(p), sphere = norm(p) - 1;
    EXPECT_GE(d, sphere - 1e-6);  // the mesh is inside the sphere (float corners: 1e-7 slack)
    EXPECT_LE(d, sphere + sag + 1e-6);
    // The fast value: the exact one near the surface, a lower bound with the same sign beyond.
    const double fast = mesh.signed_distance(p);
    EXPECT_EQ(fast < 0, d < 0);
    EXPECT_LE(std::abs(fast), std::abs(d) + 1e-15);
    if (std::abs(d) < mesh.exact_band()) {
      EXPECT_EQ(fast, d);
    }
    far += std::abs(fast) < std::abs(d);
  }
  EXPECT_GT(far, 100);  // the far-field bound was exercised
}

TEST(StlMesh, SignAgreesWithTheWindingNumber) {
  // An L-shaped solid (non-convex) made of two unit cubes stacked on a third: written as an
  // icosphere would not test concave edges, so the L is built from a prism-like soup.
  const std::vector<Vec3> outline = {{0, 0, 0}, {2, 0, 0}, {2, 1, 0}, {1, 1, 0}, {1, 2, 0}, {0, 2, 0}};
  test::Soup s;
  const int n = static_cast<int>(outline.size());
  const Vec3 up{0, 0, 1};
  // Side walls (outline counter-clockwise seen from +z, so walls face outwards).
  for (int i = 0; i < n; ++i) {
    const Vec3 a = outline[i], b = outline[(i + 1) % n];
    s.facets.push_back({a, b, b + up});
    s.facets.push_back({a, b + up, a + up});
  }
  // Caps: fan triangulation of the L from the corner (1, 1) keeps every triangle inside it.
  const int hub = 3;
  for (int k = 1; k < n - 1; ++k) {
    const Vec3 a = outline[hub], b = outline[(hub + k) % n], c = outline[(hub + k + 1) % n];
    s.facets.push_back({a + up, b + up, c + up});  // top, counter-clockwise from +z
    s.facets.push_back({a, c, b});                 // bottom, reversed
  }
  const std::string path = temp_file("ell.stl");
  test::write_ascii_stl(s, path);
  const MeshShape mesh(read_stl(path, 1.0, here));
  int inside = 0;
  for (const Vec3& p : test::random_points({{-0.5, -0.5, -0.5}, {2.5, 2.5, 1.5}}, 4000, 22)) {
    const double d = mesh.signed_distance(p), w = mesh.winding_number(p);
    if (std::abs(d) < 1e-9) continue;
    EXPECT_NEAR(w, d < 0 ? 1.0 : 0.0, 1e-9) << "at (" << p.x << ", " << p.y << ", " << p.z << "), d = " << d;
    inside += d < 0;
  }
  EXPECT_GT(inside, 500);  // the comparison saw both inside and outside points
  struct Exact final : Shape {
    const MeshShape& m;
    explicit Exact(const MeshShape& mesh_) : m(mesh_) {}
    double signed_distance(const Vec3& p) const override { return m.exact_signed_distance(p); }
    Aabb bounds() const override { return m.bounds(); }
  };
  test::expect_exact_distance(Exact(mesh), {{-0.5, -0.5, -0.5}, {2.5, 2.5, 1.5}}, 1e-6);
  // Exact near the surface, a bound beyond: the switch between them is not 1-Lipschitz.
  test::expect_distance_bound(mesh, {{-0.5, -0.5, -0.5}, {2.5, 2.5, 1.5}}, 1e-6, 400, 11, /*lipschitz=*/false);
}

TEST(StlMesh, InwardOrientedMeshIsTurnedOutwards) {
  auto soup = test::icosphere({0, 0, 0}, 1, 2);
  for (auto& t : soup.facets) std::swap(t[1], t[2]);
  const std::string path = temp_file("inward.stl");
  test::write_binary_stl(soup, path);
  const TriangleMesh m = read_stl(path, 1.0, here);
  EXPECT_GT(enclosed_volume(m), 0.0);
  EXPECT_LT(MeshShape(m).signed_distance({0, 0, 0}), 0.0);
}

TEST(StlMesh, HoleIsRefusedNamingTheFacetsAroundIt) {
  auto soup = test::icosphere({0, 0, 0}, 1, 1);  // 80 facets
  const auto removed = soup.facets[17];
  soup.facets.erase(soup.facets.begin() + 17);
  // The facets that shared an edge with the removed one, in the new file order.
  std::vector<int> around;
  for (std::size_t f = 0; f < soup.facets.size(); ++f) {
    int shared = 0;
    for (const Vec3& p : soup.facets[f])
      for (const Vec3& q : removed) shared += p == q;
    if (shared == 2) around.push_back(static_cast<int>(f));
  }
  ASSERT_EQ(around.size(), 3u);
  const std::string path = temp_file("hole.stl");
  test::write_ascii_stl(soup, path);
  const std::string msg = error_of([&] { read_stl(path, 1.0, here); });
  EXPECT_NE(msg.find("scene.yaml:12:5"), std::string::npos) << msg;
  EXPECT_NE(msg.find("hole"), std::string::npos) << msg;
  EXPECT_NE(msg.find(fmt::format("facets {}, {}, {}", around[0], around[1], around[2])), std::string::npos) << msg;
}

TEST(StlMesh, ADirectoryOrADeviceIsRefusedByWhatItIs) {
  // A directory used to fail with "basic_filebuf::underflow error", and /dev/zero read forever.
  const std::string dir = temp_file("a_directory");
  std::filesystem::create_directories(dir);
  std::string msg = error_of([&] { read_stl(dir, 1.0, here); });
  EXPECT_NE(msg.find("is a directory, not a file"), std::string::npos) << msg;
  EXPECT_NE(msg.find("scene.yaml:12:5"), std::string::npos) << msg;
  msg = error_of([&] { read_stl("/dev/zero", 1.0, here); });
  EXPECT_NE(msg.find("is not a regular file"), std::string::npos) << msg;
  msg = error_of([&] { read_stl(temp_file("missing.stl"), 1.0, here); });
  EXPECT_NE(msg.find("no such file"), std::string::npos) << msg;
}

TEST(StlMesh, FlippedFacetIsRefusedByItsIndex) {
  auto soup = test::icosphere({0, 0, 0}, 1, 1);
  std::swap(soup.facets[7][1], soup.facets[7][2]);
  const std::string path = temp_file("flipped.stl");
  test::write_binary_stl(soup, path);
  const std::string msg = error_of([&] { read_stl(path, 1.0, here); });
  EXPECT_NE(msg.find("inconsistently oriented"), std::string::npos) << msg;
  EXPECT_NE(msg.find("facet 7 runs"), std::string::npos) << msg;
}

TEST(StlMesh, FinSharedByThreeFacetsIsRefused) {
  auto soup = test::icosphere({0, 0, 0}, 1, 1);
  const auto t = soup.facets[0];
  soup.facets.push_back({t[0], t[1], Vec3{3, 3, 3}});  // a third facet on edge t0-t1
  const std::string path = temp_file("fin.stl");
  test::write_binary_stl(soup, path);
  const std::string msg = error_of([&] { read_stl(path, 1.0, here); });
  EXPECT_NE(msg.find("more than two facets"), std::string::npos) << msg;
  EXPECT_NE(msg.find("80"), std::string::npos) << msg;
}

TEST(StlMesh, MalformedAsciiIsRefusedWithItsLine) {
  const std::string text = "solid x\n  facet normal 0 0 1\n    outer loop\n      vertex 0 0 0\n      vertex 1 zero 0\n";
  const std::string msg = error_of([&] { parse_stl(text, "bad.stl", 1.0, here); });
  EXPECT_NE(msg.find("bad.stl' line 5: expected a number, found 'zero'"), std::string::npos) << msg;
  const std::string other = error_of([&] { parse_stl("PK\x03\x04 not a mesh", "x.zip", 1.0, here); });
  EXPECT_NE(other.find("neither a binary STL"), std::string::npos) << other;
  const std::string missing = error_of([&] { read_stl(temp_file("does_not_exist.stl"), 1.0, here); });
  EXPECT_NE(missing.find("cannot open"), std::string::npos) << missing;
}

TEST(StlMesh, DegenerateFacetsAreDroppedAndCounted) {
  auto soup = test::icosphere({0, 0, 0}, 1, 1);
  const auto t = soup.facets[3];
  soup.facets.insert(soup.facets.begin() + 5, {t[0], t[0], t[1]});
  const std::string path = temp_file("degenerate.stl");
  test::write_binary_stl(soup, path);
  const TriangleMesh m = read_stl(path, 1.0, here);
  EXPECT_EQ(m.dropped_degenerate, 1);
  EXPECT_EQ(m.facets.size(), 80u);
  EXPECT_EQ(m.file_facet[5], 6);  // file order kept for messages
}

}  // namespace
}  // namespace yeegap::geometry
