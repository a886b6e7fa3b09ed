// Test helper: R(theta) of a planar stack from the transfer-matrix module (materials/transfer_matrix.h,
// Born & Wolf's characteristic matrix) sampled like an angle scan, and the exact minimum of R(theta)
// by golden-section search, as the reference the dip finder is measured against.
#pragma once

#include <cmath>
#include <vector>

#include "base/constants.h"
#include "materials/transfer_matrix.h"

namespace yeegap::testing {

struct AngleScan {
  std::vector<double> theta_deg, r;
};

inline double tmm_reflectance(const materials::Multilayer& m, double wavelength, double theta_deg,
                              materials::Polarization pol = materials::Polarization::p) {
  const double omega = 2 * constants::pi * constants::c0 / wavelength;
  return materials::stack_response(m, omega, theta_deg * constants::pi / 180, pol).R;
}

inline AngleScan tmm_angle_scan(const materials::Multilayer& m, double wavelength, double from_deg, double to_deg,
                                double step_deg, materials::Polarization pol = materials::Polarization::p) {
  AngleScan s;
  for (int k = 0; from_deg + k * step_deg <= to_deg + 1e-9; ++k) {
    s.theta_deg.push_back(from_deg + k * step_deg);
    s.r.push_back(tmm_reflectance(m, wavelength, s.theta_deg.back(), pol));
  }
  return s;
}

/// Angle (deg) of least p reflectance between lo and hi (one minimum there), to ~1e-12 deg.
inline double tmm_minimum_deg(const materials::Multilayer& m, double wavelength, double lo, double hi) {
  const double g = (std::sqrt(5.0) - 1) / 2;
  for (int it = 0; it < 120; ++it) {
    const double a = hi - g * (hi - lo), b = lo + g * (hi - lo);
    if (tmm_reflectance(m, wavelength, a) < tmm_reflectance(m, wavelength, b)) hi = b;
    else lo = a;
  }
  return 0.5 * (lo + hi);
}

}  // namespace yeegap::testing
