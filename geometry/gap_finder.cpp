// Gap finder (see gap_finder.h). Gradients are central differences with a step far below the
// search width; projections onto a surface repeat p -= d(p) grad d(p) until |d| is negligible
// (one step for an exact distance, a few for a bound).
#include "geometry/gap_finder.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

constexpr double inf = std::numeric_limits<double>::infinity();
constexpr int max_projection_steps = 30;
constexpr int max_descent_steps = 200;
constexpr int golden_steps = 80;

struct Local {
  const Shape& s;
  double h;    // difference step, m
  double tol;  // a surface point has |d| below this, m

  Vec3 unit_gradient(const Vec3& p) const {
    Vec3 g;
    for (int a = 0; a < 3; ++a) {
      Vec3 lo = p, hi = p;
      lo[a] -= h;
      hi[a] += h;
      g[a] = s.signed_distance(hi) - s.signed_distance(lo);
    }
    const double n = norm(g);
    return n > 0 ? (1.0 / n) * g : Vec3{};
  }
  Vec3 project(Vec3 p) const {
    for (int i = 0; i < max_projection_steps; ++i) {
      const double d = s.signed_distance(p);
      if (std::abs(d) <= tol) break;
      p = p - d * unit_gradient(p);
    }
    return p;
  }
};

Aabb grown(const Aabb& b, double by) { return {b.lo - Vec3{by, by, by}, b.hi + Vec3{by, by, by}}; }

// Minimises d_B over the surface of A from the surface point qa: projected gradient steps, each
// with a bracketing and golden-section line search along the surface.
Vec3 descend(const Local& A, const Local& B, Vec3 qa, double first_step) {
  double step = first_step;
  double phi = B.s.signed_distance(qa);
  for (int it = 0; it < max_descent_steps; ++it) {
    const Vec3 n = A.unit_gradient(qa), g = B.unit_gradient(qa);
    const Vec3 v = g - dot(g, n) * n;  // d_B's slope along A's surface
    if (norm(v) < 1e-12) break;
    const Vec3 dir = (-1.0 / norm(v)) * v;
    auto along = [&](double t) { return B.s.signed_distance(A.project(qa + t * dir)); };
    double t = step, ft = along(t);
    if (ft < phi) {
      for (int grow = 0; grow < 60; ++grow) {  // expand while still going down
        const double f2 = along(2 * t);
        if (!(f2 < ft)) break;
        t *= 2;
        ft = f2;
      }
    } else {
      int shrink = 0;
      while (!(ft < phi) && shrink++ < 60) {
        t *= 0.5;
        ft = along(t);
      }
      if (!(ft < phi)) break;  // no descent left at this resolution
    }
    // The minimum lies in (0, 2t): golden section.
    double lo = 0, hi = 2 * t;
    const double r = 0.5 * (std::sqrt(5.0) - 1);
    double x1 = hi - r * (hi - lo), x2 = lo + r * (hi - lo), f1 = along(x1), f2 = along(x2);
    for (int k = 0; k < golden_steps && hi - lo > 1e-14 * t; ++k) {
      if (f1 < f2) {
        hi = x2, x2 = x1, f2 = f1;
        x1 = hi - r * (hi - lo), f1 = along(x1);
      } else {
        lo = x1, x1 = x2, f1 = f2;
        x2 = lo + r * (hi - lo), f2 = along(x2);
      }
    }
    const double best_t = f1 < f2 ? x1 : x2, best_f = std::min(f1, f2);
    if (!(best_f < phi)) break;
    const bool tiny = phi - best_f <= 1e-15 * std::abs(phi) + 1e-30;
    qa = A.project(qa + best_t * dir);
    phi = B.s.signed_distance(qa);
    step = best_t;
    if (tiny) break;
  }
  return qa;
}

}  // namespace

std::optional<Gap> find_gap(const Shape& a, const Shape& b, const GapSearch& search) {
  YG_CHECK(search.max_width > 0 && search.samples_per_axis >= 2 && search.seeds >= 1, "gap search settings");
  const Aabb ga = grown(a.bounds(), search.max_width), gb = grown(b.bounds(), search.max_width);
  Aabb box;
  for (int i = 0; i < 3; ++i) {
    box.lo[i] = std::max({ga.lo[i], gb.lo[i], search.region.lo[i]});
    box.hi[i] = std::min({ga.hi[i], gb.hi[i], search.region.hi[i]});
    if (!(box.lo[i] <= box.hi[i])) return std::nullopt;
    YG_CHECK(std::isfinite(box.lo[i]) && std::isfinite(box.hi[i]), "gap search needs a bounded region");
  }
  // Sample d_A + d_B at the centres of a lattice over the box.
  const int n = search.samples_per_axis;
  const Vec3 cell = (1.0 / n) * (box.hi - box.lo);
  struct Sample {
    double f;
    Vec3 p;
  };
  std::vector<Sample> samples;
  samples.reserve(static_cast<std::size_t>(n) * n * n);
  for (int k = 0; k < n; ++k)
    for (int j = 0; j < n; ++j)
      for (int i = 0; i < n; ++i) {
        const Vec3 p = box.lo + Vec3{(i + 0.5) * cell.x, (j + 0.5) * cell.y, (k + 0.5) * cell.z};
        samples.push_back({a.signed_distance(p) + b.signed_distance(p), p});
      }
  // d_A + d_B <= gap + 2 |p - p*| near the nearest points p*, so the best sample is at most one
  // cell diagonal above the gap. Only samples that close to a reportable gap can seed (or mark an
  // overlap): sorting just those keeps a scene of hundreds of bodies fast.
  const double slack = norm(cell);
  samples.erase(std::partition(samples.begin(), samples.end(),
                               [&](const Sample& s) { return s.f <= search.max_width + slack; }),
                samples.end());
  if (samples.empty()) return std::nullopt;
  std::sort(samples.begin(), samples.end(), [](const Sample& u, const Sample& v) { return u.f < v.f; });
  if (samples.front().f > search.max_width + slack) return std::nullopt;
  if (samples.front().f < 0) {  // overlapping: a point inside both
    Gap g;
    g.width = samples.front().f;
    g.point_a = g.point_b = samples.front().p;
    return g;
  }

  const double h = 1e-6 * search.max_width;
  const Local A{a, h, 1e-12 * search.max_width}, B{b, h, 1e-12 * search.max_width};
  std::optional<Gap> best;
  int used = 0;
  std::vector<Vec3> seeds;
  for (const Sample& s : samples) {
    if (used >= search.seeds || s.f > search.max_width + slack) break;
    // Seeds at least two sample cells apart, so they explore different places.
    if (std::any_of(seeds.begin(), seeds.end(), [&](const Vec3& q) { return norm(q - s.p) < 2 * slack; })) continue;
    seeds.push_back(s.p);
    ++used;
    const Vec3 qa = descend(A, B, A.project(s.p), 0.1 * slack);
    Gap g;
    g.point_a = qa;
    g.point_b = B.project(qa);
    g.width = b.signed_distance(qa);
    if (!best || g.width < best->width) best = g;
  }
  if (!best || best->width >= search.max_width) return std::nullopt;
  return best;
}

std::vector<Gap> find_gaps(const std::vector<ShapePtr>& bodies, const GapSearch& search) {
  // Sweep along x: with the boxes (grown by the widest gap) sorted by their low x, a pair can only
  // hold a gap while the second starts before the first ends, so an array of n bodies costs about
  // n neighbours each, not n^2 searches.
  const std::size_t n = bodies.size();
  std::vector<Aabb> boxes(n);
  for (std::size_t i = 0; i < n; ++i) boxes[i] = grown(bodies[i]->bounds(), search.max_width);
  std::vector<std::size_t> order(n);
  for (std::size_t i = 0; i < n; ++i) order[i] = i;
  std::sort(order.begin(), order.end(), [&](std::size_t u, std::size_t v) { return boxes[u].lo.x < boxes[v].lo.x; });
  auto overlap = [&](std::size_t u, std::size_t v) {
    for (int a = 0; a < 3; ++a)
      if (boxes[u].hi[a] < boxes[v].lo[a] || boxes[v].hi[a] < boxes[u].lo[a]) return false;
    return true;
  };
  std::vector<Gap> out;
  for (std::size_t p = 0; p < n; ++p)
    for (std::size_t q = p + 1; q < n && !(boxes[order[q]].lo.x > boxes[order[p]].hi.x); ++q) {
      const std::size_t i = std::min(order[p], order[q]), j = std::max(order[p], order[q]);
      if (!overlap(i, j)) continue;
      auto g = find_gap(*bodies[i], *bodies[j], search);
      if (!g || !(g->width > 0)) continue;
      g->body_a = static_cast<int>(i);
      g->body_b = static_cast<int>(j);
      out.push_back(*g);
    }
  // In body order, as before: the listing and the mesh do not depend on the sweep.
  std::sort(out.begin(), out.end(),
            [](const Gap& u, const Gap& v) { return u.body_a != v.body_a ? u.body_a < v.body_a : u.body_b < v.body_b; });
  return out;
}

void add_gap_refinement(MeshRequest& request, const Gap& gap, int cells_across) {
  YG_CHECK(cells_across >= 1 && gap.width > 0, "a gap refinement needs a positive width and cells across");
  RefineZone z;
  for (int a = 0; a < 3; ++a) {
    z.box.lo[a] = std::min(gap.point_a[a], gap.point_b[a]);
    z.box.hi[a] = std::max(gap.point_a[a], gap.point_b[a]);
    const double extent = z.box.hi[a] - z.box.lo[a];
    // An axis nearly along the gap's faces needs no cells across it. Along a tilted axis the gap
    // is wider than its width (width / |cos| between the faces, width^2 / extent), so its cells are
    // too: a diagonal gap gets no finer cells than a straight one of the same width.
    if (extent > 0.2 * gap.width) {
      z.step[a] = gap.width * gap.width / extent / cells_across;
      request.gap_interfaces[a].push_back(gap.point_a[a]);
      request.gap_interfaces[a].push_back(gap.point_b[a]);
    } else {
      z.step[a] = inf;
    }
  }
  request.zones.push_back(z);
}

}  // namespace yeegap::geometry
