// One branch of an averaged E location (subcell_average.h): a medium driven by the increments of D,
// whose E it gives back. In the units of dispersive.h (Dt = D/eps0, Q = dt J/eps0, both V/m) a
// branch of relative eps_inf, loss s = sigma dt/eps0 and poles with weights w steps as
//   eps_inf (E^{n+1} - E^n) = dDt - s (E^{n+1} + E^n)/2 - sum w Q^{n+1/2},
// which is eps0 eps_inf dE/dt = dD/dt - sigma E - J of physics.md 3.4 with the pole updates of
// dispersive.cpp; the critical points' E^{n+1} share moves to the left side. A branch mixing two
// materials (weights f and 1 - f) is the fill-weighted medium: eps_inf, loss and every pole's
// susceptibility weighted, which is <eps>(omega) exactly; a branch is passive when its poles are.
#pragma once

#include <vector>

#include "materials/pole_set.h"
#include "solver/real.h"

namespace yeegap::solver {

/// One pole's update: Q^{n+1/2} = cq Q + cp P + ce E^n + cm E^{n-1} (+ implicit E^{n+1}); P += Q.
struct PoleStep {
  real cq = 0, cp = 0, ce = 0, cm = 0, implicit = 0;
  bool keeps_p = false;  // Lorentz and critical points
};

/// A material as a branch: its eps_inf, its loss sigma dt / eps0 and its poles.
struct BranchResponse {
  double eps_inf = 1, loss = 0;
  std::vector<PoleStep> poles;
};

BranchResponse branch_response(const materials::PoleSet& p, double dt);

/// Advances one branch that mixes `a` (weight wa) and `b` (weight 1 - wa; b may be null when wa = 1)
/// by the increment dD; `q` and `p` hold a's pole states then b's (p unused for poles that keep no
/// P). Updates e and e_previous and returns E^{n+1}.
double step_branch(const BranchResponse& a, const BranchResponse* b, double wa, real& e, real& e_previous, real* q,
                   real* p, double dD);

}  // namespace yeegap::solver
