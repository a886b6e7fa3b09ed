// The E locations a body's surface crosses, for subcell averaging: around every Yee E location the
// box of its own update (primal along its component, dual across), the topmost body whose surface
// cuts that box, the fraction of the box inside it (geometry/fill_fraction.h) and the surface normal
// there (geometry/surface_normal.h). Later bodies win, as in the staircase (material_map.h).
#pragma once

#include <array>
#include <cstddef>
#include <vector>

#include "solver/engine/grid.h"
#include "solver/scene.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

/// One E location shared by two materials.
struct MixedCell {
  Component component = Component::Ex;
  std::ptrdiff_t offset = 0;   // flat index in the block layout
  int inside = 0, outside = 0; // materials: the crossing body's, and what lies under it there
  double fill = 0;             // fraction of the box inside the body, in (0, 1)
  double normal_share = 0;     // n_c^2: squared normal component along the E component, in [0, 1]
  Vec3 normal{};               // unit surface normal (outward), or zero where it is undefined
};

/// What crosses a box: nothing (`clear`: one medium fills it), the surface of the topmost body
/// between two media that can be averaged, or a surface with a perfect conductor, the tunnelling
/// gap or the same medium on both sides (`foreign`: stays staircased).
struct BoxCrossing {
  enum class Kind { clear, averaged, foreign };
  Kind kind = Kind::clear;
  int inside = 0, outside = 0;  // the body's material, what lies under it beyond the surface
  double fill = 0;              // fraction of the box inside the body
  Vec3 normal{};                // outward unit normal at p, or zero
};
/// `bounds`: the bodies' bounding boxes; `p`: the point of the box where the normal is taken.
BoxCrossing find_box_crossing(const Scene& s, const std::vector<geometry::Aabb>& bounds, const geometry::Aabb& box,
                              const Vec3& p);

/// Mixed E locations of the block in layout order, component by component. Locations held at zero
/// (wall index in `mi`), perfect conductors and the tunnelling-gap medium stay staircased: a wall
/// has no permittivity to average, and gap cells get their damping from their own position.
std::vector<MixedCell> find_mixed_cells(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi);

/// The averaging box of E component c at cell (i, j, k): primal cell along c, from half the
/// previous to half the next cell across (on a bounded low face the first cell is mirrored).
geometry::Aabb averaging_box(const Grid& g, Component c, int i, int j, int k);

}  // namespace yeegap::solver
