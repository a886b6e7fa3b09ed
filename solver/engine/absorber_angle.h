// How an absorbing face of a Bloch cell must be built for the waves that reach it, which travel at
// an angle to its normal or, beyond the critical angle, decay towards it. A graded layer designed
// for a normal reflection R(0) returns R(0)^cos(theta) at the angle theta (Taflove & Hagness 2005,
// ch. 7, from memory for the form): 0.04 in amplitude at 80 deg for R(0) = 1e-8, enough to move a
// prism's reflectance by 0.04. An evanescent field is not damped by sigma at all; it reaches the
// lossy layer and its backing wall, tunnels out and gives a non-zero, even negative, T.
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
/// frequency in the medium at the face; where no frequency of the band propagates there, kappa_max
/// raised so the evanescent field's round trip through the layer (thickness d, grading order m)
/// falls by the target reflection R(0). Without a Bloch wavevector across the face: the plain design.
FaceDesign absorber_face_design(const Scene& s, const Grid& g, int face, double thickness);

/// Caps: 1/cos(84.3 deg) for sigma, and 100 for kappa. Beyond them a layer of a dozen cells grades
/// too steeply from cell to cell and the grid's own reflection takes over.
inline constexpr double max_grazing_factor = 10.0;
inline constexpr double max_evanescent_kappa = 100.0;

}  // namespace yeegap::solver
