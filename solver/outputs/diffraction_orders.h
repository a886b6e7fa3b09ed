// Diffraction orders of a Bloch-periodic field on a plane in a homogeneous medium: the Rayleigh
// expansion of the tangential E and H (Petit (ed.), Electromagnetic Theory of Gratings, Springer 1980,
// ch. 1), order (m_b, m_c) at k_par + 2 pi (m_b / period_b, m_c / period_c), and each one's flux. From
// the flux planes' own Yee samples, so the orders add up (Parseval) to the plane's flux.
#pragma once

#include <array>
#include <cstddef>
#include <vector>

#include "base/vec3.h"
#include "solver/results.h"

namespace yeegap::solver {

/// The plane's lattice: which axis it is normal to and the uniform lateral cells of the Bloch cell.
struct OrderLattice {
  int axis = 2;
  std::array<int, 2> lateral{0, 1};    // axis+1, axis+2
  std::array<int, 2> cells{1, 1};      // lateral cells; one cell: order 0 only along that axis
  std::array<double, 2> step{};        // m, lateral cell sizes
  Vec3 k_parallel;                     // rad/m, the run's in-plane wavevector
  std::array<double, 2> period() const { return {cells[0] * step[0], cells[1] * step[1]}; }
};

struct OrderPower {
  int m_b = 0, m_c = 0;
  Vec3 direction;                      // unit vector of travel in the medium
  double angle = 0;                    // rad, polar angle of travel from the axis
  double intensity = 0;                // W s^2/m^2: time-averaged Poynting flux along the travel, per area
};

/// The propagating orders (|k_par,m| < n k0, continuum criterion) at map frequency `fq`, for waves
/// that travel towards `travel_sign` * axis in a medium of index n. `map` is a plane normal to the
/// axis holding the components E_b, E_c, H_b, H_c in that order (b, c the lateral axes), as the
/// field-map recorder interpolates them to the nodes (that interpolation is undone per order).
std::vector<OrderPower> plane_orders(const FieldMapResult& map, std::size_t fq, const OrderLattice& lattice,
                                     double index, int travel_sign);

/// The four components plane_orders() reads, in its order.
std::array<Component, 4> order_components(int axis);

}  // namespace yeegap::solver
