// Detection and reduction of laterally uniform stacks (see layered_stack.h).
#include "solver/runs/layered_stack.h"

#include <cmath>

#include <fmt/format.h>

namespace yeegap::solver {

bool laterally_uniform(const Scene& s, int axis) {
  if (!s.dipoles.empty() || !s.plane_waves.empty()) return false;
  for (int a = 0; a < 3; ++a)
    if (a != axis && s.domain.edges[2 * a] != EdgeKind::periodic) return false;
  for (const BodySpec& b : s.bodies) {
    const geometry::Aabb box = b.shape->bounds();
    for (int a = 0; a < 3; ++a)
      if (a != axis && (std::isfinite(box.lo[a]) || std::isfinite(box.hi[a]))) return false;
  }
  return true;
}

Scene as_one_dimensional(const Scene& original, int axis, std::string* note) {
  Scene s = original;
  const double h = s.domain.step[axis];
  int cells_before[3] = {1, 1, 1};
  for (int a = 0; a < 3; ++a) {
    if (a == axis) continue;
    cells_before[a] = std::max(1, static_cast<int>(std::lround(s.domain.size[a] / s.domain.step[a])));
    s.domain.size[a] = h;
    s.domain.step[a] = h;
    for (RefineZone& z : s.domain.refine) z.step[a] = h;
  }
  if (note)
    *note = fmt::format("laterally uniform stack along {}: runs as a 1D problem, one lateral cell instead of {} x {}",
                        "xyz"[axis], cells_before[(axis + 1) % 3], cells_before[(axis + 2) % 3]);
  return s;
}

}  // namespace yeegap::solver
