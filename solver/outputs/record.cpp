// Helpers every output's record uses: frequency axes, spectrum peaks as headlines, size checks.
#include "solver/outputs/record.h"

#include <algorithm>
#include <numeric>
#include <stdexcept>

#include <fmt/format.h>

#include "base/errors.h"
#include "base/units.h"

namespace yeegap::solver {

Quantity& Record::add(std::string quantity_name, std::string units, ArrayValues values, std::string description) {
  quantities.push_back({std::move(quantity_name), std::move(units), std::move(description), std::move(values), {}, {}, false});
  return quantities.back();
}

const Quantity* Record::find(const std::string& quantity_name) const {
  for (const Quantity& q : quantities)
    if (q.name == quantity_name) return &q;
  return nullptr;
}

void add_frequency_axes(Record& r, const std::vector<double>& omegas) {
  std::vector<double> wavelength_nm, energy_eV;
  for (double w : omegas) {
    wavelength_nm.push_back(units::omega_to_wavelength(w) / units::nm);
    energy_eV.push_back(units::omega_to_eV(w));
  }
  r.add("omega", "rad/s", omegas);
  r.add("wavelength_nm", "nm", std::move(wavelength_nm), "vacuum wavelength 2 pi c / omega");
  r.add("photon_energy_eV", "eV", std::move(energy_eV), "hbar omega");
}

Peak spectrum_peak(const std::vector<double>& omegas, const std::vector<double>& values) {
  YG_CHECK(!omegas.empty() && omegas.size() == values.size(),
           fmt::format("a spectrum needs samples: {} frequencies, {} values", omegas.size(), values.size()));
  std::vector<std::size_t> order(omegas.size());
  std::iota(order.begin(), order.end(), 0);
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return omegas[a] < omegas[b]; });
  std::size_t best = 0;
  for (std::size_t k = 1; k < order.size(); ++k)
    if (values[order[k]] > values[order[best]]) best = k;
  Peak peak{omegas[order[best]], values[order[best]]};
  if (best == 0 || best + 1 == order.size()) return peak;
  // y = y1 + a (w - w1)^2 + b (w - w1) through the three samples around the largest one.
  const double w0 = omegas[order[best - 1]], w1 = omegas[order[best]], w2 = omegas[order[best + 1]];
  const double y0 = values[order[best - 1]], y1 = values[order[best]], y2 = values[order[best + 1]];
  const double h0 = w0 - w1, h2 = w2 - w1;
  const double s0 = (y0 - y1) / h0, s2 = (y2 - y1) / h2;  // slopes of the two chords from the middle
  const double a = (s2 - s0) / (h2 - h0);
  const double b = s0 - a * h0;
  if (!(a < 0)) return peak;  // flat top (equal neighbours): the sample is as good as any
  const double dw = std::clamp(-b / (2 * a), h0, h2);
  peak.omega = w1 + dw;
  peak.value = y1 + a * dw * dw + b * dw;
  return peak;
}

void add_peak_headlines(Record& r, const std::string& what, const std::vector<double>& omegas,
                        const std::vector<double>& values, const std::string& units) {
  if (omegas.empty() || omegas.size() != values.size()) return;
  const Peak p = spectrum_peak(omegas, values);
  r.headlines.push_back({what + "_peak", units, fmt::format("largest {} over the output's frequencies", what), p.value});
  r.headlines.push_back({what + "_peak_wavelength_nm", "nm", fmt::format("vacuum wavelength of the largest {}", what),
                         units::omega_to_wavelength(p.omega) / units::nm});
}

void require_rows(const Record& r, std::size_t n, std::initializer_list<std::size_t> sizes, const char* what) {
  for (std::size_t s : sizes)
    if (s != n)
      throw std::invalid_argument(
          fmt::format("{} '{}' has arrays that do not match its {} {}", r.kind, r.name, n, what));
}

}  // namespace yeegap::solver
