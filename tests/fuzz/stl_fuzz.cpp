// Fuzzes the STL reader (geometry/stl_mesh.h), ASCII and binary, and the shape a mesh body is made
// into (geometry/mesh_shape.h), as `shape: mesh` does. A mesh the reader accepts as closed must make
// a shape without tripping its YG_CHECKs, and the shape must answer distance queries.
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "base/where.h"
#include "fuzz_support.h"
#include "geometry/mesh_shape.h"
#include "geometry/stl_mesh.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace yeegap::geometry;
  const std::string_view bytes(reinterpret_cast<const char*>(data), size);
  const yeegap::Where where{"scene.yaml", 3, 5, "bodies[0].file"};
  yeegap::fuzz::expect_only_user_errors([&] {
    const TriangleMesh mesh = parse_stl(bytes, "fuzz.stl", 1e-9, where);  // a file in nm
    const MeshShape shape(mesh);
    const Aabb box = shape.bounds();
    shape.signed_distance(0.5 * (box.lo + box.hi));
    shape.signed_distance(box.lo);
    shape.winding_number(box.hi);
  });
  return 0;
}
