// Off-diagonal averaging terms where a metal (or any dispersive or lossy material) meets its
// surroundings, passive by construction: each triple of E components at a node gets a sum of passive
// scalar branches (subcell_branch.h) times rank-one positive matrices, stable whatever the fills.
// Derivation, the step cap on fills and the triples left uncoupled: docs/physics.md 3.8.
#pragma once

#include <array>
#include <cstddef>
#include <string>
#include <vector>

#include "solver/engine/fields.h"
#include "solver/media/mixed_cells.h"
#include "solver/scene.h"
#include "solver/media/subcell_branch.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

class StateArrays;  // simulation_state.h

class SubcellDispersiveCrossTerms {
 public:
  /// An E location of the coupled triples; `joins` when it is a bulk location (fill 1 inside, 0
  /// outside) that must join the pair's averaged ones. `coupled`: the share of its update the
  /// triples hold (the rest is its own diagonal update).
  struct Site {
    Component component = Component::Ex;
    std::ptrdiff_t offset = 0;
    bool joins = false;
    double fill = 0;
    double coupled = 0;
  };

  /// Plans the triples of the pair (inside, outside) among `mixed` (every averaged location);
  /// `room`: the largest eigenvalue of eps0/eps the time step allows, (Courant limit / dt)^2.
  SubcellDispersiveCrossTerms(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi,
                              const std::vector<MixedCell>& mixed, int inside, int outside, double dt, double room);

  bool empty() const { return triples_.empty(); }
  int inside() const { return inside_; }
  int outside() const { return outside_; }
  std::size_t triples() const { return triples_.size(); }
  /// Triples whose series fills were drawn toward their mean to respect the time step.
  std::size_t drawn_in() const { return drawn_in_; }
  const std::vector<Site>& sites() const { return sites_; }
  /// Binds the sites to their index in the pair's averaged locations (`index[q]` for site q).
  void bind(const std::vector<std::size_t>& index);
  /// Starts the branches at the fields present (a test's initial condition).
  void start(const Fields& f);
  /// `increment`: dD/eps0 of this step at every averaged location of the pair; adds the triples' E.
  void add(const std::vector<real>& increment, Fields& f);
  std::size_t memory_bytes() const;
  void add_state(StateArrays& s, const std::string& prefix);

 private:
  struct Triple {
    std::array<int, 3> site{-1, -1, -1};  // per component; -1: a wall (D = 0, nothing written)
    std::array<real, 3> u{}, v{};         // series vectors
    std::array<std::array<real, 3>, 3> r{};  // pair vectors, pairs (0,1), (0,2), (1,2)
    std::array<real, 3> pair_fill{};
    std::array<real, 3> weight{};            // each location's share of this triple's E
  };
  void advance_triple(std::size_t t, const std::array<double, 3>& dD);
  /// Each site's share of each of its triples' E (the weights), from the cells the triples point into.
  void share_out(const Grid& g, const BlockLayout& L);

  int inside_ = 0, outside_ = 0;
  BranchResponse in_, out_;
  std::vector<Site> sites_;
  std::vector<std::array<int, 3>> cell_of_;  // while planning: the cell each triple points into
  std::vector<std::size_t> index_;   // site -> averaged location of the pair
  std::vector<Triple> triples_;
  std::size_t drawn_in_ = 0;
  std::size_t slots_ = 0;                       // pole slots per triple
  AlignedVector<real> e_, e_previous_, q_, p_;  // 5 branches per triple: series in, out; pairs
  std::vector<real> out_e_;                     // E of each triple this step, 3 per triple
  std::vector<std::size_t> gather_start_, gather_from_;  // per location: its entries of out_e_
  std::vector<real> gather_weight_;
};

}  // namespace yeegap::solver
