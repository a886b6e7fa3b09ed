// The figure catalog of sweep_figures.h: the outputs' headlines, then the families of their own.
// Values are SI except where the name ends in a unit (wavelengths in nm, gap widths in nm),
// following the results file's rule (docs/results_file.md).
#include "io/sweep/sweep_figures.h"

#include <algorithm>
#include <numeric>

#include <fmt/format.h>

#include "base/errors.h"
#include "base/units.h"
#include "solver/outputs/result_records.h"

namespace yeegap::io {

namespace {

// Every output's headlines, named "<output>.<headline>".
void output_headlines(const solver::RunResults& r, const solver::Scene& scene, std::vector<Figure>& out) {
  for (const solver::Record& record : solver::records_of(r, scene))
    for (const solver::Headline& h : record.headlines)
      out.push_back({fmt::format("{}.{}", record.name, h.name), h.units, h.description, h.value});
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
      {"output_headlines", "per output its headline figures: for cross_sections the extinction, scattering and "
                           "absorption peak and its wavelength; for flux and far_field the power peak and its "
                           "wavelength; for decay_rate the largest total enhancement and its wavelength",
       output_headlines},
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
