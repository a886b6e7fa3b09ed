// Test helper: an icosphere (an icosahedron whose facets are split in four `levels` times, corners
// pushed onto the sphere), outward oriented, and STL writers (ASCII and binary) for it.
#pragma once

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <fstream>
#include <map>
#include <string>
#include <utility>
#include <vector>

#include "base/vec3.h"

namespace yeegap::geometry::test {

struct Soup {
  std::vector<std::array<Vec3, 3>> facets;  // corners in order, outward by the right-hand rule
};

inline Soup icosphere(Vec3 center, double radius, int levels) {
  const double t = (1 + std::sqrt(5.0)) / 2;
  std::vector<Vec3> v = {{-1, t, 0}, {1, t, 0}, {-1, -t, 0}, {1, -t, 0}, {0, -1, t}, {0, 1, t},
                         {0, -1, -t}, {0, 1, -t}, {t, 0, -1}, {t, 0, 1}, {-t, 0, -1}, {-t, 0, 1}};
  std::vector<std::array<int, 3>> f = {{0, 11, 5}, {0, 5, 1},  {0, 1, 7},   {0, 7, 10}, {0, 10, 11},
                                       {1, 5, 9},  {5, 11, 4}, {11, 10, 2}, {10, 7, 6}, {7, 1, 8},
                                       {3, 9, 4},  {3, 4, 2},  {3, 2, 6},   {3, 6, 8},  {3, 8, 9},
                                       {4, 9, 5},  {2, 4, 11}, {6, 2, 10},  {8, 6, 7},  {9, 8, 1}};
  for (Vec3& p : v) p = (1.0 / norm(p)) * p;
  for (int l = 0; l < levels; ++l) {
    std::map<std::pair<int, int>, int> mid;
    auto midpoint = [&](int a, int b) {
      const auto key = std::minmax(a, b);
      const auto it = mid.find(key);
      if (it != mid.end()) return it->second;
      const Vec3 m = 0.5 * (v[a] + v[b]);
      v.push_back((1.0 / norm(m)) * m);
      return mid[key] = static_cast<int>(v.size()) - 1;
    };
    std::vector<std::array<int, 3>> g;
    for (const auto& t3 : f) {
      const int a = midpoint(t3[0], t3[1]), b = midpoint(t3[1], t3[2]), c = midpoint(t3[2], t3[0]);
      g.push_back({t3[0], a, c});
      g.push_back({t3[1], b, a});
      g.push_back({t3[2], c, b});
      g.push_back({a, b, c});
    }
    f = std::move(g);
  }
  Soup s;
  for (const auto& t3 : f) s.facets.push_back({center + radius * v[t3[0]], center + radius * v[t3[1]], center + radius * v[t3[2]]});
  return s;
}

inline void write_ascii_stl(const Soup& s, const std::string& path) {
  std::ofstream out(path);
  out << "solid test sphere\n";
  char line[200];
  for (const auto& t : s.facets) {
    const Vec3 n = cross(t[1] - t[0], t[2] - t[0]);
    std::snprintf(line, sizeof line, "  facet normal %.6g %.6g %.6g\n    outer loop\n", n.x, n.y, n.z);
    out << line;
    for (const Vec3& p : t) {
      // Float precision, as in a binary file: %.9g round-trips a float.
      std::snprintf(line, sizeof line, "      vertex %.9g %.9g %.9g\n", static_cast<float>(p.x), static_cast<float>(p.y),
                    static_cast<float>(p.z));
      out << line;
    }
    out << "    endloop\n  endfacet\n";
  }
  out << "endsolid test sphere\n";
}

inline void write_binary_stl(const Soup& s, const std::string& path) {
  std::ofstream out(path, std::ios::binary);
  // The header starts with "solid", as some exporters write: the reader must still see binary.
  char header[80] = "solid but binary";
  out.write(header, 80);
  const std::uint32_t n = static_cast<std::uint32_t>(s.facets.size());
  out.write(reinterpret_cast<const char*>(&n), 4);  // little-endian machines only, fine for tests
  for (const auto& t : s.facets) {
    float rec[12] = {};
    for (int k = 0; k < 3; ++k)
      for (int a = 0; a < 3; ++a) rec[3 + 3 * k + a] = static_cast<float>(t[k][a]);
    out.write(reinterpret_cast<const char*>(rec), sizeof rec);
    const std::uint16_t attr = 0;
    out.write(reinterpret_cast<const char*>(&attr), 2);
  }
}

}  // namespace yeegap::geometry::test
