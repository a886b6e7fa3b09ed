// Angle scan at one wavelength: one short run per angle of a plane_wave's `angles` list, each at
// its own in-plane wavevector n k0 sin(theta) and reporting only the scan's frequency, so every row
// of the R(theta), T(theta), A(theta) table is at exactly its angle (physics.md 3.7, first way
// around the fixed-k problem). Runs are independent: several go at once over the threads, each on
// one thread (a 1D stack is far too small to split), and results do not depend on the thread count.
// Checkpoints keep whole angles: a finished angle's row is kept, an unfinished run is dropped and
// runs again from its start on resume (each run is short; its fields are not worth storing).
#pragma once

#include <functional>
#include <mutex>
#include <string>
#include <vector>

#include "solver/engine/grid.h"
#include "solver/engine/simulation.h"

namespace yeegap::solver {

class AngleScan : public Checkpointable {
 public:
  /// Prepares every angle's run, so what cannot run is refused (RunError) before any starts.
  explicit AngleScan(const Scene& scene);

  /// Runs the angles not finished yet, several at once. `between_steps` is called between the
  /// steps of the runs, by one thread at a time, never while a finished row is being stored (a
  /// checkpoint may be taken there). When it returns true the runs under way stop and are dropped,
  /// and the results hold the finished angles only, with stop_reason "interrupted". `progress` is
  /// called as angles finish: step = angles finished.
  RunResults run(const std::function<void(const Progress&)>& progress = {},
                 const std::function<bool()>& between_steps = {});
  /// The grid and materials of the scan's runs and one ReflectanceResult (angle_scan = true) with a
  /// row per finished angle, in the scene's order.
  RunResults results();

  std::size_t angle_count() const { return angles_.size(); }
  std::size_t finished_count() const;

  // Checkpoints: one entry per angle (finished or not, and the finished run's row and figures).
  const Grid& grid() const override { return grid_; }   // the first angle's; every angle has the same
  double dt() const override { return dt_; }             // s, the first angle's
  StateCounters state_counters() const override;         // step = angles finished
  void restore_counters(const StateCounters& c) override;
  StateArrays state_arrays() override;

 private:
  void store(std::size_t i, const RunResults& r);  // under mutex_
  void take_static_parts(const RunResults& r);     // grid, materials, gaps, the table's header

  Scene scene_;
  std::vector<double> angles_;
  Grid grid_;
  double dt_ = 0;
  // Per angle; doubles so a checkpoint stores them as they are (a step count is exact below 2^53).
  std::vector<double> finished_, omega_, angle_, k_parallel_, reflectance_, transmittance_, absorptance_, steps_,
      energy_fraction_;
  RunResults static_;  // grid, materials, gaps and the table's header, from any run of the scan
  bool have_static_ = false;
  double wall_seconds_ = 0;
  std::string stop_reason_;
  std::mutex mutex_;  // finished rows are stored, and between_steps called, under it
};

/// Runs every angle (AngleScan::run without checkpoints).
RunResults run_angle_scan(const Scene& scene, const std::function<void(const Progress&)>& progress = {});

/// Figures for `check`: those of the first angle's run, with the number of runs noted.
ModelSummary plan_angle_scan(const Scene& scene);

}  // namespace yeegap::solver
