// yeegap_benchmark: in one run, the machine's memory bandwidth (STREAM triad) and the update rate
// of the real solver on a vacuum box, for 1 thread and for all threads, and their ratio. The
// Yee update is memory-bound, so the ratio says how close the solver comes to what memory allows.
#include <omp.h>

#include <cstdio>
#include <exception>
#include <stdexcept>
#include <vector>

#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include "solver/real.h"
#include "solver/engine/yee_kernels.h"
#include "tools/benchmark/report.h"
#include "tools/benchmark/stream_triad.h"
#include "tools/benchmark/timing.h"
#include "tools/benchmark/vacuum_rate.h"

#ifndef YEEGAP_BUILD_FLAGS
#define YEEGAP_BUILD_FLAGS "unknown"
#endif

namespace {

// 3 x 2^25 doubles = 805 MB, far beyond any cache of today's processors (STREAM asks for at
// least four times the last-level cache).
constexpr std::size_t triad_elements = std::size_t{1} << 25;
constexpr int triad_runs_per_batch = 2;
constexpr int warmup_steps = 3;  // untimed: first touches, page faults, caches
// 6 field components, each read and written once per step: the least traffic a step can move.
constexpr double bytes_per_cell_step = 2.0 * 6.0 * sizeof(yeegap::solver::real);

std::string compiler_name() {
#if defined(__clang__)
  return fmt::format("clang {}.{}.{}", __clang_major__, __clang_minor__, __clang_patchlevel__);
#elif defined(__GNUC__)
  return fmt::format("GCC {}.{}.{}", __GNUC__, __GNUC_MINOR__, __GNUC_PATCHLEVEL__);
#else
  return "unknown compiler";
#endif
}

}  // namespace

int main(int argc, char** argv) {
  using namespace yeegap::benchmark;
  CLI::App app{"yeegap_benchmark: STREAM triad bandwidth and the solver's vacuum update rate, for 1 thread and all threads,\n"
               "and the cost of subcell averaging at a metal surface"};
  int cells = 256, steps = 10, batches = 8, sphere_cells = 96;
  int threads = omp_get_max_threads();
  bool json = false;
  app.add_option("--cells", cells, "cells per axis of the vacuum cube")->check(CLI::Range(4, 2048))->capture_default_str();
  app.add_option("--steps", steps, "steps per timed batch")->check(CLI::PositiveNumber)->capture_default_str();
  app.add_option("--batches", batches, "timed batches, each after two triad runs (the best counts)")
      ->check(CLI::PositiveNumber)->capture_default_str();
  app.add_option("--threads", threads, "the 'all threads' count (default: OpenMP's maximum)")
      ->check(CLI::PositiveNumber)->capture_default_str();
  app.add_option("--sphere-cells", sphere_cells, "cells per axis of the averaging-cost box (0: skip it)")
      ->check(CLI::Range(0, 1024))->capture_default_str();
  app.add_flag("--json", json, "print one JSON object on stdout instead of the table");
  CLI11_PARSE(app, argc, argv);

  try {
    Report report;
    report.version = YEEGAP_VERSION;
    report.cpu_model = cpu_model_name();
    report.logical_cpus = omp_get_num_procs();
    report.real_type = sizeof(yeegap::solver::real) == 4 ? "float" : "double";
    report.compiler = compiler_name();
    report.flags = YEEGAP_BUILD_FLAGS;
    using yeegap::solver::kernel_isa_names;
    report.kernel_isa = kernel_isa_names[static_cast<int>(yeegap::solver::resolved_kernel_isa())];
    report.triad_elements = triad_elements;
    report.triad_repeats = triad_runs_per_batch * batches;
    report.cells = cells;
    report.warmup_steps = warmup_steps;
    report.steps = steps;
    report.batches = batches;
    report.bytes_per_cell_step = bytes_per_cell_step;

    std::vector<int> counts{1};
    if (threads > 1) counts.push_back(threads);
    omp_set_num_threads(threads);
    TriadArrays triad(triad_elements);
    for (int t : counts) {
      omp_set_num_threads(t);
      if (!json) std::fprintf(stderr, "measuring with %d thread%s ...\n", t, t > 1 ? "s" : "");
      VacuumBox box(cells);
      box.warm_up(warmup_steps);
      // Triad runs and solver batches alternate, so both see the same spells of load from others.
      std::vector<double> bandwidths, rates;
      for (int b = 0; b < batches; ++b) {
        for (int r = 0; r < triad_runs_per_batch; ++r) bandwidths.push_back(triad.run_once());
        rates.push_back(box.timed_mcells_per_second(steps));
      }
      Row row;
      row.threads = t;
      row.triad_gb_per_second = spread_of(bandwidths);
      row.mcells_per_second = spread_of(rates);
      row.field_hash = box.field_hash();
      row.ratio = bytes_per_cell_step * row.mcells_per_second.best * 1e6 / (row.triad_gb_per_second.best * 1e9);
      report.rows.push_back(row);
    }
    if (sphere_cells > 0) {
      omp_set_num_threads(threads);
      if (!json) std::fprintf(stderr, "measuring the cost of subcell averaging ...\n");
      report.averaging = measure_averaging_cost(sphere_cells, steps, batches);
    }
    if (!triad.result_is_right()) throw std::runtime_error("the triad left wrong values in a[]");
    std::fputs((json ? json_text(report) + "\n" : table_text(report)).c_str(), stdout);
    return report.fields_identical() ? 0 : 2;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "yeegap_benchmark: %s\n", e.what());
    return 1;
  }
}
