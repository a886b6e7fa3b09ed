// Subcell averaging at the E locations a material interface crosses (mixed_cells.h): the diagonal of
// the anisotropic average of Farjadpour et al., Opt. Lett. 31, 2972 (2006), a metal's eps averaged as
// a response (three passive branches on one D), never as a number. Off-diagonal terms:
// subcell_cross_terms.h, subcell_dispersive_cross_terms.h. Formulas: docs/physics.md 3.8.
#pragma once

#include <array>
#include <cstddef>
#include <memory>
#include <utility>
#include <string>
#include <vector>

#include "solver/engine/fields.h"
#include "solver/media/mixed_cells.h"
#include "solver/scene.h"
#include "solver/media/subcell_branch.h"
#include "solver/media/subcell_cross_terms.h"
#include "solver/media/subcell_dispersive_cross_terms.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

class StateArrays;  // simulation_state.h

/// The averaged update of the mixed E locations, around the bulk update:
///   before update_e:  keep(f)   saves E^n of the mixed locations
///   after update_e, the CPML's E terms and the sources (which all scale with the location's cb):
///                     apply(f)  recovers the curl from the bulk result, advances D and the three
///                               branches, and writes the averaged E^{n+1}
/// The bulk E kernel keeps the staircase material index at mixed locations, so its fast path over
/// single-material blocks is untouched; DispersiveCurrents must get without_mixed(mi) so it leaves
/// the mixed locations to this class.
class SubcellAverage {
 public:
  /// `mi` is the staircase index (with gap cells marked); `ec` from e_coefficients.
  SubcellAverage(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi, const ECoefficients& ec,
                 double dt);

  bool empty() const { return cells_.empty(); }
  std::size_t size() const { return cells_.size(); }
  const std::vector<MixedCell>& cells() const { return cells_; }
  /// A copy of mi with the mixed locations set to the wall index (no bulk polarization currents).
  MaterialIndex without_mixed(const MaterialIndex& mi, int wall) const;

  void keep(Fields& f);
  void apply(Fields& f);
  std::size_t memory_bytes() const;
  /// The off-diagonal terms between dielectrics, or null (none, or switched off).
  const SubcellCrossTerms* cross_terms() const { return cross_.get(); }
  /// The off-diagonal terms of the pairs with a dispersive or lossy material (none when switched off).
  const std::vector<SubcellDispersiveCrossTerms>& dispersive_cross_terms() const { return dispersive_cross_; }
  /// The branch fields and pole currents, for checkpoints (simulation_state.h).
  void add_state(StateArrays& s, const std::string& prefix);

 private:
  struct Group {                   // the mixed cells of one (inside, outside) pair
    int inside = 0, outside = 0;
    std::array<std::size_t, 4> start{};  // cells of component c: [start[c], start[c+1])
    std::vector<std::ptrdiff_t> offset;
    std::vector<real> ca, recover;       // bulk ca of the staircase material, (dt/eps0)/cb
    std::vector<real> fill, share;
    // The share of E that is the location's own average; the rest comes from the triples of
    // subcell_dispersive_cross_terms.h (1 where none couples it).
    std::vector<real> own_weight;
    std::vector<real> increment;         // dD/eps0 of this step
    std::vector<Vec3> normal;            // kept for the cross terms' setup
    AlignedVector<real> e_old;
    // Three branches per location (subcell_branch.h): inside, outside, fill-weighted mixture; their
    // pole slots: inside's poles, outside's, then both again for the mixture.
    std::size_t slots = 0;
    AlignedVector<real> e, e_previous, q, p;
  };
  void apply_group(Group& g, Fields& f);
  void plan_dispersive_cross_terms(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi,
                                   double dt);
  void bind_dispersive_cross_terms();
  void build_cross_terms(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi, double dt);

  std::vector<MixedCell> cells_;
  std::vector<BranchResponse> responses_;  // per material
  std::vector<Group> groups_;
  // 1 once the branches hold a state (the first keep() starts them at the fields then present);
  // an array so a checkpoint carries it.
  std::vector<double> started_{0.0};
  // Off-diagonal terms of the dielectric pairs: each site's (group, cell), its D this step.
  std::unique_ptr<SubcellCrossTerms> cross_;
  std::vector<std::pair<std::size_t, std::size_t>> site_cell_;
  std::vector<double> site_d_;
  // Off-diagonal terms of the pairs with a dispersive or lossy material, one per pair.
  std::vector<SubcellDispersiveCrossTerms> dispersive_cross_;
};

}  // namespace yeegap::solver
