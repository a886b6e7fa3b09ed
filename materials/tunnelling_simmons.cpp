// Simmons 1963 low-bias formulas (see tunnelling_simmons.h); the low-voltage limit of his eq. for J(V)
// is derived in physics.md 1.7 (dJ/dV at V = 0 with A sqrt(phi_bar) >> 1).
#include "materials/tunnelling_simmons.h"

#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::materials {

SimmonsBarrier simmons_image_barrier(double barrier_height, double width, double relative_permittivity) {
  YG_CHECK(barrier_height > 0 && width > 0 && relative_permittivity > 0,
           fmt::format("Simmons barrier needs positive height {} J, width {} m, permittivity {}", barrier_height,
                       width, relative_permittivity));
  SimmonsBarrier b;
  const double s = width;
  b.lambda = constants::e_charge * constants::e_charge * std::log(2.0) /
             (8.0 * constants::pi * relative_permittivity * constants::eps0 * s);
  b.s1 = 1.2 * b.lambda * s / barrier_height;
  b.s2 = s - b.s1;
  b.effective_width = b.s2 - b.s1;
  if (b.effective_width <= 0) {
    b.collapsed = true;
    b.mean_height = std::numeric_limits<double>::quiet_NaN();
    return b;
  }
  b.mean_height = barrier_height - 1.15 * b.lambda * s / b.effective_width *
                                       std::log(b.s2 * (s - b.s1) / (b.s1 * (s - b.s2)));
  b.collapsed = !(b.mean_height > 0);
  return b;
}

double simmons_conductance_per_area(double mean_height, double effective_width) {
  if (!(mean_height > 0) || !(effective_width > 0)) return std::numeric_limits<double>::quiet_NaN();
  const double e_over_h = constants::e_charge / constants::h_planck;
  const double root = std::sqrt(2.0 * constants::m_e * mean_height);
  return e_over_h * e_over_h * root / effective_width *
         std::exp(-4.0 * constants::pi * effective_width * root / constants::h_planck);
}

}  // namespace yeegap::materials
