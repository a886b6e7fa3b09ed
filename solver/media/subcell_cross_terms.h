// Off-diagonal terms of the anisotropic averaged permittivity (Farjadpour et al., Opt. Lett. 31,
// 2972 (2006)) between lossless dielectrics: E_c += sum_d kappa_cd D_d, kappa = eps_eff^-1, with D_d
// taken at the four E_d locations around E_c. Written as an energy, sum over the (E_x, E_y, E_z)
// triples that share a node, (1/8) D_t^T kappa_t D_t, so the coupling of D_d into E_c equals that of
// D_c into E_d and the D->E operator is symmetric; where needed a triple's off-diagonal part is
// scaled down until kappa_t is positive definite with eigenvalues below (Courant limit / dt)^2, so the
// operator stays positive, its largest eigenvalue at most that (every D location lies in eight
// triples), and the leapfrog update within its Courant bound (a symmetric, positive semidefinite
// D->E operator is what keeps such updates stable: Werner & Cary, J. Comput. Phys. 226, 1085
// (2007), abstract). Only on uniform cells around the triple, where the 1/8 weights are the energy's.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "solver/engine/fields.h"
#include "solver/engine/grid.h"
#include "solver/scene.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

class StateArrays;  // simulation_state.h

class SubcellCrossTerms {
 public:
  /// A mixed E location between two lossless dielectrics; its D the owner supplies each step.
  struct Site {
    Component component = Component::Ex;
    std::ptrdiff_t offset = 0;
    double eps_in = 1, eps_out = 1, fill = 0;  // relative permittivities; fill of the inside one
    Vec3 normal{};                             // unit normal, or zero (no cross terms then)
  };

  /// `other_mixed`: mixed locations of other pairs (3 offset + component), never coupled. `top`:
  /// the largest eigenvalue of eps0/eps the time step allows, (Courant limit / dt)^2 (vacuum: 1).
  SubcellCrossTerms(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi,
                    const std::vector<Site>& sites, const std::vector<std::ptrdiff_t>& other_mixed, double top);

  bool empty() const { return row_node_.empty(); }
  /// Before the bulk E update: takes the cross terms out of E, so E holds the diagonal part.
  void remove(Fields& f) const;
  /// After the diagonal update: `site_d` is D/eps0 (V/m) of each site, in the order given.
  void add(Fields& f, const std::vector<double>& site_d);
  /// Smallest scale the positivity cap put on a triple's off-diagonal terms (1: none was needed).
  double smallest_scale() const { return smallest_scale_; }
  std::size_t coupled_locations() const { return row_node_.size(); }
  /// One term: E at (target component, offset) += coefficient * D/eps0 at (source component, offset).
  struct Coupling {
    int target_component = 0, source_component = 0;
    std::ptrdiff_t target = 0, source = 0;
    double coefficient = 0;
  };
  std::vector<Coupling> couplings() const;
  std::size_t memory_bytes() const;
  void add_state(StateArrays& s, const std::string& prefix);

 private:
  struct Node {
    int component = 0;
    std::ptrdiff_t offset = 0;
    int site = -1;     // index into the sites, or -1 for a bulk dielectric location
    double eps = 1;    // bulk: D/eps0 = eps E
  };
  std::vector<Node> nodes_;
  std::vector<double> d_;                       // D/eps0 of every node, this step
  std::vector<int> row_node_;                   // locations that receive cross terms
  std::vector<std::size_t> row_start_;          // their couplings: [row_start_[r], row_start_[r+1])
  std::vector<int> col_node_;
  std::vector<double> coef_;
  // E of each row before add() put the cross terms in, for remove(): nothing else writes E there
  // between the two, and restoring the value (not subtracting) leaves no rounding behind.
  std::vector<real> diagonal_;
  double smallest_scale_ = 1;
};

}  // namespace yeegap::solver
