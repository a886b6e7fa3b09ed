// Triangle meshes from STL files (ASCII or binary, told apart by the binary size rule), welded into
// shared vertices and checked to bound a solid: every edge shared by exactly two facets (no hole,
// no fin) that run along it in opposite directions (consistent orientation). A mesh that fails is
// refused naming the offending facets, counted from 0 in file order. The facet normals written in
// the file are ignored: the vertex order (right-hand rule, outward) is what STL defines.
#pragma once

#include <array>
#include <string>
#include <string_view>
#include <vector>

#include "base/vec3.h"
#include "base/where.h"

namespace yeegap::geometry {

struct TriangleMesh {
  std::vector<Vec3> vertices;                // m
  std::vector<std::array<int, 3>> facets;    // vertex indices, counter-clockwise seen from outside
  std::vector<int> file_facet;               // index of each facet in the file (degenerate ones dropped)
  int dropped_degenerate = 0;                // facets with two equal corners, left out
};

/// Reads an STL file; coordinates are multiplied by `unit` (metres per file unit, e.g. 1e-9 for a
/// file in nm). Throws SceneError at `where` if the file cannot be read or parsed, or if the mesh
/// is not closed and consistently oriented (check_closed_surface). A mesh oriented inwards
/// everywhere (negative enclosed volume) is turned outwards.
TriangleMesh read_stl(const std::string& path, double unit, const Where& where);
/// The same from the bytes of a file; `name` is used in messages.
TriangleMesh parse_stl(std::string_view bytes, const std::string& name, double unit, const Where& where);

/// Throws SceneError at `where` unless every edge belongs to exactly two facets that traverse it in
/// opposite directions. The message names the facets (file order, from 0).
void check_closed_surface(const TriangleMesh& mesh, const std::string& name, const Where& where);

/// Enclosed volume (m^3) by the divergence theorem; positive for an outward-oriented closed mesh.
double enclosed_volume(const TriangleMesh& mesh);

}  // namespace yeegap::geometry
