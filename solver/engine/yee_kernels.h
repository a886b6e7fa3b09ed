// The two bulk updates of the Yee scheme (Taflove & Hagness 2005, ch. 3, eqs. 3.19 and 3.20):
//   H^{n+1/2} = H^{n-1/2} - (dt/mu0) curl E^n
//   E^{n+1}   = ca E^n + cb curl H^{n+1/2}       (ca, cb from eps_inf and sigma per material)
// Coordinate stretching kappa of the CPML is folded into the inverse spacings, so the bulk loops
// have no boundary branches; the CPML's convolution terms are added by cpml.cpp on its slabs only.
#pragma once

#include <array>
#include <cstdint>
#include <vector>

#include "solver/engine/fields.h"

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

/// Instruction set of the bulk loops. Both paths do the same float operations in the same order
/// for every cell (no fused multiply-add), so they give the same bits; AVX2 handles 8 floats per
/// instruction instead of 4, which on x86-64 lets the loops keep up with memory. `automatic` takes
/// AVX2 when the processor has it; a path this build or processor cannot run falls back to baseline
/// (the compiler's target, SSE2 on plain x86-64).
enum class KernelIsa : std::uint8_t { automatic, baseline, avx2 };
inline constexpr std::array<const char*, 3> kernel_isa_names = {"automatic", "baseline", "avx2"};

/// The path a request runs on this processor: baseline or avx2, never automatic.
KernelIsa resolved_kernel_isa(KernelIsa requested = KernelIsa::automatic);

void update_h(Fields& f, const CurlCoefficients& cc, KernelIsa isa = KernelIsa::automatic);
void update_e(Fields& f, const CurlCoefficients& cc, const ECoefficients& ec, const MaterialIndex& mi,
              KernelIsa isa = KernelIsa::automatic);

}  // namespace yeegap::solver
