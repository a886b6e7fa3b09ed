// Placement notes (see placement_notes.h). Boxes are compared, not shapes: a sphere whose box
// touches a layer but whose surface does not is noted too, which errs on the side of saying so.
#include "solver/placement_notes.h"

#include <cmath>

#include <fmt/format.h>

namespace yeegap::solver {
namespace {

const char* const face_names[] = {"x-", "x+", "y-", "y+", "z-", "z+"};

std::string body_label(const Scene& s, std::size_t i) {
  const BodySpec& b = s.bodies[i];
  const std::string& material = s.materials.at(static_cast<std::size_t>(b.material)).name;
  return b.name.empty() ? fmt::format("body {} ({})", i, material) : fmt::format("body {} '{}' ({})", i, b.name, material);
}

bool conducts(const MaterialSpec& m) {
  return m.perfect_conductor || !m.poles.drude.empty() || m.poles.conductivity > 0;
}

}  // namespace

std::vector<std::string> placement_notes(const Scene& s, const Grid& g) {
  std::vector<std::string> notes;
  const int layer = s.domain.absorber.cells;
  for (std::size_t i = 0; i < s.bodies.size(); ++i) {
    const geometry::Aabb box = s.bodies[i].shape->bounds();
    bool outside = false, bounded = true;
    for (int a = 0; a < 3; ++a) {
      outside = outside || box.hi[a] < g.nodes[a].front() || box.lo[a] > g.nodes[a].back();
      bounded = bounded && std::isfinite(box.lo[a]) && std::isfinite(box.hi[a]);
    }
    if (outside) {
      notes.push_back(fmt::format("{} lies wholly outside the domain: it changes nothing", body_label(s, i)));
      continue;
    }
    if (!bounded) continue;  // slabs and half-spaces continue into the layers by design
    for (int f = 0; f < 6; ++f) {
      if (s.domain.edges[f] != EdgeKind::absorber || layer <= 0) continue;
      const int a = f / 2;
      const auto& v = g.nodes[a];
      const bool into = f % 2 == 0 ? box.lo[a] < v[static_cast<std::size_t>(layer)]
                                   : box.hi[a] > v[v.size() - 1 - static_cast<std::size_t>(layer)];
      if (into)
        notes.push_back(fmt::format("{} reaches into the absorbing layer at face {}: the layer is designed for the "
                                    "background, so the body's part there is absorbed imperfectly and reflects",
                                    body_label(s, i), face_names[f]));
    }
  }
  for (std::size_t d = 0; d < s.dipoles.size(); ++d) {
    const Vec3& p = s.dipoles[d].position;
    for (std::size_t i = s.bodies.size(); i-- > 0;) {
      if (!(s.bodies[i].shape->signed_distance(p) < 0)) continue;
      if (conducts(s.materials.at(static_cast<std::size_t>(s.bodies[i].material))))
        notes.push_back(fmt::format("dipole {} sits inside {}, a conductor: its power goes into the metal", d,
                                    body_label(s, i)));
      break;  // the last body holding the point is the one that counts
    }
  }
  return notes;
}

}  // namespace yeegap::solver
