// Table and JSON forms of a benchmark report (see report.h). The JSON is written by hand: it is
// one flat object of numbers and short strings, not worth a library.
#include "tools/benchmark/report.h"

#include <fstream>

#include <fmt/format.h>

namespace yeegap::benchmark {

namespace {

std::string json_string(const std::string& s) {
  std::string out = "\"";
  for (char ch : s) {
    if (ch == '"' || ch == '\\') out += '\\';
    if (static_cast<unsigned char>(ch) < 0x20) {
      out += fmt::format("\\u{:04x}", static_cast<unsigned char>(ch));
      continue;
    }
    out += ch;
  }
  return out + "\"";
}

std::string json_spread(const Spread& s) {
  return fmt::format(R"({{"best": {:.4g}, "median": {:.4g}, "worst": {:.4g}}})", s.best, s.median, s.worst);
}

// A number, or null when it was not measured (zero or not finite).
std::string json_number(double v) { return v > 0 && v < 1e300 ? fmt::format("{:.4g}", v) : "null"; }

}  // namespace

std::string summary_json(const Report& r) {
  const Row* all = r.rows.empty() ? nullptr : &r.rows.back();
  const double triad = all ? all->triad_gb_per_second.best : 0;
  const double vacuum = all ? all->mcells_per_second.best : 0, bare = all ? all->bare_mcells_per_second.best : 0;
  const Extras& x = r.extras;
  const AveragingCost& a = r.averaging;
  return fmt::format(
      R"("threads": {}, "triad_GBps": {}, "bare_fused_Mcells": {}, "vacuum_Mcells": {}, "vacuum_vs_bare": {}, )"
      R"("vacuum_ratio": {}, "dispersive_Mcells": {}, "dispersive_bytes_per_cell_step": {}, "dispersive_ratio": {}, )"
      R"("averaging_cost": {}, "dft_overhead": {}, "bytes_per_cell_vacuum": {}, "scan_1d_seconds": {})",
      all ? all->threads : 0, json_number(triad), json_number(bare), json_number(vacuum),
      json_number(bare > 0 ? vacuum / bare : 0), json_number(all ? all->ratio : 0), json_number(x.dispersive_mcells),
      json_number(x.dispersive_bytes_per_cell_step),
      json_number(x.dispersive_triad_GBps > 0
                      ? x.dispersive_bytes_per_cell_step * x.dispersive_mcells * 1e6 / (x.dispersive_triad_GBps * 1e9)
                      : 0),
      json_number(a.full > 0 ? a.staircase / a.full : 0),
      // Share of a step's time the field map takes: t_map / (t_step + t_map).
      json_number(x.step_seconds > 0 ? x.field_map_seconds / (x.step_seconds + x.field_map_seconds) : 0),
      json_number(x.bytes_per_cell_vacuum), json_number(x.scan_seconds));
}

bool Report::fields_identical() const {
  for (const Row& row : rows)
    if (row.field_hash != rows.front().field_hash) return false;
  return true;
}

std::string cpu_model_name() {
  std::ifstream in("/proc/cpuinfo");
  std::string line;
  while (std::getline(in, line))
    if (line.rfind("model name", 0) == 0) {
      const auto colon = line.find(':');
      if (colon != std::string::npos) return line.substr(line.find_first_not_of(" \t", colon + 1));
    }
  return "unknown";
}

std::string table_text(const Report& r) {
  std::string t;
  t += fmt::format("yeegap benchmark {}\n", r.version);
  t += fmt::format("machine   {}, {} logical CPUs\n", r.cpu_model, r.logical_cpus);
  t += fmt::format("build     fields in {}; {}; flags: {}; Yee loops: {}\n", r.real_type, r.compiler, r.flags,
                   r.kernel_isa);
  t += fmt::format("triad     STREAM triad a = b + s c over 3 arrays of {} doubles ({:.0f} MB), best of {} runs taken\n"
                   "          between the solver's batches; GB/s count 24 bytes per iteration (McCalpin's STREAM convention)\n",
                   r.triad_elements, 3.0 * 8.0 * r.triad_elements / 1e6, r.triad_repeats);
  t += fmt::format("solver    {}^3 vacuum cells, periodic, Simulation::step(); {} warm-up steps, then best of {} "
                   "batches of {} steps\n",
                   r.cells, r.warmup_steps, r.batches, r.steps);
  t += fmt::format("ratio     {:.0f} bytes per cell-step (6 components read and written once) x Mcells/s / triad GB/s\n\n",
                   r.bytes_per_cell_step);
  t += fmt::format("bare      the same cube with a bare fused kernel (no solver machinery; tools/benchmark/bare_kernel.h)\n\n");
  t += fmt::format("{:>7}  {:>26}  {:>26}  {:>6}  {:>26}\n", "threads", "triad GB/s best/med/worst",
                   "Mcells/s best/med/worst", "ratio", "bare Mcells/s best/med/worst");
  for (const Row& row : r.rows) {
    const Spread& b = row.triad_gb_per_second;
    const Spread& m = row.mcells_per_second;
    const Spread& f = row.bare_mcells_per_second;
    t += fmt::format("{:>7}  {:>26}  {:>26}  {:>6.2f}  {:>26}\n", row.threads,
                     fmt::format("{:.1f} / {:.1f} / {:.1f}", b.best, b.median, b.worst),
                     fmt::format("{:.0f} / {:.0f} / {:.0f}", m.best, m.median, m.worst), row.ratio,
                     fmt::format("{:.0f} / {:.0f} / {:.0f}", f.best, f.median, f.worst));
  }
  if (r.rows.size() > 1)
    t += fmt::format("\nfields after the run bit-identical for every thread count: {}\n",
                     r.fields_identical() ? "yes" : "NO");
  const AveragingCost& a = r.averaging;
  if (a.cells > 0)
    t += fmt::format("\naveraging {}^3 water cells around a gold sphere of radius {} cells, all threads, best of {} batches:\n"
                     "          staircase {:.0f}, diagonal average {:.0f}, whole tensor {:.0f} Mcells/s ({} averaged locations);\n"
                     "          a step costs {:.2f} (diagonal) and {:.2f} (whole tensor) times the staircase's\n",
                     a.cells, a.radius_cells, r.batches, a.staircase, a.diagonal, a.full, a.averaged_locations,
                     a.staircase / a.diagonal, a.staircase / a.full);
  const Extras& x = r.extras;
  if (x.step_seconds > 0)
    t += fmt::format("\nfield map {}^3 vacuum: a step takes {:.1f} ms; a field map of 20 frequencies on one plane adds "
                     "{:.2f} ms\n", r.cells, x.step_seconds * 1e3, x.field_map_seconds * 1e3);
  if (x.dispersive_cells > 0)
    t += fmt::format("gold      {}^3 cells of gold (1 Drude, 5 Lorentz poles): {:.0f} Mcells/s; at least {:.0f} bytes per "
                     "cell-step (fields, and each pole's currents read and written once); triad between its batches "
                     "{:.1f} GB/s\n",
                     x.dispersive_cells, x.dispersive_mcells, x.dispersive_bytes_per_cell_step, x.dispersive_triad_GBps);
  if (x.bytes_per_cell_vacuum > 0)
    t += fmt::format("memory    the vacuum box holds {:.1f} bytes per cell (resident memory)\n", x.bytes_per_cell_vacuum);
  if (!x.scan_scene.empty()) t += fmt::format("scene     {}: {:.1f} s wall\n", x.scan_scene, x.scan_seconds);
  t += "\n{" + summary_json(r) + "}\n";
  return t;
}

std::string json_text(const Report& r) {
  std::string rows;
  for (const Row& row : r.rows) {
    if (!rows.empty()) rows += ", ";
    rows += fmt::format(R"({{"threads": {}, "triad_gb_per_s": {}, "mcells_per_s": {}, "bare_mcells_per_s": {}, )"
                        R"("ratio": {:.4g}, "field_hash": "{:016x}"}})",
                        row.threads, json_spread(row.triad_gb_per_second), json_spread(row.mcells_per_second),
                        json_spread(row.bare_mcells_per_second), row.ratio, row.field_hash);
  }
  return fmt::format(
      R"({{{}, "version": {}, "cpu_model": {}, "logical_cpus": {}, "real": {}, "compiler": {}, "flags": {}, "kernel_isa": {}, )"
      R"("triad": {{"elements_per_array": {}, "repeats": {}, "bytes_per_iteration": 24}}, )"
      R"("solver": {{"cells": {}, "warmup_steps": {}, "steps_per_batch": {}, "batches": {}, "bytes_per_cell_step": {}}}, )"
      R"("rows": [{}], "fields_identical": {}, )"
      R"("averaging": {{"cells": {}, "radius_cells": {}, "averaged_locations": {}, "staircase_mcells_per_s": {:.4g}, )"
      R"("diagonal_mcells_per_s": {:.4g}, "full_mcells_per_s": {:.4g}}}}})",
      summary_json(r), json_string(r.version), json_string(r.cpu_model), r.logical_cpus, json_string(r.real_type),
      json_string(r.compiler), json_string(r.flags), json_string(r.kernel_isa), r.triad_elements, r.triad_repeats, r.cells, r.warmup_steps,
      r.steps, r.batches, r.bytes_per_cell_step, rows, r.fields_identical() ? "true" : "false", r.averaging.cells,
      r.averaging.radius_cells, r.averaging.averaged_locations, r.averaging.staircase, r.averaging.diagonal,
      r.averaging.full);
}

}  // namespace yeegap::benchmark
