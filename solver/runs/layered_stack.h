// Laterally uniform stacks: when every body is a slab normal to the plane wave's axis and both
// lateral axes are periodic, nothing varies across the film but the Bloch phase, so one lateral
// cell holds the whole problem (a 1D problem at the cost of its cells along the axis). On a one-
// cell Bloch axis the phase per cell makes the scheme's lateral wavenumber exact (bloch_halos.h),
// so the lateral cell width is free; it is set to the base step along the axis.
#pragma once

#include <string>

#include "solver/scene.h"

namespace yeegap::solver {

/// Whether `s` is a laterally uniform stack along `axis`: bodies are slabs normal to it only, the
/// two other axes have periodic (or bloch) edges, and no dipole or tfsf box breaks the symmetry.
bool laterally_uniform(const Scene& s, int axis);

/// The same scene on one cell per lateral axis; `note` (if given) receives a line for `check`.
Scene as_one_dimensional(const Scene& s, int axis, std::string* note = nullptr);

}  // namespace yeegap::solver
