// STL reading and the closed-surface check (see stl_mesh.h). Binary STL: an 80-byte header, a
// little-endian uint32 facet count, then 50 bytes per facet (normal, three corners as float32, a
// uint16 attribute). ASCII: solid/facet normal/outer loop/vertex x3/endloop/endfacet/endsolid.
// Trap: binary files may also begin with "solid" in their header, so the size rule decides first.
#include "geometry/stl_mesh.h"

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <fstream>
#include <iterator>
#include <map>
#include <sstream>
#include <unordered_map>

#include <fmt/format.h>

#include "base/data_file.h"
#include "base/errors.h"

namespace yeegap::geometry {
namespace {

// How many offending facets a message lists before "and N more".
constexpr std::size_t listed_facets = 8;

// Welds corners with bit-identical coordinates (as written in the file) into one vertex.
class Welder {
 public:
  int index(double x, double y, double z) {
    // x + 0.0 turns -0.0 into +0.0, so the two zeros weld.
    const Key k{bits(x + 0.0), bits(y + 0.0), bits(z + 0.0)};
    const auto [it, fresh] = map_.try_emplace(k, static_cast<int>(points_.size()));
    if (fresh) points_.push_back({x, y, z});
    return it->second;
  }
  std::vector<Vec3> take() { return std::move(points_); }

 private:
  using Key = std::array<std::uint64_t, 3>;
  struct Hash {
    std::size_t operator()(const Key& k) const {
      std::size_t h = 1469598103934665603ULL;
      for (std::uint64_t v : k) h = (h ^ v) * 1099511628211ULL ^ (v >> 29);
      return h;
    }
  };
  static std::uint64_t bits(double v) {
    std::uint64_t b;
    std::memcpy(&b, &v, sizeof b);
    return b;
  }
  std::unordered_map<Key, int, Hash> map_;
  std::vector<Vec3> points_;
};

struct RawFacets {
  std::vector<std::array<double, 9>> corners;  // file units
};

bool is_binary(std::string_view b) {
  if (b.size() < 84) return false;
  std::uint32_t n = 0;
  for (int i = 3; i >= 0; --i) n = (n << 8) | static_cast<unsigned char>(b[80 + i]);
  return b.size() == 84 + 50ULL * n;
}

RawFacets parse_binary(std::string_view b) {
  RawFacets r;
  const std::size_t n = (b.size() - 84) / 50;
  r.corners.resize(n);
  for (std::size_t f = 0; f < n; ++f) {
    const char* rec = b.data() + 84 + 50 * f + 12;  // skip the normal
    for (int c = 0; c < 9; ++c) {
      std::uint32_t u = 0;
      for (int i = 3; i >= 0; --i) u = (u << 8) | static_cast<unsigned char>(rec[4 * c + i]);
      float v;
      std::memcpy(&v, &u, sizeof v);
      r.corners[f][c] = v;
    }
  }
  return r;
}

// Whitespace tokenizer that knows the line of each token, for messages.
class Tokens {
 public:
  explicit Tokens(std::string_view t) : t_(t) {}
  bool next(std::string_view& tok) {
    while (pos_ < t_.size() && std::isspace(static_cast<unsigned char>(t_[pos_]))) {
      if (t_[pos_] == '\n') ++line_;
      ++pos_;
    }
    if (pos_ >= t_.size()) return false;
    const std::size_t start = pos_;
    while (pos_ < t_.size() && !std::isspace(static_cast<unsigned char>(t_[pos_]))) ++pos_;
    tok = t_.substr(start, pos_ - start);
    return true;
  }
  /// Skips to the end of the current line (solid names may hold spaces).
  void skip_line() {
    while (pos_ < t_.size() && t_[pos_] != '\n') ++pos_;
  }
  int line() const { return line_; }

 private:
  std::string_view t_;
  std::size_t pos_ = 0;
  int line_ = 1;
};

RawFacets parse_ascii(std::string_view text, const std::string& name, const Where& where) {
  Tokens tk(text);
  std::string_view tok;
  auto fail = [&](const std::string& what) {
    throw SceneError(where, fmt::format("STL file '{}' line {}: {}", name, tk.line(), what));
  };
  auto expect = [&](std::string_view word) {
    if (!tk.next(tok)) fail(fmt::format("the file ends where '{}' was expected", word));
    if (tok != word) fail(fmt::format("expected '{}', found '{}'", word, tok));
  };
  auto number = [&]() {
    if (!tk.next(tok)) fail("the file ends where a number was expected");
    double v = 0;
    const char* end = tok.data() + tok.size();
    const auto [ptr, ec] = std::from_chars(tok.data(), end, v);
    if (ec != std::errc() || ptr != end) fail(fmt::format("expected a number, found '{}'", tok));
    return v;
  };
  RawFacets r;
  expect("solid");
  tk.skip_line();
  while (tk.next(tok)) {
    if (tok == "endsolid") {
      tk.skip_line();
      if (!tk.next(tok)) break;  // end of file
      if (tok != "solid") fail(fmt::format("expected 'solid' or the end of the file, found '{}'", tok));
      tk.skip_line();
      continue;
    }
    if (tok != "facet") fail(fmt::format("expected 'facet' or 'endsolid', found '{}'", tok));
    expect("normal");
    for (int i = 0; i < 3; ++i) number();
    expect("outer");
    expect("loop");
    std::array<double, 9> c{};
    for (int v = 0; v < 3; ++v) {
      expect("vertex");
      for (int i = 0; i < 3; ++i) c[3 * v + i] = number();
    }
    expect("endloop");
    expect("endfacet");
    r.corners.push_back(c);
  }
  return r;
}

std::uint64_t edge_key(int a, int b) { return (static_cast<std::uint64_t>(a) << 32) | static_cast<std::uint32_t>(b); }

std::string facet_list(std::vector<int> facets) {
  std::sort(facets.begin(), facets.end());
  facets.erase(std::unique(facets.begin(), facets.end()), facets.end());
  std::string s;
  for (std::size_t i = 0; i < facets.size() && i < listed_facets; ++i) s += (i ? ", " : "") + std::to_string(facets[i]);
  if (facets.size() > listed_facets) s += fmt::format(" and {} more", facets.size() - listed_facets);
  return s;
}

}  // namespace

double enclosed_volume(const TriangleMesh& m) {
  double v = 0;
  for (const auto& f : m.facets) v += dot(m.vertices[f[0]], cross(m.vertices[f[1]], m.vertices[f[2]]));
  return v / 6.0;
}

void check_closed_surface(const TriangleMesh& m, const std::string& name, const Where& where) {
  if (m.facets.size() < 4)
    throw SceneError(where, fmt::format("mesh '{}' has {} facets; a closed surface needs at least 4", name, m.facets.size()));
  // Undirected use count and the facets on each directed edge.
  std::unordered_map<std::uint64_t, std::vector<int>> directed;
  directed.reserve(3 * m.facets.size());
  for (std::size_t f = 0; f < m.facets.size(); ++f)
    for (int k = 0; k < 3; ++k) directed[edge_key(m.facets[f][k], m.facets[f][(k + 1) % 3])].push_back(static_cast<int>(f));
  std::vector<int> fins, open;
  std::map<int, std::vector<int>> against;  // facet -> facets that run the same way along a shared edge
  for (const auto& [key, fs] : directed) {
    const int a = static_cast<int>(key >> 32), b = static_cast<int>(key & 0xffffffffu);
    const auto rev = directed.find(edge_key(b, a));
    const std::size_t back = rev == directed.end() ? 0 : rev->second.size();
    if (fs.size() + back > 2) {
      for (int f : fs) fins.push_back(m.file_facet[f]);
    } else if (fs.size() == 2) {
      against[m.file_facet[fs[0]]].push_back(m.file_facet[fs[1]]);
      against[m.file_facet[fs[1]]].push_back(m.file_facet[fs[0]]);
    } else if (back == 0) {
      open.push_back(m.file_facet[fs[0]]);
    }
  }
  if (!fins.empty())
    throw SceneError(where, fmt::format("mesh '{}' is not a simple closed surface: some edges are shared by more than "
                                        "two facets, at facets {} (counted from 0 in file order)",
                                        name, facet_list(fins)));
  if (!against.empty()) {
    // A single flipped facet disagrees with all three neighbours; name the worst first.
    int worst = against.begin()->first;
    for (const auto& [f, others] : against)
      if (others.size() > against[worst].size()) worst = f;
    std::vector<int> all;
    for (const auto& [f, others] : against) all.push_back(f);
    throw SceneError(where, fmt::format("mesh '{}' has inconsistently oriented facets: facet {} runs along its shared "
                                        "edges in the same direction as facets {} (it is probably flipped); facets "
                                        "involved: {} (counted from 0 in file order)",
                                        name, worst, facet_list(against[worst]), facet_list(all)));
  }
  if (!open.empty())
    throw SceneError(where, fmt::format("mesh '{}' is not closed: {} edges belong to one facet only (a hole), at "
                                        "facets {} (counted from 0 in file order)",
                                        name, open.size(), facet_list(open)));
}

TriangleMesh parse_stl(std::string_view bytes, const std::string& name, double unit, const Where& where) {
  YG_CHECK(unit > 0, "mesh unit must be positive");
  std::size_t first = 0;
  while (first < bytes.size() && std::isspace(static_cast<unsigned char>(bytes[first]))) ++first;
  RawFacets raw;
  if (is_binary(bytes)) raw = parse_binary(bytes);
  else if (bytes.substr(first, 5) == "solid") raw = parse_ascii(bytes, name, where);
  else
    throw SceneError(where, fmt::format("'{}' is neither a binary STL file (84 + 50 n bytes) nor an ASCII one "
                                        "(beginning with 'solid')", name));
  TriangleMesh m;
  Welder weld;
  for (std::size_t f = 0; f < raw.corners.size(); ++f) {
    const auto& c = raw.corners[f];
    for (double v : c)
      if (!std::isfinite(v))
        throw SceneError(where, fmt::format("mesh '{}': facet {} has a coordinate that is not a finite number", name, f));
    std::array<int, 3> t{};
    for (int v = 0; v < 3; ++v) t[v] = weld.index(c[3 * v], c[3 * v + 1], c[3 * v + 2]);
    if (t[0] == t[1] || t[1] == t[2] || t[0] == t[2]) {
      ++m.dropped_degenerate;
      continue;
    }
    m.facets.push_back(t);
    m.file_facet.push_back(static_cast<int>(f));
  }
  m.vertices = weld.take();
  for (Vec3& v : m.vertices) v = unit * v;
  check_closed_surface(m, name, where);
  if (enclosed_volume(m) < 0)
    for (auto& t : m.facets) std::swap(t[1], t[2]);
  return m;
}

TriangleMesh read_stl(const std::string& path, double unit, const Where& where) {
  // 1 GiB: about 20 million facets in binary STL, far past what voxelising in a scene's set-up can use.
  const std::string bytes = read_data_file(path, "mesh file", std::uintmax_t{1} << 30, where);
  return parse_stl(bytes, path, unit, where);
}

}  // namespace yeegap::geometry
