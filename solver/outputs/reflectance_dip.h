// The reflectance dip of a sampled curve R(x) (x = angle of incidence or wavelength) and the
// surface-plasmon sensor figures built on it. The minimum comes from a least-squares fit of the
// single-resonance form R = B |x - z|^2 / |x - p|^2 (one zero and one pole of r near the real axis;
// Raether, Surface Plasmons, Springer 1988, ch. 2, where it becomes the Lorentzian dip). Every
// definition, and why this fit, is in docs/sensor.md; x may be in any unit, results share it.
#pragma once

#include <limits>
#include <span>
#include <string>

namespace yeegap::solver {

struct DipOptions {
  // The fit uses the samples below R_low + fit_level (baseline - R_low), R_low the lowest sample:
  // the bottom quarter of the dip, where the single-resonance form holds best (docs/sensor.md).
  double fit_level = 0.25;
  int min_fit_points = 7;     // the window is widened to at least this many samples (5 unknowns)
  int min_width_points = 5;   // fewer samples inside the half-depth width: flagged unresolved
  double min_depth = 0.05;    // baseline - R_min below this (absolute reflectance): flagged shallow
};

/// Why a dip's figures should not be trusted; 0 means none of these.
enum DipFlag : unsigned {
  dip_at_scan_edge = 1u << 0,  // the lowest sample is the first or last: the minimum may lie outside
  dip_shallow = 1u << 1,       // depth below DipOptions::min_depth
  dip_unresolved = 1u << 2,    // fewer than min_width_points samples inside the half-depth width
  dip_fit_fallback = 1u << 3,  // the resonance form did not fit: parabola through the three lowest samples
};

struct ReflectanceDip {
  static constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  double position = nan;    // x of the fitted minimum
  double r_min = nan;       // fitted minimum reflectance
  double baseline = nan;    // the lower of the two shoulder maxima (highest sample each side)
  double half_level = nan;  // (baseline + r_min) / 2
  double left = nan;        // x where R crosses half_level below the minimum (cubic interpolation)
  double right = nan;       // ... and above it
  double width = nan;       // full width at half depth: right - left
  int fit_points = 0;       // samples in the fit
  int width_points = 0;     // samples strictly between left and right
  unsigned flags = 0;       // DipFlag bits
  bool ok() const { return flags == 0; }
};

/// The dip of R sampled at strictly increasing x (at least one sample; the same length as x).
ReflectanceDip find_reflectance_dip(std::span<const double> x, std::span<const double> reflectance,
                                    const DipOptions& options = {});

/// The flags in words, joined by "; " ("" for none), for messages and results files.
std::string describe_dip_flags(unsigned flags, const DipOptions& options = {});

struct SensorFigures {
  static constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  double shift = nan;            // position(n + delta_n) - position(n), x unit
  double sensitivity = nan;      // shift / delta_n: x unit per refractive-index unit (RIU)
  double figure_of_merit = nan;  // |sensitivity| / width of the reference dip: 1/RIU
  unsigned flags = 0;            // the union of both dips' flags
};

/// Sensitivity and figure of merit from the dip at the sensing medium's index n (reference) and at
/// n + delta_n (raised). delta_n must be non-zero.
SensorFigures sensor_figures(const ReflectanceDip& reference, const ReflectanceDip& raised, double delta_n);

}  // namespace yeegap::solver
