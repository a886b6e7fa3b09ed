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
  Spread mcells_per_second;       // the solver on the vacuum box
  Spread bare_mcells_per_second;  // the bare fused kernel (bare_kernel.h) on a box of the same size
  std::uint64_t field_hash = 0;
  /// (bytes per cell-step x best update rate) / best triad bandwidth.
  double ratio = 0;
};

/// Measured with all threads, in the same run as the rows.
struct Extras {
  // Seconds per step of the vacuum box, and what a 20-frequency field map on one plane adds to it
  // (periodic_box.h); the least of each over the batches.
  double step_seconds = 0, field_map_seconds = 0;
  // Box filled with gold (periodic_box.h), best Mcells/s, and the least bytes a step of it moves.
  int dispersive_cells = 0;
  double dispersive_mcells = 0, dispersive_bytes_per_cell_step = 0;
  double dispersive_triad_GBps = 0;  // best triad between the gold box's batches
  double bytes_per_cell_vacuum = 0;  // resident memory of the vacuum box over its cells
  std::string scan_scene;            // empty: not measured
  double scan_seconds = 0;
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
  Extras extras;
  /// Whether every row left bit-identical fields.
  bool fields_identical() const;
};

/// The processor's model name from /proc/cpuinfo, or "unknown".
std::string cpu_model_name();

/// The table, ending with the headline JSON line (summary_json).
std::string table_text(const Report& r);
/// One JSON object: the headline figures at its top level, then everything else.
std::string json_text(const Report& r);
/// The headline figures (triad_GBps, bare_fused_Mcells, vacuum_Mcells, vacuum_vs_bare, vacuum_ratio,
/// dispersive_ratio, averaging_cost, dft_overhead, bytes_per_cell_vacuum, scan_1d_seconds, ...) as
/// the members of a JSON object, without its braces; null for what was not measured.
std::string summary_json(const Report& r);

}  // namespace yeegap::benchmark
