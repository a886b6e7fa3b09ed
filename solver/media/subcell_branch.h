// One branch of an averaged E location (subcell_average.h): a medium driven by increments of D that
// gives back its E, stepped in the units of dispersive.h with the pole updates of dispersive.cpp. A
// two-material branch is the fill-weighted medium, exactly <eps>(omega); a branch is passive when its
// poles are. The update equation: docs/physics.md 3.8.
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
