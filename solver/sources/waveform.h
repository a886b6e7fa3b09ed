// Time dependence of a source's dipole moment p(t) and of its current moment I l(t) = dp/dt.
//   pulse:      p(t) = exp(-(t - t0)^2 / (2 tau^2)) sin(omega_c (t - t0)); odd about t0, so it
//               carries no static (zero-frequency) part and leaves no charge behind.
//   continuous: p(t) = r(t) sin(omega t), r rising smoothly from 0 to 1 over the ramp time.
// For a pulse, tau follows from the band: the Gaussian spectrum exp(-(w-wc)^2 tau^2 / 2) carries
// 1 % of its peak power at the band edges, so tau = sqrt(2 ln 10) / half-width.
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
