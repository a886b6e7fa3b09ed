// Placement notes (see placement_notes.h). Boxes are compared, not shapes: a sphere whose box
// touches a layer but whose surface does not is noted too, which errs on the side of saying so.
#include "solver/engine/placement_notes.h"

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

bool bounded(const geometry::Aabb& box) {
  for (int a = 0; a < 3; ++a)
    if (!std::isfinite(box.lo[a]) || !std::isfinite(box.hi[a])) return false;
  return true;
}

// Whether the box reaches into the absorbing layer at face f.
bool in_layer(const Scene& s, const Grid& g, const geometry::Aabb& box, int f) {
  if (s.domain.edges[f] != EdgeKind::cpml || s.domain.cpml.cells <= 0) return false;
  const int a = f / 2;
  const auto& v = g.nodes[a];
  const auto layer = static_cast<std::size_t>(s.domain.cpml.cells);
  return f % 2 == 0 ? box.lo[a] < v[layer] : box.hi[a] > v[v.size() - 1 - layer];
}

}  // namespace

std::vector<std::string> placement_notes(const Scene& s, const Grid& g) {
  std::vector<std::string> notes;
  for (std::size_t i = 0; i < s.bodies.size(); ++i) {
    const geometry::Aabb box = s.bodies[i].shape->bounds();
    bool outside = false;
    for (int a = 0; a < 3; ++a) outside = outside || box.hi[a] < g.nodes[a].front() || box.lo[a] > g.nodes[a].back();
    if (outside) {
      notes.push_back(fmt::format("{} lies wholly outside the domain: it changes nothing", body_label(s, i)));
      continue;
    }
    if (!bounded(box)) continue;  // slabs and half-spaces continue into the layers by design
    for (int f = 0; f < 6; ++f)
      if (in_layer(s, g, box, f))
        notes.push_back(fmt::format("{} reaches into the absorbing layer at face {}: the layer is designed for the "
                                    "background, so the body's part there is absorbed imperfectly and reflects",
                                    body_label(s, i), face_names[f]));
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

std::vector<std::string> placement_warnings(const Scene& s, const Grid& g) {
  std::vector<std::string> warnings;
  // A staircased metal particle: right peak, wrong red tail (docs/scene.md, averaging).
  for (std::size_t i = 0; i < s.bodies.size() && !s.domain.averaging; ++i) {
    const MaterialSpec& mat = s.materials.at(static_cast<std::size_t>(s.bodies[i].material));
    const geometry::Aabb box = s.bodies[i].shape->bounds();
    if (!bounded(box) || mat.perfect_conductor || (mat.poles.drude.empty() && mat.poles.conductivity == 0)) continue;
    // A body that fills its own box (corners just inside it are inside the body) is an aligned
    // box: its faces are planes of the grid, not staircases.
    bool fills_box = true;
    for (int c = 0; c < 8 && fills_box; ++c) {
      Vec3 corner;
      for (int a = 0; a < 3; ++a) {
        const double inset = 1e-3 * (box.hi[a] - box.lo[a]);
        corner[a] = (c >> a & 1) ? box.hi[a] - inset : box.lo[a] + inset;
      }
      fills_box = s.bodies[i].shape->signed_distance(corner) < 0;
    }
    if (fills_box) continue;
    warnings.push_back(fmt::format(
        "{} is a curved or tilted metal body on a staircase (domain.averaging is off): its corners add "
        "resonances red of the plasmon (a gold sphere at 10 cells per radius: spectra off by up to 17 % of the "
        "peak, +79 % in the red tail); 'averaging: on' brings that within 2 % (docs/scene.md, averaging)",
        body_label(s, i)));
    break;
  }
  // Caught, not cured (docs/reliability.md, row 50): a weakly damped metal surface inside an absorber
  // corner (two absorbing axes meeting) can grow; the growth watch stops such a run.
  for (std::size_t i = 0; i < s.bodies.size(); ++i) {
    const MaterialSpec& mat = s.materials.at(static_cast<std::size_t>(s.bodies[i].material));
    if (mat.poles.drude.empty() || mat.perfect_conductor) continue;
    const geometry::Aabb box = s.bodies[i].shape->bounds();
    std::string axes;
    for (int a = 0; a < 3; ++a)
      if (in_layer(s, g, box, 2 * a) || in_layer(s, g, box, 2 * a + 1)) axes += "xyz"[a];
    if (axes.size() < 2) continue;
    warnings.push_back(fmt::format(
        "{} runs into the absorbing layers of {} axes ({}): where two layers meet, a weakly damped metal's surface "
        "can grow (silver, aluminium, plain Drude models; gold's loss damps it), and the run then stops as diverged "
        "(docs/reliability.md row 50). End the metal at the layers' inner face, or make one of those axes periodic",
        body_label(s, i), axes.size(), axes));
    break;
  }
  return warnings;
}

}  // namespace yeegap::solver
