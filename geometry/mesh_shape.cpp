// Mesh distance (see mesh_shape.h). Nearest point on a triangle with its feature: C. Ericson,
// Real-Time Collision Detection (Morgan Kaufmann 2005), section 5.1.5. The hierarchy splits facets
// at the median centroid along the longest axis, 4 facets per leaf; a query visits the nearer child
// first and skips boxes farther than the best distance so far.
#include "geometry/mesh_shape.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <unordered_map>

#include "base/constants.h"
#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

constexpr int leaf_size = 4;
// Coarse cells along the longest side of the mesh's box, for the far-field bound (mesh_shape.h).
constexpr int coarse_cells = 16;
constexpr double inf = std::numeric_limits<double>::infinity();

Vec3 unit_or_zero(Vec3 v) {
  const double n = norm(v);
  return n > 0 ? (1.0 / n) * v : Vec3{};
}

double angle_between(Vec3 u, Vec3 v) {
  const double nu = norm(u), nv = norm(v);
  if (!(nu > 0 && nv > 0)) return 0;
  return std::acos(std::clamp(dot(u, v) / (nu * nv), -1.0, 1.0));
}

double box_distance2(const double* lo, const double* hi, const double* p) {
  double s = 0;
  for (int a = 0; a < 3; ++a) {
    const double d = std::max(std::max(lo[a] - p[a], p[a] - hi[a]), 0.0);
    s += d * d;
  }
  return s;
}

// Nearest point on triangle abc to p; `feature` 0..2 = vertex a, b, c; 3..5 = edge ab, bc, ca; 6 = face.
Vec3 closest_on_triangle(const Vec3& p, const Vec3& a, const Vec3& b, const Vec3& c, int& feature) {
  const Vec3 ab = b - a, ac = c - a, ap = p - a;
  const double d1 = dot(ab, ap), d2 = dot(ac, ap);
  if (d1 <= 0 && d2 <= 0) return feature = 0, a;
  const Vec3 bp = p - b;
  const double d3 = dot(ab, bp), d4 = dot(ac, bp);
  if (d3 >= 0 && d4 <= d3) return feature = 1, b;
  const double vc = d1 * d4 - d3 * d2;
  if (vc <= 0 && d1 >= 0 && d3 <= 0) return feature = 3, a + (d1 / (d1 - d3)) * ab;
  const Vec3 cp = p - c;
  const double d5 = dot(ab, cp), d6 = dot(ac, cp);
  if (d6 >= 0 && d5 <= d6) return feature = 2, c;
  const double vb = d5 * d2 - d1 * d6;
  if (vb <= 0 && d2 >= 0 && d6 <= 0) return feature = 5, a + (d2 / (d2 - d6)) * ac;
  const double va = d3 * d6 - d5 * d4;
  if (va <= 0 && d4 - d3 >= 0 && d5 - d6 >= 0) return feature = 4, b + ((d4 - d3) / ((d4 - d3) + (d5 - d6))) * (c - b);
  const double denom = 1.0 / (va + vb + vc);
  feature = 6;
  return a + (vb * denom) * ab + (vc * denom) * ac;
}

std::uint64_t edge_key(int a, int b) {
  return (static_cast<std::uint64_t>(std::min(a, b)) << 32) | static_cast<std::uint32_t>(std::max(a, b));
}

}  // namespace

MeshShape::MeshShape(const TriangleMesh& m) {
  YG_CHECK(!m.facets.empty(), "a mesh shape needs facets");
  const std::size_t nf = m.facets.size();
  std::vector<Vec3> face_n(nf);
  for (std::size_t f = 0; f < nf; ++f) {
    const auto& t = m.facets[f];
    face_n[f] = unit_or_zero(cross(m.vertices[t[1]] - m.vertices[t[0]], m.vertices[t[2]] - m.vertices[t[0]]));
  }
  // Vertex pseudonormals: incident face normals weighted by the facet's angle at the vertex.
  std::vector<Vec3> vertex_n(m.vertices.size());
  // Edge pseudonormals: the sum of the two facets' normals.
  std::unordered_map<std::uint64_t, Vec3> edge_n;
  edge_n.reserve(3 * nf);
  for (std::size_t f = 0; f < nf; ++f) {
    const auto& t = m.facets[f];
    for (int k = 0; k < 3; ++k) {
      const Vec3 v = m.vertices[t[k]], prev = m.vertices[t[(k + 2) % 3]], next = m.vertices[t[(k + 1) % 3]];
      vertex_n[t[k]] = vertex_n[t[k]] + angle_between(next - v, prev - v) * face_n[f];
      Vec3& e = edge_n[edge_key(t[k], t[(k + 1) % 3])];
      e = e + face_n[f];
    }
  }
  tri_.resize(nf);
  normals_.resize(nf);
  for (std::size_t f = 0; f < nf; ++f) {
    const auto& t = m.facets[f];
    tri_[f] = {m.vertices[t[0]], m.vertices[t[1]], m.vertices[t[2]], static_cast<int>(f)};
    Normals& r = normals_[f];
    r.face = face_n[f];
    for (int k = 0; k < 3; ++k) {
      r.edge[k] = edge_n[edge_key(t[k], t[(k + 1) % 3])];
      r.vertex[k] = vertex_n[t[k]];
    }
  }
  nodes_.reserve(2 * nf / leaf_size + 2);
  build(0, static_cast<int>(nf));
  for (int a = 0; a < 3; ++a) {
    bounds_.lo[a] = nodes_[0].lo[a];
    bounds_.hi[a] = nodes_[0].hi[a];
  }
  const Vec3 extent = bounds_.hi - bounds_.lo;
  coarse_step_ = std::max({extent.x, extent.y, extent.z}) / coarse_cells;
  // A mesh whose corners all round to one point (coordinates of 1e-316 nm: found by fuzzing) has
  // no extent: a mistake in the file or its unit, not our invariant.
  if (!(coarse_step_ > 0 && std::isfinite(coarse_step_)))
    throw SceneError(Where{}, fmt::format("the mesh has no extent once scaled (its box is {:g} x {:g} x {:g} m): "
                                          "check the file's coordinates and the unit given for them",
                                          extent.x, extent.y, extent.z));
  band_ = std::sqrt(3.0) * coarse_step_;
  coarse_lo_ = bounds_.lo;
  for (int a = 0; a < 3; ++a) coarse_n_[a] = std::max(1, static_cast<int>(std::ceil(extent[a] / coarse_step_ - 1e-9)));
  coarse_d_.resize(static_cast<std::size_t>(coarse_n_[0] + 1) * (coarse_n_[1] + 1) * (coarse_n_[2] + 1));
  std::size_t at = 0;
  for (int k = 0; k <= coarse_n_[2]; ++k)
    for (int j = 0; j <= coarse_n_[1]; ++j)
      for (int i = 0; i <= coarse_n_[0]; ++i)
        coarse_d_[at++] = exact_signed_distance(coarse_lo_ + coarse_step_ * Vec3{double(i), double(j), double(k)});
}

int MeshShape::build(int first, int count) {
  const int id = static_cast<int>(nodes_.size());
  nodes_.emplace_back();
  Aabb box{{inf, inf, inf}, {-inf, -inf, -inf}}, cbox = box;
  for (int i = first; i < first + count; ++i) {
    const Tri& t = tri_[i];
    const Vec3 centroid = (1.0 / 3.0) * (t.a + t.b + t.c);
    for (int a = 0; a < 3; ++a) {
      box.lo[a] = std::min({box.lo[a], t.a[a], t.b[a], t.c[a]});
      box.hi[a] = std::max({box.hi[a], t.a[a], t.b[a], t.c[a]});
      cbox.lo[a] = std::min(cbox.lo[a], centroid[a]);
      cbox.hi[a] = std::max(cbox.hi[a], centroid[a]);
    }
  }
  for (int a = 0; a < 3; ++a) {
    nodes_[id].lo[a] = box.lo[a];
    nodes_[id].hi[a] = box.hi[a];
  }
  if (count <= leaf_size) {
    nodes_[id].first = first;
    nodes_[id].count = count;
    return id;
  }
  int axis = 0;
  for (int a = 1; a < 3; ++a)
    if (cbox.hi[a] - cbox.lo[a] > cbox.hi[axis] - cbox.lo[axis]) axis = a;
  const int half = count / 2;
  std::nth_element(tri_.begin() + first, tri_.begin() + first + half, tri_.begin() + first + count,
                   [axis](const Tri& u, const Tri& v) { return u.a[axis] + u.b[axis] + u.c[axis] < v.a[axis] + v.b[axis] + v.c[axis]; });
  const int left = build(first, half);
  const int right = build(first + half, count - half);
  nodes_[id].left = left;
  nodes_[id].right = right;
  return id;
}

double MeshShape::signed_distance(const Vec3& p) const {
  const double pa[3] = {p.x, p.y, p.z};
  const double lo[3] = {bounds_.lo.x, bounds_.lo.y, bounds_.lo.z}, hi[3] = {bounds_.hi.x, bounds_.hi.y, bounds_.hi.z};
  const double outside2 = box_distance2(lo, hi, pa);
  if (outside2 > 0) {
    // Outside the box is outside the body, at least the box distance away.
    const double bd = std::sqrt(outside2);
    if (bd >= band_) return bd;
  } else {
    std::array<int, 3> c{};
    for (int a = 0; a < 3; ++a)
      c[a] = std::clamp(static_cast<int>((p[a] - coarse_lo_[a]) / coarse_step_), 0, coarse_n_[a] - 1);
    double bound = -inf, sign = 1;
    for (int corner = 0; corner < 8; ++corner) {
      const int i = c[0] + (corner & 1), j = c[1] + ((corner >> 1) & 1), k = c[2] + ((corner >> 2) & 1);
      const double d = coarse_d_[(static_cast<std::size_t>(k) * (coarse_n_[1] + 1) + j) * (coarse_n_[0] + 1) + i];
      const double b = std::abs(d) - norm(p - (coarse_lo_ + coarse_step_ * Vec3{double(i), double(j), double(k)}));
      if (b > bound) bound = b, sign = d < 0 ? -1 : 1;
    }
    if (bound >= band_) return sign * bound;
  }
  return exact_signed_distance(p);
}

double MeshShape::exact_signed_distance(const Vec3& p) const {
  const double pa[3] = {p.x, p.y, p.z};
  double best2 = inf;
  Vec3 best_q;
  int best_tri = 0, best_feature = 6;
  // Stack of (node, squared box distance), so each box distance is computed once.
  struct Entry {
    int node;
    double d2;
  };
  Entry stack[128];
  int top = 0;
  stack[top++] = {0, box_distance2(nodes_[0].lo, nodes_[0].hi, pa)};
  while (top > 0) {
    const Entry e = stack[--top];
    if (e.d2 >= best2) continue;
    const Node& n = nodes_[e.node];
    if (n.left < 0) {
      for (int i = n.first; i < n.first + n.count; ++i) {
        const Tri& t = tri_[i];
        int feature = 6;
        const Vec3 q = closest_on_triangle(p, t.a, t.b, t.c, feature);
        const Vec3 d = p - q;
        const double d2 = dot(d, d);
        if (d2 < best2) {
          best2 = d2;
          best_q = q;
          best_tri = t.id;
          best_feature = feature;
        }
      }
      continue;
    }
    // Push the farther child first so the nearer one is searched first.
    const Node& l = nodes_[n.left];
    const Node& r = nodes_[n.right];
    const double dl = box_distance2(l.lo, l.hi, pa), dr = box_distance2(r.lo, r.hi, pa);
    YG_ASSERT(top + 2 <= 128, "mesh hierarchy deeper than the query stack");
    if (dl < dr) {
      if (dr < best2) stack[top++] = {n.right, dr};
      if (dl < best2) stack[top++] = {n.left, dl};
    } else {
      if (dl < best2) stack[top++] = {n.left, dl};
      if (dr < best2) stack[top++] = {n.right, dr};
    }
  }
  const Normals& nb = normals_[best_tri];
  const Vec3 n = best_feature < 3 ? nb.vertex[best_feature] : (best_feature < 6 ? nb.edge[best_feature - 3] : nb.face);
  const double dist = std::sqrt(best2);
  return dot(p - best_q, n) < 0 ? -dist : dist;
}

double MeshShape::winding_number(const Vec3& p) const {
  // Solid angle of each facet (A. van Oosterom and J. Strackee, IEEE Trans. Biomed. Eng. 30, 125
  // (1983)): tan(Omega/2) = a.(b x c) / (|a||b||c| + (a.b)|c| + (b.c)|a| + (c.a)|b|).
  double total = 0;
  for (const Tri& t : tri_) {
    const Vec3 a = t.a - p, b = t.b - p, c = t.c - p;
    const double la = norm(a), lb = norm(b), lc = norm(c);
    const double num = dot(a, cross(b, c));
    const double den = la * lb * lc + dot(a, b) * lc + dot(b, c) * la + dot(c, a) * lb;
    total += 2 * std::atan2(num, den);
  }
  return total / (4 * constants::pi);
}

ShapePtr load_mesh_shape(const std::string& path, double unit, const Where& where) {
  TriangleMesh mesh = read_stl(path, unit, where);
  try {
    return std::make_shared<MeshShape>(mesh);
  } catch (const SceneError& e) {
    // MeshShape knows no file: name the mesh file and the scene key that reads it.
    throw SceneError(where, fmt::format("{}: {}", path, e.message()));
  }
}

}  // namespace yeegap::geometry
