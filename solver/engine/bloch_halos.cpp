// Bloch halo copies and the time-step limit with a fixed in-plane wavevector (see bloch_halos.h).
#include "solver/engine/bloch_halos.h"

#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::solver {

bool carries_bloch_phase(const DomainSpec& d, int a) { return d.bloch[a] && d.bloch_wavevector[a] != 0; }

bool needs_imaginary_part(const DomainSpec& d) {
  return carries_bloch_phase(d, 0) || carries_bloch_phase(d, 1) || carries_bloch_phase(d, 2);
}

double bloch_phase(const Grid& g, const DomainSpec& d, int a) {
  if (!carries_bloch_phase(d, a)) return 0;
  const double k = d.bloch_wavevector[a];
  if (g.n[a] > 1) return k * (g.nodes[a].back() - g.nodes[a].front());
  const double half = 0.5 * k * g.primal(a, 0);
  if (!(std::abs(half) < 1))
    throw RunError(fmt::format("the Bloch wavevector {:.6g} /m along {} is too large for a one-cell axis of {:.4g} nm "
                               "(k h / 2 must stay below 1)", k, "xyz"[a], g.primal(a, 0) * 1e9));
  return 2 * std::asin(half);
}

double bloch_courant_limit(const Grid& g, const DomainSpec& d) {
  double s = 0;
  for (int a = 0; a < 3; ++a) {
    if (!g.invariant(a)) {
      s += 1.0 / (g.min_spacing(a) * g.min_spacing(a));
    } else if (carries_bloch_phase(d, a)) {
      const double v = std::sin(0.5 * bloch_phase(g, d, a)) / g.primal(a, 0);
      s += v * v;
    }
  }
  return 1.0 / (constants::c0 * std::sqrt(s));
}

void fill_bloch_halos(Fields& re, Fields& im, const Grid& g, const DomainSpec& d, bool electric) {
  const BlockLayout& L = re.layout;
  const int first = electric ? 0 : 3;
  for (int a = 0; a < 3; ++a) {
    if (!carries_bloch_phase(d, a)) continue;
    const int n = L.n[a];
    const int from = electric ? 0 : n - 1, to = electric ? n : -1;
    const double phi = electric ? bloch_phase(g, d, a) : -bloch_phase(g, d, a);
    const double c = std::cos(phi), s = std::sin(phi);
    const int b = a == 0 ? 1 : 0, e = 3 - a - b;
    for (int comp = first; comp < first + 3; ++comp) {
      real* dr = re.c[comp].data();
      real* di = im.c[comp].data();
      // The whole plane including the other axes' halos, as the plain periodic copy does.
      std::array<int, 3> corner{};
      corner[a] = from, corner[b] = -1, corner[e] = -1;
      const std::ptrdiff_t start = L.at(corner[0], corner[1], corner[2]), shift = (to - from) * L.stride(a);
      const std::ptrdiff_t sb = L.stride(b), se = L.stride(e);
      for (int q = 0; q <= L.n[e] + 1; ++q)
        for (int p = 0; p <= L.n[b] + 1; ++p) {
          const std::ptrdiff_t os = start + p * sb + q * se;
          const double vr = dr[os], vi = di[os];
          dr[os + shift] = static_cast<real>(c * vr - s * vi);
          di[os + shift] = static_cast<real>(s * vr + c * vi);
        }
    }
  }
}

}  // namespace yeegap::solver
