// The scalar figures a sweep's merged table gets from each point's run: every output record's
// headlines (solver/outputs/record.h: the peak of each spectrum, the peak decay-rate enhancement),
// then the families below that are not an output's (the narrowest tunnelling gap). An output's new
// figure is a headline in its record; the table, CSV and docs list pick it up.
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
  const char* name;     // the family, for docs and --help: "output_headlines"
  const char* summary;  // one line
  FigureFunction compute;
};

/// Every figure family, in the order their columns appear.
const std::vector<FigureEntry>& figure_catalog();

/// All figures of one run, from every catalog entry, in catalog order.
std::vector<Figure> compute_figures(const solver::RunResults& results, const solver::Scene& scene);

}  // namespace yeegap::io
