// One decision of how a scene runs, for every caller: `plan_run` says which kind of run it is and
// what it will cost; `make_run` builds exactly that run. `yeegap run`, `check`, `sweep` and tests
// go through these two, so the kind can never be decided twice and differently.
#pragma once

#include <functional>
#include <memory>
#include <string>

#include "solver/engine/simulation.h"

namespace yeegap::solver {

enum class RunKind {
  plain,       // one Simulation of real fields
  bloch,       // complex fields and/or a plane wave in a Bloch cell (bloch_run.h)
  angle_scan,  // one short Bloch run per angle of a plane_wave's `angles` (angle_scan.h)
};

/// What `plan_run` decided. `scene` is the scene as it runs: a laterally uniform stack lit by a
/// plane wave is reduced to one lateral cell (layered_stack.h); otherwise the scene as given.
struct RunPlan {
  RunKind kind = RunKind::plain;
  Scene scene;
  ModelSummary summary;   // grid, time step, steps, memory: known before anything is allocated
  int scans = 1;          // times the angle scan runs: 2 or 3 with a sensor output, else 1
  long angles = 0;        // angles per scan (angle scans only)
  /// One line naming the kind, e.g. "angle scan: 33 angles, 3 scans (sensor), a 1D stack".
  std::string description() const;
};

/// Plans the scene; throws RunError for anything the run would refuse at its start (placements
/// included, up to 1e8 cells: above that the run checks them itself).
RunPlan plan_run(const Scene& scene);

/// A run of any kind, as the plan says: checkpointable, run to its stop rule, then (an angle scan
/// with a sensor output) repeated with the sensing medium changed.
class Run : public Checkpointable {
 public:
  using ProgressHook = std::function<void(const Progress&)>;
  using StopHook = std::function<bool()>;
  ~Run() override = default;
  virtual RunKind kind() const = 0;
  /// Figures of the run as built (a plain run counts its averaged cells here).
  virtual ModelSummary summary() const = 0;
  /// Runs to the stop rule; `between_steps` returning true stops it with stop_reason "interrupted"
  /// and partial results, the state left as a checkpoint needs it.
  virtual RunResults run(const ProgressHook& progress = {}, const StopHook& between_steps = {}) = 0;
  /// The sensor's repeats of a finished angle scan, added to `results` (sensor_scan.h). False when
  /// `between_steps` stopped them (the repeats are not checkpointed). Nothing to do for other kinds.
  virtual bool run_repeats(RunResults& /*results*/, const ProgressHook& /*progress*/ = {},
                           const StopHook& /*between_steps*/ = {}) {
    return true;
  }
  /// How messages name the run's place from its state counter ("step 1200", "12 of 33 angles").
  virtual std::string position(long counter) const { return "step " + std::to_string(counter); }
};

/// Builds the run the plan describes (throws RunError as the constructors do).
std::unique_ptr<Run> make_run(const RunPlan& plan);

/// plan_run, make_run, run and its repeats: a scene from start to results without checkpoints.
/// `between_steps` returning true stops it: stop_reason "interrupted", partial results.
RunResults run_scene(const Scene& scene, const Run::ProgressHook& progress = {}, const Run::StopHook& between_steps = {});

}  // namespace yeegap::solver
