// How a scene runs: an ordinary Simulation, a Bloch run (complex fields and/or a plane wave in a
// Bloch cell, bloch_run.h) or an angle scan of Bloch runs (angle_scan.h). A laterally uniform stack
// lit by a plane wave runs as a 1D problem (layered_stack.h). The command-line program calls these
// two and never needs to know which kind of run it got.
#pragma once

#include <functional>

#include "solver/engine/simulation.h"

namespace yeegap::solver {

/// Whether the scene runs as a Bloch run (a plane_wave, or a non-zero Bloch wavevector).
bool is_bloch_scene(const Scene& scene);
/// Figures for `yeegap check`; the mesh notes say which kind of run it is. Throws RunError for
/// anything the run would refuse at its start (placements included, up to 1e8 cells).
ModelSummary plan_scene(const Scene& scene);
/// The scene as a Bloch run or angle scan runs it (a plane-wave stack reduced to one lateral cell),
/// for a caller that builds the run itself to checkpoint it (BlochRun, AngleScan).
Scene bloch_scene_as_run(const Scene& scene);
/// Whether the scene is an angle scan (a plane_wave with `angles`).
bool is_angle_scan(const Scene& scene);
/// The figures of the scene's sensor output (if any) added to `results`, the run's own angle scan:
/// the scan again with the sensing medium's index raised by delta_n (sensor_scan.h), its steps and
/// time added to the summary. RunError if the scene has a sensor but no angle scan.
/// `between_steps` as for AngleScan::run: when it stops a repeat, no sensor figures are added and
/// the result is false (the finished repeats' steps stay counted in the summary).
bool add_sensor_results(const Scene& scene, RunResults& results,
                        const std::function<void(const Progress&)>& progress = {},
                        const std::function<bool()>& between_steps = {});
/// Builds and runs the scene to its stop rule (an angle scan with a sensor output runs twice).
/// `between_steps` is called between time steps; returning true stops the run: its stop_reason is
/// then "interrupted" and the results are partial.
RunResults run_scene(const Scene& scene, const std::function<void(const Progress&)>& progress = {},
                     const std::function<bool()>& between_steps = {});

}  // namespace yeegap::solver
