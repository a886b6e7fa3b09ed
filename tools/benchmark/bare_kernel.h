// The hardware's yardstick: a vacuum Yee update with no solver machinery (no material index, no
// per-axis coefficients, no halo copies, no stages), fused so that one pass over memory updates an
// H row and then the E row at the same place. The solver's rate over this one is a ratio that does
// not move with the host's memory bandwidth from week to week.
#pragma once

#include <cstdint>
#include <vector>

namespace yeegap::benchmark {

class BareVacuumBox {
 public:
  /// A cube of `cells` cells per axis, fields in float, walls held at zero (a closed box), filled
  /// with the same three standing plane waves as the solver's vacuum box.
  explicit BareVacuumBox(int cells);

  /// One step, fused: per row, H from the E at step n, then E from the new H. Over the threads by
  /// slabs of planes along z, one barrier per step; the same bits for any thread count.
  void step_fused();
  /// One step as two sweeps over the whole box (H everywhere, then E): the reference the fused
  /// step must reproduce bit for bit.
  void step_split();
  /// Runs `steps` fused steps; cells^3 * steps / seconds / 1e6.
  double timed_mcells_per_second(int steps);
  /// Fingerprint of the six field arrays.
  std::uint64_t field_hash() const;

 private:
  std::size_t at(int i, int j, int k) const { return i + sy_ * j + sz_ * static_cast<std::size_t>(k); }
  void h_row(int j, int k);
  void e_row(int j, int k);

  int n_ = 0;
  std::size_t sy_ = 0, sz_ = 0;
  std::vector<float> hx_, hy_, hz_, ex_, ey_, ez_;
};

}  // namespace yeegap::benchmark
