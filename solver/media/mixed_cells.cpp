// Mixed E locations for subcell averaging (see mixed_cells.h).
#include "solver/media/mixed_cells.h"

#include <algorithm>
#include <cmath>

#include "base/errors.h"
#include "geometry/fill_fraction.h"
#include "geometry/surface_normal.h"

namespace yeegap::solver {

namespace {

// A fill fraction this close to 0 or 1 is a box the surface only grazes (round-off of a face that
// lies on the box edge): the location stays staircased.
constexpr double fill_tolerance = 1e-6;

// Material under body `top` at p: the last earlier body containing p, else the background.
int material_below(const Scene& s, std::size_t top, const Vec3& p) {
  for (std::size_t b = top; b-- > 0;) {
    const geometry::Aabb box = s.bodies[b].shape->bounds();
    if (p.x < box.lo.x || p.y < box.lo.y || p.z < box.lo.z || p.x > box.hi.x || p.y > box.hi.y || p.z > box.hi.z) continue;
    if (s.bodies[b].shape->contains(p)) return s.bodies[b].material;
  }
  return s.domain.background;
}

bool overlaps(const geometry::Aabb& a, const geometry::Aabb& b) {
  for (int ax = 0; ax < 3; ++ax)
    if (a.hi[ax] < b.lo[ax] || b.hi[ax] < a.lo[ax]) return false;
  return true;
}

}  // namespace

geometry::Aabb averaging_box(const Grid& g, Component c, int i, int j, int k) {
  const std::array<int, 3> idx{i, j, k};
  geometry::Aabb box;
  for (int a = 0; a < 3; ++a) {
    const int n = g.n[a];
    if (staggered(c, a)) {
      box.lo[a] = g.nodes[a][idx[a]];
      box.hi[a] = g.nodes[a][idx[a] + 1];
    } else {
      const double x = g.nodes[a][idx[a]];
      const int before = idx[a] > 0 ? idx[a] - 1 : (g.periodic[a] ? n - 1 : 0);
      box.lo[a] = x - 0.5 * g.primal(a, before);
      box.hi[a] = x + 0.5 * g.primal(a, std::min(idx[a], n - 1));
    }
  }
  return box;
}

BoxCrossing find_box_crossing(const Scene& s, const std::vector<geometry::Aabb>& bounds, const geometry::Aabb& box,
                              const Vec3& p) {
  const int wall = static_cast<int>(s.materials.size());
  // The tunnelling-gap medium is the last material when it exists (tunnelling_cells.h).
  const int gap = (!s.tunnelling.empty() && s.tunnelling[0].quantum) ? wall - 1 : -1;
  auto averageable = [&](int m) { return m != gap && m < wall && !s.materials[m].perfect_conductor; };
  const double half_diagonal = 0.5 * norm(box.hi - box.lo);
  for (std::size_t b = s.bodies.size(); b-- > 0;) {
    if (!overlaps(bounds[b], box)) continue;
    const geometry::Shape& shape = *s.bodies[b].shape;
    const double d = shape.signed_distance(p);
    if (d <= -half_diagonal) return {};  // the box lies wholly in this body: it covers all below
    if (d >= half_diagonal) continue;    // the surface cannot reach the box
    const double f = geometry::fill_fraction(shape, box);
    if (f >= 1 - fill_tolerance) return {};
    if (f <= fill_tolerance) continue;
    const double smallest = std::min({box.hi.x - box.lo.x, box.hi.y - box.lo.y, box.hi.z - box.lo.z});
    const Vec3 n = geometry::surface_normal(shape, p, 1e-3 * smallest);
    // The medium outside this body is looked up a quarter cell beyond its surface, not at p: p may
    // lie on the surface itself (a film face on a grid node), where which earlier body holds p is
    // decided by round-off of the node's coordinate. That once made a gold film's top face
    // staircased or averaged depending on where the domain began, moving an SPR dip by 1 deg.
    const Vec3 beyond = norm(n) > 0 ? p + n * (0.25 * smallest - d) : p;
    BoxCrossing x;
    x.inside = s.bodies[b].material;
    x.outside = material_below(s, b, beyond);
    x.kind = x.inside != x.outside && averageable(x.inside) && averageable(x.outside) ? BoxCrossing::Kind::averaged
                                                                                      : BoxCrossing::Kind::foreign;
    x.fill = f;
    x.normal = n;
    return x;
  }
  return {};
}

std::vector<MixedCell> find_mixed_cells(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi) {
  const int wall = static_cast<int>(s.materials.size());
  const int gap = (!s.tunnelling.empty() && s.tunnelling[0].quantum) ? wall - 1 : -1;
  auto averageable = [&](int m) { return m != gap && m < wall && !s.materials[m].perfect_conductor; };
  std::vector<geometry::Aabb> bounds;
  for (const BodySpec& b : s.bodies) bounds.push_back(b.shape->bounds());

  std::vector<MixedCell> out;
  for (int c = 0; c < 3; ++c) {
    const auto comp = static_cast<Component>(c);
    std::vector<std::vector<MixedCell>> per_plane(L.n[2]);  // joined in order: same list for any thread count
#pragma omp parallel for schedule(dynamic)
    for (int k = 0; k < L.n[2]; ++k)
      for (int j = 0; j < L.n[1]; ++j)
        for (int i = 0; i < L.n[0]; ++i) {
          const std::ptrdiff_t o = L.at(i, j, k);
          if (!averageable(mi.e[c][o])) continue;
          const BoxCrossing x = find_box_crossing(s, bounds, averaging_box(g, comp, i, j, k), yee_position(g, comp, i, j, k));
          if (x.kind != BoxCrossing::Kind::averaged) continue;
          // The staircase material here may be neither of the pair: a location exactly on the face
          // two slabs share is inside neither (signed distance 0), so the map gives it the
          // background. It is averaged all the same (its own coefficients only recover the curl,
          // subcell_average.h); keeping its staircase put a cell of buffer between a prism and its
          // chromium layer. Without a normal (p where surface directions cancel) the three
          // components share it equally.
          const double share = norm(x.normal) > 0 ? x.normal[c] * x.normal[c] : 1.0 / 3.0;
          per_plane[k].push_back({comp, o, x.inside, x.outside, x.fill, share, x.normal});
        }
    for (auto& v : per_plane) out.insert(out.end(), v.begin(), v.end());
  }
  return out;
}

}  // namespace yeegap::solver
