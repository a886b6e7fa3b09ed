// The scalar figures a sweep's merged table gets from each point's run: a small catalog of
// functions, each turning one run's results into named numbers (the peak of every spectrum, the
// peak decay-rate enhancement, the narrowest tunnelling gap). A new figure is one function here
// and its line in the catalog (sweep_figures.cpp); the table, CSV and docs list pick it up.
#pragma once

#include <string>
#include <vector>

#include "solver/results.h"
#include "solver/scene.h"

namespace yeegap::io {

struct Figure {
  std::string name;         // column name: "<output>.<quantity>", e.g. "dimer.extinction_peak"
  std::string unit;         // SI ("m^2", "W s^2"), "1", or the unit a name ends in ("nm" for *_nm)
  std::string description;  // one line for the table's attribute
  double value = 0;
};

using FigureFunction = void (*)(const solver::RunResults&, const solver::Scene&, std::vector<Figure>&);

struct FigureEntry {
  const char* name;     // the family, for docs and --help: "spectrum_peaks"
  const char* summary;  // one line
  FigureFunction compute;
};

/// Every figure family, in the order their columns appear.
const std::vector<FigureEntry>& figure_catalog();

/// All figures of one run, from every catalog entry, in catalog order.
std::vector<Figure> compute_figures(const solver::RunResults& results, const solver::Scene& scene);

/// The maximum of a sampled spectrum: the largest sample, refined by the parabola through it and
/// its two neighbours in frequency (when it is not at the band's edge), so a peak between two
/// samples moves smoothly across a sweep instead of jumping from sample to sample.
struct Peak {
  double omega = 0;  // rad/s
  double value = 0;
};
/// `omegas` in any order (sorted here), values aligned with them; both non-empty, equal sizes.
Peak spectrum_peak(const std::vector<double>& omegas, const std::vector<double>& values);

}  // namespace yeegap::io
