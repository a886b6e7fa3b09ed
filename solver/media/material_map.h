// Puts the scene's bodies on the grid: the material index at every E component location (staircase:
// the material whose body contains the location; later bodies win) and the E update coefficients
// of each material. An extra last index marks wall locations (tangential E on a metal or absorber-
// backing face, and perfect-conductor bodies) where E is held at zero.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "solver/engine/grid.h"
#include "solver/scene.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

/// Material index at point p: the last body containing p, else the background.
int material_at(const Scene& s, const Vec3& p);

/// Fills mi for all E locations of the block (interior and the halo planes a wall sits on).
void fill_material_index(const Scene& s, const Grid& g, const BlockLayout& L, MaterialIndex& mi);

/// ca, cb for every scene material plus the wall entry (ca = cb = 0) at index materials.size().
ECoefficients e_coefficients(const Scene& s, double dt);

/// Material at every cell centre, x fastest (for results and viewers).
std::vector<std::uint8_t> cell_material_map(const Scene& s, const Grid& g);

}  // namespace yeegap::solver
