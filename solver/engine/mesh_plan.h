// The run's grid from its scene: the domain, the refine zones, the bodies' interfaces and the gaps
// between bodies go to the graded mesh builder (geometry/graded_mesh.h). Slab faces must be cell
// edges; other bodies' box extremes become cell edges where that costs nothing; every gap between
// two bodies narrower than gap_cells base cells gets a zone with gap_cells cells across it.
#pragma once

#include <array>
#include <string>
#include <vector>

#include "geometry/gap_finder.h"
#include "solver/engine/grid.h"
#include "solver/scene.h"

namespace yeegap::solver {

struct MeshPlan {
  Grid grid;
  std::vector<geometry::Gap> gaps;  // gaps refined (body indices into Scene::bodies)
  std::vector<std::string> notes;   // what the builder dropped or changed, for `check`
};

/// Builds the grid of a scene. Without refine zones, off-grid slab faces and narrow gaps this is
/// exactly the uniform grid of the base step.
MeshPlan plan_mesh(const Scene& scene);

/// Thickness (m) of the absorbing layer of `cells` cells at face f (0..5: x-, x+, y-, ...).
double absorber_thickness(const Grid& g, int face, int cells);

}  // namespace yeegap::solver
