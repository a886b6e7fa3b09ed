// Tunnelling-gap cells on the grid (docs/gaps.md): the gap medium is
// one extra dispersive material (eps_b plus a Drude pole with the metal's plasma frequency) whose
// damping is set cell by cell from the local gap width l = d_A + d_B, so a gap of varying width
// (two spheres, a particle on a film) gets the right conductivity everywhere.
#pragma once

#include <unordered_map>
#include <vector>

#include "solver/media/dispersive.h"
#include "solver/engine/grid.h"
#include "solver/results.h"
#include "solver/scene.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

/// The scene the solver runs: with quantum-corrected tunnelling, the gap material appended to the
/// materials (so the time step, stability check and coefficients include it).
Scene with_tunnelling_material(const Scene& scene);

class TunnellingCells {
 public:
  /// Marks gap cells in `mi` (locations of the background material inside a gap); `scene` must
  /// come from with_tunnelling_material.
  TunnellingCells(const Scene& scene, const Grid& g, const BlockLayout& L, MaterialIndex& mi);
  /// Gives each marked cell its damping gamma_g(l); call once the dispersive currents exist.
  void set_damping(DispersiveCurrents& d) const;
  const std::vector<TunnellingGap>& report() const { return report_; }

 private:
  BlockLayout layout_;
  int material_ = -1;                               // index of the gap material, -1 if classical/none
  std::unordered_map<std::ptrdiff_t, double> width_;  // key: component * layout total + offset -> l
  std::ptrdiff_t stride_ = 0;
  std::vector<double> table_l_, table_log_gamma_;   // gamma_g(l) tabulated: the barrier integral is slow
  std::vector<TunnellingGap> report_;
};

}  // namespace yeegap::solver
