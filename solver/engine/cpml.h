// Convolutional PML (Roden & Gedney, Microw. Opt. Technol. Lett. 27, 334 (2000)): the complex-
// frequency-shifted stretch s = kappa + sigma/(alpha - i omega eps0) applied by recursive
// convolution. kappa lives in the bulk curl coefficients; this file owns the profiles and the
// auxiliary psi fields, which exist only in the absorbing slabs, and adds their terms after the
// bulk updates.
#pragma once

#include <array>
#include <vector>

#include "solver/engine/field.h"
#include "solver/engine/grid.h"
#include "solver/real.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

class StateArrays;  // simulation_state.h

/// Resolved layer settings (SI); sigma_max per face (x-, x+, y-, y+, z-, z+) from the target
/// reflection, the background index and, in a Bloch cell, the angle of the wave reaching the face.
struct CpmlProfile {
  int cells = 12;
  double order = 3;
  std::array<double, 6> sigma_max{};  // S/m
  std::array<double, 6> kappa_max{1, 1, 1, 1, 1, 1};
  double alpha_max = 0;  // S/m
};

/// sigma_max = -(m+1) ln R / (2 n eta0 d) for a layer of thickness d (m) in a background of
/// index n: the round trip through the graded layer attenuates a normal plane wave by R.
double cpml_sigma_max(double order, double reflection, double thickness, double background_index);

class Cpml {
 public:
  /// absorber[2a + side] tells which faces absorb. Fills kappa into `curls`, which must already
  /// hold the plain inverse spacings.
  Cpml(const Grid& g, const std::array<bool, 6>& absorber, const CpmlProfile& p, double dt, CurlCoefficients& curls);

  /// Adds the psi terms to H (after update_h) and to E (after update_e).
  void apply_h(Fields& f, double dt);
  void apply_e(Fields& f, const ECoefficients& ec, const MaterialIndex& mi);

  std::size_t memory_bytes() const;
  bool active() const { return !slabs_.empty(); }
  /// The psi arrays, for checkpoints.
  void add_state(StateArrays& s, const std::string& prefix);

 private:
  struct Slab {
    int axis;
    std::array<int, 3> lo, hi;                 // cell-index box of the slab
    std::array<AlignedVector<real>, 4> psi;    // E_b, E_c, H_b, H_c terms (see cpml.cpp)
  };
  // Per axis, per index: recursion coefficients at E (node) and H (half-node) positions, and the
  // plain inverse spacings the psi terms differentiate with.
  std::array<std::vector<real>, 3> be_, ae_, bh_, ah_, inv_dual_, inv_primal_;
  std::vector<Slab> slabs_;
};

}  // namespace yeegap::solver
