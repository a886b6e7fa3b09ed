// Off-diagonal terms of the averaged permittivity (Farjadpour et al., Opt. Lett. 31, 2972 (2006))
// between lossless dielectrics, written as an energy over the E triples at each node so the D->E
// operator is symmetric and, scaled where needed, positive within the Courant bound (Werner & Cary,
// J. Comput. Phys. 226, 1085 (2007)). Uniform cells only. docs/physics.md 3.8.
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
