// The records of a plane wave in a Bloch cell: its reflectance table and its diffraction orders.
#include <stdexcept>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/units.h"
#include "solver/outputs/result_records.h"

namespace yeegap::solver {

namespace {

double degrees(double radians) { return radians * 180 / constants::pi; }

std::vector<double> in_degrees(const std::vector<double>& radians) {
  std::vector<double> out;
  for (double a : radians) out.push_back(degrees(a));
  return out;
}

}  // namespace

Record record_of(const ReflectanceResult& x) {
  Record r("reflectance", x.name);
  const std::size_t n = x.omegas.size();
  require_rows(r, n, {x.angles.size(), x.k_parallel.size(), x.reflectance.size(), x.transmittance.size(),
                      x.absorptance.size()}, "rows");
  r.set("angle_scan", std::int32_t{x.angle_scan ? 1 : 0});
  r.set("polarization", std::string(x.p_polarized ? "p" : "s"));
  r.set("incident_index", x.incident_index);
  add_frequency_axes(r, x.omegas);
  r.add("angle", "rad", x.angles, "angle of incidence of each row, from the axis, in the incident medium");
  r.add("angle_deg", "deg", in_degrees(x.angles), "the same in degrees");
  r.add("k_parallel", "rad/m", x.k_parallel, "in-plane wavevector of each row's run (fixed within one run)");
  r.add("reflectance", "1", x.reflectance, "reflected power over incident power");
  r.add("transmittance", "1", x.transmittance, "power through the far side over incident power");
  r.add("absorptance", "1", x.absorptance, "1 - reflectance - transmittance");
  r.summary.heading = fmt::format("  {} ({}, incident index {:.4g}){}: wavelength, angle, R, T, A", x.name,
                                  x.p_polarized ? "p" : "s", x.incident_index,
                                  x.angle_scan ? ", angle scan" : ", each frequency at its own angle");
  for (std::size_t q = 0; q < n; ++q)
    r.summary.rows.push_back(SummaryRow({wavelength_cell(x.omegas[q]),
                                        {"angle_deg", degrees(x.angles[q]), "{:7.3f}", 1, "  ", " deg"},
                                        {"R", x.reflectance[q], "{:.5f}"},
                                        {"T", x.transmittance[q], "{:.5f}"},
                                        {"A", x.absorptance[q], "{:.5f}"}}));
  return r;
}

Record record_of(const DiffractionOrdersResult& x) {
  Record r("orders", x.name);
  const std::size_t rows = x.omegas.size(), n = x.row.size();
  require_rows(r, rows, {x.incidence_angles.size(), x.reflected_sum.size(), x.transmitted_sum.size()}, "rows");
  require_rows(r, n, {x.side.size(), x.order_b.size(), x.order_c.size(), x.direction.size(), x.angle.size(),
                      x.efficiency.size()}, "orders");
  const char* axes = "xyz";
  const int b = (x.axis + 1) % 3, c = (x.axis + 2) % 3;
  r.set("angle_scan", std::int32_t{x.angle_scan ? 1 : 0});
  r.set("axis", std::string(1, axes[x.axis]));
  r.set("lateral_axes", std::vector<std::string>{std::string(1, axes[b]), std::string(1, axes[c])});
  r.set("period", std::vector<double>{x.diffracting[0] ? x.period[0] : 0.0, x.diffracting[1] ? x.period[1] : 0.0});
  r.set("incident_index", x.incident_index);
  r.set("transmitted_index", x.transmitted_index);
  add_frequency_axes(r, x.omegas);
  r.add("incidence_angle", "rad", x.incidence_angles, "angle of incidence of each row, as in the reflectance table");
  r.add("reflected_sum", "1", x.reflected_sum, "sum of the reflected orders' efficiencies of each row");
  r.add("transmitted_sum", "1", x.transmitted_sum, "sum of the transmitted orders' efficiencies of each row");
  std::vector<std::int32_t> order(2 * n);
  std::vector<double> direction(3 * n);
  for (std::size_t i = 0; i < n; ++i) {
    order[2 * i] = x.order_b[i], order[2 * i + 1] = x.order_c[i];
    for (int a = 0; a < 3; ++a) direction[3 * i + a] = x.direction[i][a];
  }
  r.add("row", "1", std::vector<std::int32_t>(x.row.begin(), x.row.end()),
        "the row (frequency or scan angle) of each order");
  r.add("side", "1", std::vector<std::int32_t>(x.side.begin(), x.side.end()), "-1 reflected, +1 transmitted");
  r.add("order", "1", std::move(order), "order number along the lateral axes").shape = {n, 2};
  r.add("direction", "1", std::move(direction), "unit vector of travel (x, y, z), away from the structure").shape = {n, 3};
  r.add("angle", "rad", x.angle, "polar angle of travel from the axis");
  r.add("angle_deg", "deg", in_degrees(x.angle), "the same in degrees");
  r.add("efficiency", "1", x.efficiency, "order power over incident power");

  // The terminal shows one line per row with its orders; --json one object per order.
  r.summary.heading =
      fmt::format("  {}: wavelength, reflected (r) and transmitted (t) orders m: efficiency at angle", x.name);
  for (std::size_t q = 0; q < rows; ++q) {
    SummaryRow line({wavelength_cell(x.omegas[q], "")}, true, false);
    for (std::size_t e = 0; e < n; ++e) {
      if (x.row[e] != static_cast<int>(q)) continue;
      const double angle_deg = degrees(x.angle[e]);
      const std::string label = x.diffracting[1] ? fmt::format("{},{}", x.order_b[e], x.order_c[e])
                                                 : fmt::format("{:+d}", x.order_b[e]);
      line.cells.push_back({"", x.efficiency[e], "{:.4f}", 1, fmt::format("  {}{}: ", x.side[e] < 0 ? "r" : "t", label),
                            fmt::format(" at {:.1f} deg", angle_deg)});
      r.summary.rows.push_back(SummaryRow({json_cell("wavelength_nm", units::omega_to_wavelength(x.omegas[q]) / units::nm),
                                          json_cell("side", double(x.side[e])),
                                          json_cell("order_0", double(x.order_b[e])),
                                          json_cell("order_1", double(x.order_c[e])),
                                          json_cell("angle_deg", angle_deg),
                                          json_cell("efficiency", x.efficiency[e])},
                                          false));
    }
    r.summary.rows.push_back(std::move(line));
  }
  return r;
}

}  // namespace yeegap::solver
