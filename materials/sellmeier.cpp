// Sellmeier terms as lossless Lorentz poles (exact; see sellmeier.h).
#include "materials/sellmeier.h"

#include <cmath>

#include "base/errors.h"
#include "base/units.h"

namespace yeegap::materials {

PoleSet sellmeier_poles(double a0, const std::vector<SellmeierTerm>& terms) {
  PoleSet p;
  p.eps_inf = a0;
  for (const SellmeierTerm& t : terms) {
    YG_CHECK(t.c_um2 > 0, "a Sellmeier term needs C > 0 to be a resonance");
    const double resonance_wavelength = std::sqrt(t.c_um2) * units::um;
    p.lorentz.push_back({t.b, units::wavelength_to_omega(resonance_wavelength), 0.0});
  }
  return p;
}

double sellmeier_index_squared(double a0, const std::vector<SellmeierTerm>& terms, double wavelength) {
  const double l2 = (wavelength / units::um) * (wavelength / units::um);
  double n2 = a0;
  for (const SellmeierTerm& t : terms) n2 += t.b * l2 / (l2 - t.c_um2);
  return n2;
}

}  // namespace yeegap::materials
