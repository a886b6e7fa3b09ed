// The figure catalog of sweep_figures.h. Each family is one function; the catalog at the end lists
// them. Values are SI except where the name ends in a unit (wavelengths in nm, gap widths in nm),
// following the results file's rule (docs/results_file.md).
#include "io/sweep/sweep_figures.h"

#include <algorithm>
#include <numeric>

#include <fmt/format.h>

#include "base/errors.h"
#include "base/units.h"

namespace yeegap::io {

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

namespace {

void add_peak(std::vector<Figure>& out, const std::string& prefix, const std::string& what,
              const std::vector<double>& omegas, const std::vector<double>& values, const std::string& unit) {
  if (omegas.empty() || omegas.size() != values.size()) return;
  const Peak p = spectrum_peak(omegas, values);
  out.push_back({fmt::format("{}.{}_peak", prefix, what), unit, fmt::format("largest {} over the output's frequencies", what),
                 p.value});
  out.push_back({fmt::format("{}.{}_peak_wavelength_nm", prefix, what), "nm",
                 fmt::format("vacuum wavelength of the largest {}", what), units::omega_to_wavelength(p.omega) / units::nm});
}

// Every spectrum output: the wavelength and value of its maximum.
void spectrum_peaks(const solver::RunResults& r, const solver::Scene&, std::vector<Figure>& out) {
  for (const auto& c : r.cross_sections) {
    const std::string unit = c.per_unit_length ? "m" : "m^2";
    add_peak(out, c.name, "extinction", c.omegas, c.extinction, unit);
    add_peak(out, c.name, "scattering", c.omegas, c.scattering, unit);
    add_peak(out, c.name, "absorption", c.omegas, c.absorption, unit);
  }
  for (const auto& f : r.fluxes) add_peak(out, f.name, "power", f.omegas, f.power, "W s^2");
  for (const auto& f : r.far_fields) add_peak(out, f.name, "power", f.omegas, f.power, "W s^2");
}

// decay_rate outputs: the largest total (Purcell) enhancement over the output's frequencies.
void decay_rate_peaks(const solver::RunResults& r, const solver::Scene&, std::vector<Figure>& out) {
  for (const auto& d : r.decay_rates) add_peak(out, d.name, "total", d.omegas, d.total, "1");
}

// The tunnelling report: the narrowest gap width on the grid for each pair of bodies.
void narrowest_gaps(const solver::RunResults& r, const solver::Scene& scene, std::vector<Figure>& out) {
  const auto body = [&](int i) {
    const bool named = i >= 0 && i < int(scene.bodies.size()) && !scene.bodies[i].name.empty();
    return named ? scene.bodies[i].name : fmt::format("body{}", i);
  };
  for (const auto& g : r.tunnelling_gaps)
    out.push_back({fmt::format("gap.{}-{}.smallest_width_nm", body(g.pair[0]), body(g.pair[1])), "nm",
                   "smallest local gap width l = d_A + d_B among the gap cells (0 if none)", g.smallest_width / units::nm});
}

}  // namespace

const std::vector<FigureEntry>& figure_catalog() {
  static const std::vector<FigureEntry> catalog = {
      {"spectrum_peaks", "per cross_sections output the extinction, scattering and absorption peak and its wavelength; "
                         "per flux and far_field output the power peak and its wavelength",
       spectrum_peaks},
      {"decay_rate_peaks", "per decay_rate output the largest total enhancement and its wavelength", decay_rate_peaks},
      {"narrowest_gaps", "per tunnelling pair the smallest gap width on the grid, nm", narrowest_gaps},
  };
  return catalog;
}

std::vector<Figure> compute_figures(const solver::RunResults& results, const solver::Scene& scene) {
  std::vector<Figure> out;
  for (const FigureEntry& e : figure_catalog()) e.compute(results, scene, out);
  return out;
}

}  // namespace yeegap::io
