// Electron transmission through a 1D barrier between two identical free-electron metals: the exact
// rectangular formula (Griffiths, Introduction to Quantum Mechanics, ch. 2), any piecewise-constant
// profile by transfer of psi'/psi (stable for thick barriers), WKB, and Simmons' image-rounded barrier
// (J. Appl. Phys. 34, 1793 (1963)). Energies in J from the conduction-band bottom; lengths in m.
#pragma once

#include <vector>

namespace yeegap::materials {

/// A barrier of `width` cut into equal slabs of constant potential (J, from the band bottom; the
/// metals on either side sit at 0). A slab below the electron's energy is a classically allowed well.
struct BarrierProfile {
  double width = 0;                // m
  std::vector<double> potential;   // J, one value per slab, left to right
};

/// T(E) for a rectangular barrier of `height` V0 and `width` a (physics.md 1.6). E <= 0 gives 0.
/// Written as T = 1/(1 + s), s = m V0^2 a^2 f(qa)^2/(2 hbar^2 E) with f = sinh(x)/x below the top
/// and sin(x)/x above it, which is the textbook formula, continuous through E = V0, and evaluated
/// through log(s) for thick barriers so that sinh never overflows.
double rectangular_transmission(double energy, double height, double width);

/// A rectangular barrier as `slabs` equal slabs (for testing the profile method against the exact one).
BarrierProfile rectangular_profile(double height, double width, int slabs);

/// The image-force-rounded barrier of Simmons (1963) at zero bias, in a gap of width s filled with
/// a medium of relative permittivity K: phi(x) = W - 1.15 lambda s^2/(x (s - x)),
/// lambda = e^2 ln2/(8 pi K eps0 s), V(x) = E_F + phi(x). Near each surface phi diverges to minus
/// infinity; V is clamped at the band bottom (0), because inside the metal the potential cannot fall
/// below the metal's own. Sampled at slab midpoints, slabs no thicker than `max_slab` (m).
BarrierProfile image_rounded_profile(double fermi_energy, double work_function, double width,
                                     double relative_permittivity, double max_slab);

/// T(E) through a piecewise-constant profile. Exact for that profile (no discretisation beyond the
/// profile's own). Propagates the logarithmic derivative psi'/psi from the right (where only the
/// transmitted wave exists) to the left, one analytic slab at a time, and accumulates log|psi|, so
/// nothing grows like exp(q a): T = 1e-40 is computed as accurately as T = 0.5.
double profile_transmission(const BarrierProfile& profile, double energy);

/// WKB estimate exp(-2 integral kappa dz) over the slabs above `energy`; drops the prefactor of the
/// exact result (for a rectangular barrier that prefactor is 16 E (V0 - E)/V0^2).
double wkb_transmission(const BarrierProfile& profile, double energy);

}  // namespace yeegap::materials
