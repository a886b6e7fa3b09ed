// Binned body lookup (see body_lookup.h). About two bins per body along each axis of the bodies'
// own spread (at most 64 per axis) keeps each bin's list short without a large table; a body's box
// is widened by a hair when binned so a point on a bin edge still sees the bodies touching it.
#include "solver/media/body_lookup.h"

#include <algorithm>
#include <cmath>

namespace yeegap::solver {

BodyLookup::BodyLookup(const Scene& s, const geometry::Aabb& region) : scene_(s), region_(region) {
  const int n = static_cast<int>(s.bodies.size());
  boxes_.reserve(s.bodies.size());
  for (const BodySpec& b : s.bodies) boxes_.push_back(b.shape->bounds());
  for (int i = n - 1; i >= 0; --i) all_bodies_.push_back(i);
  bool usable = n > 8;
  for (int a = 0; a < 3; ++a) usable = usable && std::isfinite(region.lo[a]) && std::isfinite(region.hi[a]) && region.hi[a] > region.lo[a];
  if (!usable) return;
  const int per_axis = std::clamp(static_cast<int>(std::ceil(2 * std::cbrt(n))), 1, 64);
  bins_ = {per_axis, per_axis, per_axis};
  bin_bodies_.resize(static_cast<std::size_t>(per_axis) * per_axis * per_axis);
  for (int body = n - 1; body >= 0; --body) {
    std::array<int, 3> lo{}, hi{};
    bool inside = true;
    for (int a = 0; a < 3; ++a) {
      const double width = region.hi[a] - region.lo[a], hair = 1e-9 * width;
      const double b0 = (boxes_[body].lo[a] - hair - region.lo[a]) / width * bins_[a];
      const double b1 = (boxes_[body].hi[a] + hair - region.lo[a]) / width * bins_[a];
      if (b1 < 0 || b0 >= bins_[a]) inside = false;
      lo[a] = static_cast<int>(std::clamp(std::floor(b0), 0.0, bins_[a] - 1.0));
      hi[a] = static_cast<int>(std::clamp(std::floor(b1), 0.0, bins_[a] - 1.0));
    }
    if (!inside) continue;
    for (int k = lo[2]; k <= hi[2]; ++k)
      for (int j = lo[1]; j <= hi[1]; ++j)
        for (int i = lo[0]; i <= hi[0]; ++i)
          bin_bodies_[(static_cast<std::size_t>(k) * bins_[1] + j) * bins_[0] + i].push_back(body);
  }
}

const std::vector<int>& BodyLookup::candidates(const Vec3& p) const {
  if (bin_bodies_.empty()) return all_bodies_;
  std::array<int, 3> at{};
  for (int a = 0; a < 3; ++a) {
    const double f = (p[a] - region_.lo[a]) / (region_.hi[a] - region_.lo[a]) * bins_[a];
    if (!(f >= 0 && f < bins_[a])) return all_bodies_;
    at[a] = static_cast<int>(f);
  }
  return bin_bodies_[(static_cast<std::size_t>(at[2]) * bins_[1] + at[1]) * bins_[0] + at[0]];
}

namespace {

// The last body holding p among `ids` (last body first), `box(i)` its bounding box.
template <class Ids, class Box>
int resolve(const Scene& s, const Vec3& p, const Ids& ids, const Box& box) {
  int on_faces = 0, last_on_face = -1;
  for (int i : ids) {
    const geometry::Aabb& b = box(i);
    if (p.x < b.lo.x || p.y < b.lo.y || p.z < b.lo.z || p.x > b.hi.x || p.y > b.hi.y || p.z > b.hi.z) continue;
    const BodySpec& body = s.bodies[static_cast<std::size_t>(i)];
    const double d = body.shape->signed_distance(p);
    if (d < 0) return body.material;
    if (d == 0 && on_faces++ == 0) last_on_face = body.material;
  }
  // A point exactly on a face that two bodies share (a film face on a grid node of a graded mesh,
  // which pins nodes to slab faces) is strictly inside neither; the background there would put a
  // cell of it between two touching layers. The later body takes it, as it would overlapping ones.
  // A point on one body's face alone stays outside.
  return on_faces >= 2 ? last_on_face : s.domain.background;
}

// Body indices from last to first, without storing them.
struct LastFirst {
  int n;
  struct It {
    int i;
    int operator*() const { return i; }
    It& operator++() { --i; return *this; }
    bool operator!=(const It& o) const { return i != o.i; }
  };
  It begin() const { return {n - 1}; }
  It end() const { return {-1}; }
};

}  // namespace

int BodyLookup::material_at(const Vec3& p) const {
  return resolve(scene_, p, candidates(p), [&](int i) -> const geometry::Aabb& { return boxes_[static_cast<std::size_t>(i)]; });
}

int material_at_any(const Scene& s, const Vec3& p) {
  geometry::Aabb box;
  return resolve(s, p, LastFirst{static_cast<int>(s.bodies.size())}, [&](int i) -> const geometry::Aabb& {
    box = s.bodies[static_cast<std::size_t>(i)].shape->bounds();
    return box;
  });
}

}  // namespace yeegap::solver
