// How an absorbing face of a Bloch cell is built for waves that reach it at an angle or, beyond the
// critical angle, evanescent. A layer built for normal incidence returns R(0)^cos(theta) (4 % in
// amplitude at 80 deg for 1e-8) and does not damp an evanescent field at all, which tunnels out and
// gives a non-zero, even negative, T (docs/physics.md 3.5).
#pragma once

#include "solver/engine/grid.h"
#include "solver/scene.h"

namespace yeegap::solver {

struct FaceDesign {
  double sigma_factor = 1;  // multiplies the normal-incidence sigma_max: 1/cos(theta), capped
  double kappa_max = 1;     // at least the user's; raised where every wave of the band is evanescent
};

/// The design of absorbing face `face` (x-, x+, y-, y+, z-, z+), given the domain's Bloch
/// wavevector and the sources' band: sigma scaled by 1/cos(theta) of the most grazing propagating
/// frequency in the medium at the face; kappa_max raised so an evanescent field's round trip
/// through the layer (thickness d, grading order m) falls by the target reflection R(0): the zero
/// order where no frequency of the band propagates, and in a cell that repeats over more than one
/// cell laterally, the evanescent diffraction orders (after their decay from the structure to the
/// layer). Without a Bloch wavevector or diffraction across the face: the plain design.
FaceDesign absorber_face_design(const Scene& s, const Grid& g, int face, double thickness);

/// Caps: 1/cos(84.3 deg) for sigma, and 100 for kappa. Beyond them a layer of a dozen cells grades
/// too steeply from cell to cell and the grid's own reflection takes over. Where waves also
/// propagate through the face, kappa stops at 20: a gold grating's reflectance moved by 0.01 with
/// every layer at 40 and by at most 1e-4 at 20 (docs/physics.md 3.5).
inline constexpr double max_grazing_factor = 10.0;
inline constexpr double max_evanescent_kappa = 100.0;
inline constexpr double max_kappa_with_propagating = 20.0;

}  // namespace yeegap::solver
