// Time dependence of a source's dipole moment p(t) and current moment I l(t) = dp/dt. Pulse:
// exp(-(t - t0)^2 / (2 tau^2)) sin(omega_c (t - t0)), odd about t0, so no static part and no charge
// left behind; tau = sqrt(2 ln 10) / half-width puts 1 % of the peak power at the band edges.
// Continuous: r(t) sin(omega t), r rising smoothly from 0 to 1 over the ramp.
#pragma once

#include "solver/scene.h"

namespace yeegap::solver {

class SourceTime {
 public:
  explicit SourceTime(const Waveform& w);
  /// Normalised dipole moment (peak about 1) at time t.
  double moment(double t) const;
  /// Its time derivative, 1/s.
  double current(double t) const;
  /// After this time the source is negligible (pulse) or never (continuous: +infinity).
  double end_time() const { return end_; }
  double centre_omega() const { return omega_; }

 private:
  Waveform::Kind kind_;
  double omega_ = 0, tau_ = 0, t0_ = 0, ramp_ = 0, end_ = 0;
};

}  // namespace yeegap::solver
