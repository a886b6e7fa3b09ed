// The summaries of output_summaries.h: every output's record printed the same way, and the
// tunnelling report. What each output shows is in its record (solver/outputs/result_records.h).
#include "output_summaries.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <set>

#include <fmt/format.h>

#include "base/constants.h"
#include "solver/engine/grid.h"
#include "solver/outputs/result_records.h"

namespace yeegap::cli {

void SummarySink::line(const std::string& text) { std::fprintf(stderr, "%s\n", text.c_str()); }

std::string SummarySink::shown(double v, const char* spec) {
  if (std::isfinite(v)) return fmt::format(fmt::runtime(spec), v);
  undefined_shown_ = true;
  return "undefined";
}

namespace {

// Any record's summary (record.h): its heading, its terminal rows, its JSON rows.
void print_record(const solver::Record& r, SummarySink& out) {
  if (!r.summary.heading.empty()) out.line(r.summary.heading);
  std::vector<std::string> rows;
  JsonObject merged;  // with json_object: every row's cells
  for (const solver::SummaryRow& row : r.summary.rows) {
    std::string line;
    JsonObject json;
    for (const solver::Cell& c : row.cells) {
      const double* number = std::get_if<double>(&c.value);
      if (!c.spec.empty())
        line += c.before + (number ? out.shown(*number * c.scale, c.spec.c_str()) : std::get<std::string>(c.value)) + c.after;
      if (c.key.empty() || !row.in_json) continue;
      JsonObject& to = r.summary.json_object ? merged : json;
      if (number) to.number(c.key, *number);
      else to.text(c.key, std::get<std::string>(c.value));
    }
    if (row.on_terminal) out.line(line);
    if (row.in_json) rows.push_back(json.str());
  }
  out.json(r.name, r.summary.json_object ? merged.str() : json_array(rows));
}

// A headline in the unit the terminal shows (nm, nm^2, fs), SI in --json.
std::string shown_with_unit(double v, const std::string& units, SummarySink& out) {
  static const std::map<std::string, std::pair<const char*, double>> display = {
      {"m", {"nm", 1e9}}, {"m^2", {"nm^2", 1e18}}, {"s", {"fs", 1e15}}};
  const auto d = display.find(units);
  if (d != display.end()) return out.shown(v * d->second.second) + " " + d->second.first;
  return out.shown(v) + (units == "1" ? "" : " " + units);
}

// The record's headlines on one line, a peak with where it is: "largest power 8.47e-44 W s^2 at 642.86 nm".
void print_headlines(const solver::Record& r, SummarySink& out) {
  std::string line;
  std::set<std::string> used;
  for (const solver::Headline& h : r.headlines) {
    if (used.count(h.name)) continue;
    std::string text = h.name + " " + shown_with_unit(h.value, h.units, out);
    const std::string peak = "_peak";
    if (h.name.size() > peak.size() && h.name.compare(h.name.size() - peak.size(), peak.size(), peak) == 0) {
      text = "largest " + h.name.substr(0, h.name.size() - peak.size()) + " " + shown_with_unit(h.value, h.units, out);
      for (const solver::Headline& at : r.headlines)
        if (at.name == h.name + "_wavelength_nm") text += " at " + out.shown(at.value, "{:.2f}") + " nm", used.insert(at.name);
        else if (at.name == h.name + "_time") text += " at " + shown_with_unit(at.value, at.units, out), used.insert(at.name);
    }
    line += (line.empty() ? "    " : "; ") + text;
  }
  if (!line.empty()) out.line(line);
}

// The tunnelling report is the run's, not an output's: what the gap search found on the grid.
void tunnelling_gaps(const solver::RunResults& r, const solver::Scene& scene, SummarySink& out) {
  const auto body_name = [&](int i) {
    return scene.bodies[i].name.empty() ? fmt::format("body {}", i) : scene.bodies[i].name;
  };
  for (const auto& g : r.tunnelling_gaps)
    out.line(fmt::format("  gap {} - {}: {} cells below {:.3g} nm, narrowest {:.3g} nm ({})", body_name(g.pair[0]),
                         body_name(g.pair[1]), g.cells, g.cutoff * 1e9, g.smallest_width * 1e9,
                         g.quantum ? "quantum-corrected" : "classical"));
}

}  // namespace

std::string summarise_outputs(const solver::RunResults& results, const solver::Scene& scene) {
  SummarySink out;
  tunnelling_gaps(results, scene, out);
  for (const solver::Record& r : solver::records_of(results, scene)) {
    print_record(r, out);
    print_headlines(r, out);
  }
  if (out.undefined_shown())
    out.line("yeegap: note: 'undefined' values are normalised by light or a source spectrum that was not recorded yet: "
             "the run stopped before the pulse reached them (see stop in docs/scene.md), or are dip figures the scan "
             "does not contain (see the sensor's warning)");
  return out.json_object();
}

}  // namespace yeegap::cli
