// Catches a field that grows from a small seed after the sources have ended. A passive scene's
// field energy then only falls, give or take what the media's polarization hands back (a factor of a
// few); an unstable mode seeded far below the peak (an absorber corner over a weakly damped metal,
// docs/reliability.md row 50) shows as the energy's envelope climbing far above its lowest value.
#pragma once

#include <deque>
#include <utility>

#include "solver/scene.h"

namespace yeegap::solver {

class GrowthWatch {
 public:
  /// The envelope is the largest sample of the last `window_steps` steps: long enough to span the
  /// exchange of field and polarization energy in a resonance (a few periods), so its dips do not
  /// count as a low.
  explicit GrowthWatch(long window_steps);

  /// Adds the field energy at step n (sources over) with the run's peak so far; true when the
  /// envelope stands `rebound_factor` above the lowest full-window envelope seen and above
  /// `noise_floor` times the peak (single-precision fields leave a floor of about 1e-12 of it).
  bool add(long n, double energy, double peak);

  static constexpr double rebound_factor = 100;
  static constexpr double noise_floor = 1e-8;

 private:
  long window_;
  long first_ = -1;                         // step of the first sample
  double lowest_ = 0;                       // lowest full-window envelope, 0 until one is complete
  std::deque<std::pair<long, double>> samples_;
};

/// The envelope window for a scene: two periods of its lowest source frequency, at least 400 steps.
long growth_window_steps(const Scene& s, double dt);

}  // namespace yeegap::solver
