// Sellmeier dispersion n^2 = a0 + sum_j B_j lambda^2 / (lambda^2 - C_j), as glass datasheets and
// papers give it (lambda in micrometres, C_j in um^2), mapped exactly onto lossless Lorentz poles:
// B lambda^2/(lambda^2 - C) = B omega_j^2/(omega_j^2 - omega^2) with omega_j = 2 pi c / sqrt(C).
#pragma once

#include <vector>

#include "materials/pole_set.h"

namespace yeegap::materials {

struct SellmeierTerm {
  double b = 0;        // B_j, dimensionless
  double c_um2 = 0;    // C_j, um^2 (the square of the resonance wavelength in um)
};

/// eps_inf = a0 and one lossless Lorentz pole (delta_eps = B_j, omega_0 = 2 pi c / sqrt(C_j)) per term.
PoleSet sellmeier_poles(double a0, const std::vector<SellmeierTerm>& terms);

/// n^2 straight from the formula at a vacuum wavelength (m), for checking the mapping.
double sellmeier_index_squared(double a0, const std::vector<SellmeierTerm>& terms, double wavelength);

}  // namespace yeegap::materials
