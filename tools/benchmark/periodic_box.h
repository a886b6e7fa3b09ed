// The real solver on a periodic box, timed: Simulation::step() as a run calls it (halo copies, H and
// E updates, the dipole source, and what the filling adds), in cell updates per second. Filled
// with three plane waves first, so every field component is non-zero from the first step.
#pragma once

#include <cstdint>
#include <memory>

namespace yeegap::solver {
class Simulation;
class FieldMapRecorder;
}

namespace yeegap::benchmark {

/// What fills the box: vacuum, or gold everywhere (library "Au", Rakic et al.: one Drude and five
/// Lorentz poles, the cost of pole currents).
enum class BoxFill { vacuum, gold };

/// Frequencies of the field map whose cost field_map_seconds_per_step() times.
inline constexpr int field_map_frequencies = 20;

class PeriodicBox {
 public:
  /// Builds a cube of `cells` cells per axis with the current OpenMP thread count.
  PeriodicBox(int cells, BoxFill fill);
  ~PeriodicBox();
  PeriodicBox(const PeriodicBox&) = delete;
  PeriodicBox& operator=(const PeriodicBox&) = delete;

  /// Untimed steps: first touches, page faults, caches.
  void warm_up(int steps);
  /// Runs `steps` steps; cells * steps / seconds / 1e6.
  double timed_mcells_per_second(int steps);
  /// Seconds per step that a field map of 20 frequencies and all six components on the plane
  /// through the centre normal to z adds: its recorder's two samples of a step (after H, after E),
  /// called on this box's fields as the step calls them (a DFT term every dft_sample_stride() steps),
  /// timed over `steps` steps.
  double field_map_seconds_per_step(int steps);
  /// Fingerprint of all six field arrays: the same for any thread count after the same steps.
  std::uint64_t field_hash() const;

 private:
  std::unique_ptr<solver::Simulation> sim_;
  std::unique_ptr<solver::FieldMapRecorder> map_;  // built on first use
};

}  // namespace yeegap::benchmark
