// The real solver on a periodic vacuum box, timed: Simulation::step() as a run calls it (halo
// copies, H and E updates, the dipole source), in cell updates per second. The box is filled with
// three plane waves first, so every field component is non-zero from the first step.
#pragma once

#include <cstdint>
#include <memory>

namespace yeegap::solver {
class Simulation;
}

namespace yeegap::benchmark {

class VacuumBox {
 public:
  /// Builds a cube of `cells` cells per axis with the current OpenMP thread count.
  explicit VacuumBox(int cells);
  ~VacuumBox();
  VacuumBox(const VacuumBox&) = delete;
  VacuumBox& operator=(const VacuumBox&) = delete;

  /// Untimed steps: first touches, page faults, caches.
  void warm_up(int steps);
  /// Runs `steps` steps; cells * steps / seconds / 1e6.
  double timed_mcells_per_second(int steps);
  /// Fingerprint of all six field arrays: the same for any thread count after the same steps.
  std::uint64_t field_hash() const;

 private:
  std::unique_ptr<solver::Simulation> sim_;
};

}  // namespace yeegap::benchmark
