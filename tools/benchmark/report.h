// What one benchmark run measured, and its two printed forms: a table for people and one JSON
// object for scripts (the same figures in both).
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "tools/benchmark/averaging_cost.h"
#include "tools/benchmark/timing.h"

namespace yeegap::benchmark {

struct Row {
  int threads = 1;
  Spread triad_gb_per_second;
  Spread mcells_per_second;
  std::uint64_t field_hash = 0;
  /// (bytes per cell-step x best update rate) / best triad bandwidth.
  double ratio = 0;
};

struct Report {
  std::string version;
  std::string cpu_model;            // as the operating system names it
  int logical_cpus = 0;
  std::string real_type;            // "float" or "double"
  std::string compiler, flags;
  std::string kernel_isa;           // instruction set the bulk Yee loops run with
  std::size_t triad_elements = 0;   // per array
  int triad_repeats = 0;
  int cells = 0, warmup_steps = 0, steps = 0, batches = 0;
  double bytes_per_cell_step = 0;
  std::vector<Row> rows;
  AveragingCost averaging;          // with all threads; cells = 0 when not measured
  /// Whether every row left bit-identical fields.
  bool fields_identical() const;
};

/// The processor's model name from /proc/cpuinfo, or "unknown".
std::string cpu_model_name();

std::string table_text(const Report& r);
std::string json_text(const Report& r);

}  // namespace yeegap::benchmark
