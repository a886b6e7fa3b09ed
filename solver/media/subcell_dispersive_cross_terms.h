// Off-diagonal averaging terms where a metal (or any dispersive or lossy material) meets its
// surroundings, in a form that is passive by construction.
//
// The averaged inverse permittivity of Farjadpour et al., Opt. Lett. 31, 2972 (2006),
//   kappa(omega) = S n n^T + M (1 - n n^T),   S = <1/eps> (series),  M = 1/<eps> (fill-weighted),
// is passive, but its off-diagonal part alone, (S - M) n_c n_d, is not (for gold in water its
// imaginary part has the active sign): coupling neighbours with it, as a trial did, grew without
// bound. Here each triple t (the E_x, E_y, E_z that meet at a node, E_c at N - bit_c e_c, as in
// subcell_cross_terms.h) gets a 3x3 operator built only from passive scalar media times rank-one
// positive matrices, and E = sum_t W_t B_t^T K_t B_t D (B_t picks the triple's three D, W_t its
// locations' shares, below):
//   K_t = u u^T / eps_in + v v^T / eps_out + sum_{a<b} r_ab r_ab^T / <eps>_ab,
//   u_c = sqrt(f_c) n_c,  v_c = sqrt(1 - f_c) n_c,  r_ab = n_b e_a - n_a e_b,
// with f_c each location's own fill and n the triple's normal. Each term is a scalar passive branch
// (subcell_branch.h) driven by a projection of D, so the sum is symmetric and passive whatever the
// fills. With equal fills it is exactly kappa (sum r r^T = 1 - n n^T); with its own fills each
// location keeps its own series part S(f_c) n_c^2 on the diagonal, and the pair (a, b)'s
// fill-weighted medium takes the fill (n_b^2 f_a + n_a^2 f_b) / (n_a^2 + n_b^2), which is a's own
// fill wherever a lies along the surface (n_a = 0) and b's where b does, so a flat face parallel to
// the grid gets exactly the diagonal average at every location.
//
// A triple whose three fills differ much on an oblique surface could have an instantaneous operator
// (the eps_inf parts) above what the time step allows; there the series fills are drawn toward the
// triple's mean (where the bound always holds) until it fits. Bulk locations of either material in
// a triple join the averaged ones (fill 1 inside, 0 outside). A triple with a third material, the
// gap medium, another pair's averaged location or no defined normal is not coupled: its share of
// each of its locations stays with that location's own diagonal update (subcell_average.h). The
// shares are 1/8 on equal cells and (V_cell / 8) / V_location on a graded mesh (the energy's
// weights, which keep the operator symmetric there). On a mirror plane the triples with an image
// location are left out and the plane's locations count their other triples twice (the plane's
// locations weigh half in the energy).
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
