// Source time functions (see waveform.h).
#include "solver/sources/waveform.h"

#include <cmath>
#include <limits>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::solver {

namespace {
// The pulse starts this many tau before its peak: exp(-36/2) = 1.5e-8 of the peak, below float
// resolution of the fields it drives, so switching on causes no visible step.
constexpr double pulse_half_length_in_tau = 6.0;
}  // namespace

SourceTime::SourceTime(const Waveform& w) : kind_(w.kind) {
  if (kind_ == Waveform::Kind::pulse) {
    YG_CHECK(w.omega_max > w.omega_min && w.omega_min >= 0, "a pulse needs a band with omega_max > omega_min");
    omega_ = 0.5 * (w.omega_min + w.omega_max);
    const double half_width = 0.5 * (w.omega_max - w.omega_min);
    tau_ = std::sqrt(2.0 * std::log(10.0)) / half_width;
    t0_ = pulse_half_length_in_tau * tau_;
    end_ = 2.0 * t0_;
  } else {
    YG_CHECK(w.omega_min > 0, "a continuous wave needs a positive frequency");
    omega_ = w.omega_min;
    ramp_ = w.ramp_time > 0 ? w.ramp_time : 10.0 * 2.0 * constants::pi / omega_;
    end_ = std::numeric_limits<double>::infinity();
  }
}

double SourceTime::moment(double t) const {
  if (kind_ == Waveform::Kind::pulse) {
    if (t < 0 || t > end_) return 0;
    const double u = t - t0_;
    return std::exp(-u * u / (2 * tau_ * tau_)) * std::sin(omega_ * u);
  }
  if (t <= 0) return 0;
  // r(t) = sin^2(pi t / 2 ramp): rises from 0 to 1 with zero slope at both ends.
  const double r = t < ramp_ ? std::pow(std::sin(0.5 * constants::pi * t / ramp_), 2) : 1.0;
  return r * std::sin(omega_ * t);
}

double SourceTime::current(double t) const {
  if (kind_ == Waveform::Kind::pulse) {
    if (t < 0 || t > end_) return 0;
    const double u = t - t0_;
    const double g = std::exp(-u * u / (2 * tau_ * tau_));
    return g * (omega_ * std::cos(omega_ * u) - u / (tau_ * tau_) * std::sin(omega_ * u));
  }
  if (t <= 0) return 0;
  const double x = 0.5 * constants::pi * t / ramp_;
  const double r = t < ramp_ ? std::pow(std::sin(x), 2) : 1.0;
  const double dr = t < ramp_ ? 2 * std::sin(x) * std::cos(x) * 0.5 * constants::pi / ramp_ : 0.0;
  return dr * std::sin(omega_ * t) + r * omega_ * std::cos(omega_ * t);
}

}  // namespace yeegap::solver
