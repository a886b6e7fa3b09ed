// Polarization currents of dispersive media (Drude, Lorentz and critical-point poles) in the
// J-form auxiliary differential equation of physics.md 3.4, exactly the scheme whose permittivity
// materials/discrete_permittivity.cpp derives. Stored only for the E locations of dispersive
// materials, in compact per-material lists, so memory follows the metal volume.
#pragma once

#include <array>
#include <cstddef>
#include <vector>

#include "solver/engine/fields.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

class StateArrays;  // simulation_state.h

/// One E location of a dispersive material: which component and its block index.
struct DispersiveCell {
  Component component;
  int i, j, k;
};

/// The auxiliary state of every dispersive material and its two passes around update_e:
///   before update_e:  J^{n+1/2} from J^{n-1/2}, P^n, E^n (and E^{n-1} for critical points)
///   after update_e, the CPML and the sources:  E^{n+1} -= cb sum J^{n+1/2}; critical points
///   then add their implicit E^{n+1} share (see dispersive.cpp).
/// Every current is stored in units of V/m, scaled as Q = dt J / eps0 and P / eps0, so all update
/// coefficients are dimensionless and float storage keeps its precision.
/// The polarization energy is not part of Simulation::field_energy.
class DispersiveCurrents {
 public:
  /// Lists the E locations of every dispersive material in `mi` (interior of the block) and sets
  /// up the poles of `s.materials[m].poles` with time step dt. `ec` must come from e_coefficients
  /// (its cb already holds the critical points' implicit share).
  DispersiveCurrents(const Scene& s, const BlockLayout& L, const MaterialIndex& mi, const ECoefficients& ec, double dt);

  bool empty() const { return groups_.empty(); }
  /// J^{n+1/2} (and P^{n+1} for the explicit poles) from the fields at step n. Call before update_e.
  void advance(const Fields& f);
  /// E^{n+1} -= cb sum J^{n+1/2}, then the critical points' currents are completed with E^{n+1}.
  /// Call after update_e, the CPML's E terms and the sources.
  void correct(Fields& f);

  /// Dispersive E locations of material m, in the order per-cell values are given below; empty
  /// if m is not dispersive.
  std::vector<DispersiveCell> cells(int material) const;
  /// Gives Drude pole `pole` of material m one damping per cell (rad/s, >= 0), in the order of
  /// cells(m): the tunnelling-gap medium has the metal's plasma frequency and a damping set by the
  /// local gap width. Stable for any damping * dt >= 0 (the J coefficient stays in (-1, 1]).
  void set_drude_damping(int material, int pole, const std::vector<double>& damping);
  /// The per-cell dampings last given to set_drude_damping (empty if none), rad/s.
  std::vector<double> drude_damping(int material, int pole) const;

  std::size_t memory_bytes() const;
  /// The pole currents (and E^{n-1} of critical points), for checkpoints. The per-cell dampings
  /// are set once from the geometry and never change, so they are rebuilt, not stored.
  void add_state(StateArrays& s, const std::string& prefix);

 private:
  // A coefficient shared by the whole material (one value) or given per cell (one per cell):
  // the loops read value[q * stride] with stride 0 or 1, so they have no branch.
  struct Coefficient {
    std::vector<real> value;
    std::size_t stride = 0;
    real at(std::size_t q) const { return value[q * stride]; }
  };
  struct Pole {
    // Q^{n+1/2} = cq Q^{n-1/2} + cp P^n + ce E^n + cm E^{n-1};  P^{n+1} = P^n + Q^{n+1/2}
    Coefficient cq, cp, ce, cm;
    real implicit = 0;                 // critical points: Q^{n+1/2} += implicit * E^{n+1}
    double omega_p = 0;                // Drude only, rad/s: kept to rebuild per-cell coefficients
    std::vector<double> damping;       // per-cell dampings, when set (for reports and tests)
    AlignedVector<real> q, p;          // p empty for Drude poles
  };
  struct Group {
    int material = 0;
    std::array<std::size_t, 4> start{};        // cells of component c: [start[c], start[c+1])
    std::vector<std::ptrdiff_t> offset;        // flat field index per cell
    real correction = 0;                       // cb eps0 / dt: E -= correction * sum Q
    std::vector<Pole> drude, lorentz, critical;
    AlignedVector<real> e_previous;            // E^{n-1}, only when the material has critical points
    // Sum over the poles of Q^{n+1/2} (the explicit part for critical points), left by advance()
    // for correct() in the same step, so correct() reads one array instead of every pole's again.
    // Never carried across steps, so not part of a checkpoint.
    AlignedVector<real> current_sum;
  };
  Group& group_of(int material);

  BlockLayout layout_;
  double dt_ = 0;
  std::vector<Group> groups_;
};

}  // namespace yeegap::solver
