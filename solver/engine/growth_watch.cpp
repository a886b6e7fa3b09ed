// GrowthWatch (see growth_watch.h): a sliding maximum of the sampled field energy and the lowest
// value that maximum has taken once a whole window has passed.
#include "solver/engine/growth_watch.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "base/constants.h"

namespace yeegap::solver {

GrowthWatch::GrowthWatch(long window_steps) : window_(std::max(1L, window_steps)) {}

bool GrowthWatch::add(long n, double energy, double peak) {
  if (first_ < 0) first_ = n;
  samples_.emplace_back(n, energy);
  while (!samples_.empty() && samples_.front().first <= n - window_) samples_.pop_front();
  if (n - first_ < window_) return false;  // the first envelope is not complete yet
  double envelope = 0;
  for (const auto& s : samples_) envelope = std::max(envelope, s.second);
  if (lowest_ <= 0 || envelope < lowest_) lowest_ = envelope;
  return lowest_ > 0 && envelope > rebound_factor * lowest_ && envelope > noise_floor * peak;
}

long growth_window_steps(const Scene& s, double dt) {
  double lowest = std::numeric_limits<double>::infinity();
  auto take = [&](const Waveform& w) { lowest = std::min(lowest, w.omega_min > 0 ? w.omega_min : w.omega_max); };
  for (const auto& d : s.dipoles) take(d.waveform);
  for (const auto& p : s.plane_waves) take(p.waveform);
  for (const auto& b : s.bloch_waves) take(b.waveform);
  long steps = 400;
  if (std::isfinite(lowest) && lowest > 0 && dt > 0)
    steps = std::max(steps, static_cast<long>(std::min(1e9, std::ceil(2 * 2 * constants::pi / (lowest * dt)))));
  return steps;
}

}  // namespace yeegap::solver
