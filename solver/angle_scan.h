// Angle scan at one wavelength: one short run per angle of a plane_wave's `angles` list, each at
// its own in-plane wavevector n k0 sin(theta) and reporting only the scan's frequency, so every row
// of the R(theta), T(theta), A(theta) table is at exactly its angle (physics.md 3.7, first way
// around the fixed-k problem). Runs are independent: several go at once over the threads, each on
// one thread (a 1D stack is far too small to split), and results do not depend on the thread count.
#pragma once

#include <functional>

#include "solver/simulation.h"

namespace yeegap::solver {

/// Runs every angle; the results hold the grid and materials of the first run and one
/// ReflectanceResult with angle_scan = true (user fluxes, maps and probes are per run and dropped).
/// `progress` is called (from one thread at a time) as angles finish: step = angles done.
RunResults run_angle_scan(const Scene& scene, const std::function<void(const Progress&)>& progress = {});

/// Figures for `check`: those of the first angle's run, with the number of runs noted.
ModelSummary plan_angle_scan(const Scene& scene);

}  // namespace yeegap::solver
