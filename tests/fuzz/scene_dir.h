// The folder the scene fuzz targets pretend their scene lives in. It holds a small n,k table and a
// closed STL mesh, so a fuzzed scene naming 'table.csv' or 'mesh.stl' reaches the table fit and the
// mesh import as a real scene would. Made once per process under the temp folder, removed at exit.
#pragma once

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>

#include <unistd.h>

namespace yeegap::fuzz {

namespace detail {

// Gold-like optical constants, enough rows for the default fit (1 Drude + 2 Lorentz poles).
constexpr const char* scene_table = R"(wavelength_nm,n,k
400,1.47,1.95
450,1.38,1.91
500,0.97,1.87
550,0.43,2.46
600,0.25,2.98
650,0.17,3.47
700,0.16,3.95
800,0.15,4.91
900,0.17,5.73
1000,0.22,6.42
)";

// A closed, outward tetrahedron in nm (the scene's mesh block gives the unit).
constexpr const char* scene_mesh = R"(solid tet
facet normal 0 0 -1
outer loop
vertex 0 0 0
vertex 0 20 0
vertex 20 0 0
endloop
endfacet
facet normal 0 -1 0
outer loop
vertex 0 0 0
vertex 20 0 0
vertex 0 0 20
endloop
endfacet
facet normal -1 0 0
outer loop
vertex 0 0 0
vertex 0 0 20
vertex 0 20 0
endloop
endfacet
facet normal 1 1 1
outer loop
vertex 20 0 0
vertex 0 20 0
vertex 0 0 20
endloop
endfacet
endsolid tet
)";

inline std::filesystem::path& scene_folder() {
  static std::filesystem::path folder;
  return folder;
}

inline void remove_scene_folder() {
  std::error_code ec;
  std::filesystem::remove_all(scene_folder(), ec);
}

}  // namespace detail

/// "<folder>/scene.yaml": the file label to read fuzzed scene text under.
inline const std::string& scene_label() {
  static const std::string label = [] {
    namespace fs = std::filesystem;
    fs::path& folder = detail::scene_folder();
    folder = fs::temp_directory_path() / ("yeegap_fuzz_" + std::to_string(::getpid()));
    fs::create_directories(folder);
    std::ofstream(folder / "table.csv") << detail::scene_table;
    std::ofstream(folder / "mesh.stl") << detail::scene_mesh;
    std::atexit(detail::remove_scene_folder);
    return (folder / "scene.yaml").string();
  }();
  return label;
}

}  // namespace yeegap::fuzz
