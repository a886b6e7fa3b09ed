// Stability of the Yee scheme with the explicit J-form poles of dispersive.h: the pole
// resonances must be resolved (omega_0 dt < 2) and the Courant bound tightens by the grid-Nyquist
// permittivity, S^2 < eps_d(pi/dt). Derived from the bulk discrete dispersion relation in the .cpp.
#pragma once

#include <string>
#include <vector>

#include "solver/scene.h"

namespace yeegap::solver {

/// The scheme's permittivity at the highest frequency the grid carries, omega = pi/dt (where
/// z = exp(-i omega dt) = -1): real, and the pole terms there no longer depend on the damping.
double nyquist_permittivity(const materials::PoleSet& poles, double dt);

/// Why the material cannot run at time step dt on a grid whose vacuum Courant limit is
/// `courant_limit` (s); empty when it can.
std::string dispersive_instability(const MaterialSpec& m, double dt, double courant_limit);

/// Largest time step, at most `courant_limit`, at which every material is stable; throws RunError
/// naming the material when none is (gain, a negative eps_inf).
double stable_time_step(const std::vector<MaterialSpec>& materials, double courant_limit);

/// Throws RunError, naming the material and the largest stable step, when dt is not stable.
void check_dispersive_stability(const Scene& s, double dt, double courant_limit);

}  // namespace yeegap::solver
