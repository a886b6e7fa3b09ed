// Diffraction orders from the DFT fields on a plane (see diffraction_orders.h). A node value of the
// field map is the mean of two Yee samples half a cell apart, which multiplies a Bloch mode by
// cos(k h/2) exactly; dividing restores the samples' own coefficient, and E_b, H_c (and E_c, H_b)
// share lateral positions, so their product is the flux recorder's, order by order.
#include "solver/outputs/diffraction_orders.h"

#include <algorithm>
#include <cmath>
#include <complex>

#include <fmt/format.h>

#include "base/errors.h"
#include "base/constants.h"

namespace yeegap::solver {

namespace {

using Complex = std::complex<double>;

// Order range [lo, hi] along one lateral axis where |k_t + m G| < n k0, within the Nyquist window
// of the lattice (an order the cells cannot represent is not one of its modes).
std::array<int, 2> order_range(double k_t, double nk0, int cells, double period) {
  if (cells <= 1) return {0, 0};
  const double G = 2 * constants::pi / period;
  int lo = static_cast<int>(std::ceil((-nk0 - k_t) / G)), hi = static_cast<int>(std::floor((nk0 - k_t) / G));
  const int nyquist = (cells - 1) / 2;
  lo = std::max(lo, -nyquist), hi = std::min(hi, nyquist);
  return {lo, hi};
}

}  // namespace

std::array<Component, 4> order_components(int axis) {
  const int b = (axis + 1) % 3, c = (axis + 2) % 3;
  return {static_cast<Component>(b), static_cast<Component>(c), static_cast<Component>(3 + b),
          static_cast<Component>(3 + c)};
}

std::vector<OrderPower> plane_orders(const FieldMapResult& map, std::size_t fq, const OrderLattice& L, double index,
                                     int travel_sign) {
  const int a = L.axis, b = L.lateral[0], c = L.lateral[1];
  const std::array<Component, 4> want = order_components(a);
  YG_CHECK(map.components.size() == 4 && std::equal(want.begin(), want.end(), map.components.begin()),
           "an order plane records E_b, E_c, H_b, H_c");
  const std::array<const std::vector<double>*, 3> coords{&map.x, &map.y, &map.z};
  YG_CHECK(coords[a]->size() == 1, fmt::format("an order plane is one node thick along {}", "xyz"[a]));
  const std::array<std::size_t, 3> n{map.x.size(), map.y.size(), map.z.size()};
  for (int q = 0; q < 2; ++q)
    YG_CHECK(static_cast<int>(n[L.lateral[q]]) >= L.cells[q],
             fmt::format("the order plane covers the cell along {}: {} nodes for {} cells", "xyz"[L.lateral[q]],
                         n[L.lateral[q]], L.cells[q]));
  const double omega = map.omegas.at(fq);
  const double nk0 = index * omega / constants::c0;
  const std::array<double, 2> period = L.period();
  const std::array<double, 2> k_inc{L.k_parallel[b], L.k_parallel[c]};
  const auto rb = order_range(k_inc[0], nk0, L.cells[0], period[0]);
  const auto rc = order_range(k_inc[1], nk0, L.cells[1], period[1]);
  const auto& values = map.values.at(fq);
  const double samples = static_cast<double>(L.cells[0]) * L.cells[1];

  std::vector<OrderPower> out;
  for (int mb = rb[0]; mb <= rb[1]; ++mb)
    for (int mc = rc[0]; mc <= rc[1]; ++mc) {
      const double kb = k_inc[0] + (L.cells[0] > 1 ? 2 * constants::pi * mb / period[0] : 0.0);
      const double kc = k_inc[1] + (L.cells[1] > 1 ? 2 * constants::pi * mc / period[1] : 0.0);
      const double s2 = (kb * kb + kc * kc) / (nk0 * nk0);
      if (!(s2 < 1)) continue;  // evanescent: no power leaves along the axis
      std::array<Complex, 4> coef{};
      std::array<int, 3> pos{0, 0, 0};
      for (int ic = 0; ic < L.cells[1]; ++ic)
        for (int ib = 0; ib < L.cells[0]; ++ib) {
          pos[b] = ib, pos[c] = ic;
          const std::size_t flat = (pos[2] * n[1] + pos[1]) * n[0] + pos[0];
          const double phase = -(kb * (*coords[b])[ib] + kc * (*coords[c])[ic]);
          const Complex w = std::polar(1.0 / samples, phase);
          for (int q = 0; q < 4; ++q) coef[q] += values[q][flat] * w;
        }
      // Undo the node interpolation: E_b, H_c are staggered along b; E_c, H_b along c.
      const double fb = L.cells[0] > 1 ? std::cos(0.5 * kb * L.step[0]) : 1.0;
      const double fc = L.cells[1] > 1 ? std::cos(0.5 * kc * L.step[1]) : 1.0;
      coef[0] /= fb, coef[3] /= fb, coef[1] /= fc, coef[2] /= fc;
      // Poynting flux along +axis of the (a, b, c) right-handed frame: E_b H_c* - E_c H_b*.
      const double s_axis = 0.5 * std::real(coef[0] * std::conj(coef[3]) - coef[1] * std::conj(coef[2]));
      OrderPower p;
      p.m_b = mb, p.m_c = mc;
      p.direction[b] = kb / nk0;
      p.direction[c] = kc / nk0;
      p.direction[a] = travel_sign * std::sqrt(1 - s2);
      p.angle = std::asin(std::sqrt(s2));
      p.intensity = travel_sign * s_axis;
      out.push_back(p);
    }
  return out;
}

}  // namespace yeegap::solver
