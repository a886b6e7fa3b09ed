// What `yeegap run` says about each output at the end: table lines on stderr and a JSON value per
// output for --json, both read from the outputs' records (solver/outputs/record.h: heading, rows,
// cells), so a new output needs no code here.
#pragma once

#include <string>
#include <vector>

#include "json.h"
#include "solver/results.h"
#include "solver/scene.h"

namespace yeegap::cli {

/// Prints summary lines to stderr as they come and collects the JSON values by output name.
class SummarySink {
 public:
  void line(const std::string& text);
  void json(const std::string& output_name, const std::string& encoded) { outputs_.add(output_name, encoded); }
  /// A figure for the terminal. A normalised value is not defined when its normaliser is zero (a
  /// run stopped before any incident light or source spectrum was recorded): "undefined", with one
  /// note at the end saying why, instead of "-nan". JSON gives null for these (json.h).
  std::string shown(double v, const char* spec = "{:.5g}");
  bool undefined_shown() const { return undefined_shown_; }
  std::string json_object() const { return outputs_.str(); }

 private:
  JsonObject outputs_;
  bool undefined_shown_ = false;
};

/// Prints the tunnelling report and every output's summary (records_of order) and returns the
/// summaries as one encoded JSON object keyed by output name.
std::string summarise_outputs(const solver::RunResults& results, const solver::Scene& scene);

}  // namespace yeegap::cli
