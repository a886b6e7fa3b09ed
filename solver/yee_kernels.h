// The two bulk updates of the Yee scheme (Taflove & Hagness 2005, ch. 3, eqs. 3.19 and 3.20):
//   H^{n+1/2} = H^{n-1/2} - (dt/mu0) curl E^n
//   E^{n+1}   = ca E^n + cb curl H^{n+1/2}       (ca, cb from eps_inf and sigma per material)
// Coordinate stretching kappa of the CPML is folded into the inverse spacings, so the bulk loops
// have no boundary branches; the CPML's convolution terms are added by cpml.cpp on its slabs only.
#pragma once

#include <array>
#include <cstdint>
#include <vector>

#include "solver/fields.h"

namespace yeegap::solver {

/// Per-axis inverse spacings used by the curls; H side premultiplied by dt/mu0.
struct CurlCoefficients {
  std::array<std::vector<real>, 3> h;  // [axis][i] = dt / (mu0 kappa(i+1/2) primal(i))
  std::array<std::vector<real>, 3> e;  // [axis][i] = 1 / (kappa(i) dual(i))
};

/// Per-material E update coefficients; index = material index stored per E component.
struct ECoefficients {
  std::vector<real> ca, cb;
};

/// Material index of every E component location, same layout as the fields.
struct MaterialIndex {
  std::array<AlignedVector<std::uint8_t>, 3> e;  // Ex, Ey, Ez locations
};

void update_h(Fields& f, const CurlCoefficients& cc);
void update_e(Fields& f, const CurlCoefficients& cc, const ECoefficients& ec, const MaterialIndex& mi);

}  // namespace yeegap::solver
