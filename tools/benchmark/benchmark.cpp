// yeegap_benchmark: in one run, the machine's memory bandwidth (STREAM triad), a bare fused vacuum
// kernel and the real solver's update rate on a vacuum box, for 1 thread and for all threads; then
// the costs of poles, averaging, field maps, memory per cell and a whole scene run. The Yee update
// is memory-bound, so ratios to what memory and a bare kernel allow say how close the solver comes.
#include <omp.h>

#include <cmath>
#include <cstdio>
#include <exception>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include <CLI/CLI.hpp>
#include <fmt/format.h>

#include "solver/real.h"
#include "solver/engine/yee_kernels.h"
#include "materials/library.h"
#include "tools/benchmark/bare_kernel.h"
#include "tools/benchmark/report.h"
#include "tools/benchmark/stream_triad.h"
#include "tools/benchmark/timing.h"
#include "tools/benchmark/periodic_box.h"
#include "tools/benchmark/run_costs.h"

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

// The least bytes a step of a gold cell moves: the six field components, and per E component each
// pole's currents read and written once (Q for a Drude pole; Q and P for Lorentz and critical
// points, and E^{n-1} once for critical points); float storage.
double gold_bytes_per_cell_step() {
  const auto& p = yeegap::materials::find_material("Au")->poles;
  const double per_component = 2.0 * sizeof(yeegap::solver::real) *
                               (p.drude.size() + 2.0 * p.lorentz.size() + 2.0 * p.critical_points.size() +
                                (p.critical_points.empty() ? 0 : 1));
  return bytes_per_cell_step + 3 * per_component;
}

// Best rates of two things timed in alternating batches, so both see the same load.
template <class A, class B>
std::pair<std::vector<double>, std::vector<double>> alternate(int batches, A&& first, B&& second) {
  std::vector<double> a, b;
  for (int n = 0; n < batches; ++n) {
    a.push_back(first());
    b.push_back(second());
  }
  return {a, b};
}

}  // namespace

int main(int argc, char** argv) {
  using namespace yeegap::benchmark;
  CLI::App app{"yeegap_benchmark: STREAM triad bandwidth and the solver's vacuum update rate, for 1 thread and all threads,\n"
               "and the cost of subcell averaging at a metal surface"};
  int cells = 256, steps = 10, batches = 8, sphere_cells = 96, gold_cells = 128;
  std::size_t triad_size = triad_elements;
  std::string scan_scene;
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
  app.add_option("--gold-cells", gold_cells, "cells per axis of the gold box (pole currents; 0: skip it)")
      ->check(CLI::Range(0, 1024))->capture_default_str();
  app.add_option("--scene", scan_scene, "a scene to run and time as a whole, e.g. examples/spr_sensor_chip.yaml "
                 "(scan_1d_seconds)");
  app.add_option("--triad-elements", triad_size, "doubles per triad array (at least 4x the last-level cache)")
      ->check(CLI::Range(std::size_t{1} << 10, std::size_t{1} << 31))->capture_default_str();
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
    report.triad_elements = triad_size;
    report.triad_repeats = triad_runs_per_batch * batches;
    report.cells = cells;
    report.warmup_steps = warmup_steps;
    report.steps = steps;
    report.batches = batches;
    report.bytes_per_cell_step = bytes_per_cell_step;

    std::vector<int> counts{1};
    if (threads > 1) counts.push_back(threads);
    omp_set_num_threads(threads);
    TriadArrays triad(triad_size);
    for (int t : counts) {
      omp_set_num_threads(t);
      if (!json) std::fprintf(stderr, "measuring with %d thread%s ...\n", t, t > 1 ? "s" : "");
      const std::size_t before = resident_bytes();
      PeriodicBox box(cells, BoxFill::vacuum);
      if (report.extras.bytes_per_cell_vacuum == 0)
        report.extras.bytes_per_cell_vacuum = (static_cast<double>(resident_bytes()) - before) / std::pow(cells, 3.0);
      box.warm_up(warmup_steps);
      BareVacuumBox bare(cells);
      bare.timed_mcells_per_second(warmup_steps);
      // Triad runs and solver batches alternate, so both see the same spells of load from others.
      std::vector<double> bandwidths, rates, bare_rates;
      for (int b = 0; b < batches; ++b) {
        for (int r = 0; r < triad_runs_per_batch; ++r) bandwidths.push_back(triad.run_once());
        rates.push_back(box.timed_mcells_per_second(steps));
        bare_rates.push_back(bare.timed_mcells_per_second(steps));
      }
      Row row;
      row.threads = t;
      row.triad_gb_per_second = spread_of(bandwidths);
      row.mcells_per_second = spread_of(rates);
      row.bare_mcells_per_second = spread_of(bare_rates);
      row.field_hash = box.field_hash();
      row.ratio = bytes_per_cell_step * row.mcells_per_second.best * 1e6 / (row.triad_gb_per_second.best * 1e9);
      report.rows.push_back(row);
    }
    omp_set_num_threads(threads);
    {
      if (!json) std::fprintf(stderr, "measuring the cost of a field map ...\n");
      // The step and the field map's share of it, timed in alternating batches on one box.
      PeriodicBox box(cells, BoxFill::vacuum);
      box.warm_up(warmup_steps);
      box.field_map_seconds_per_step(1);  // builds the recorder, first touch of its sums
      const auto [step_rates, map_seconds] = alternate(batches, [&] { return box.timed_mcells_per_second(steps); },
                                                       [&] { return -box.field_map_seconds_per_step(steps); });
      report.extras.step_seconds = std::pow(cells, 3.0) / (spread_of(step_rates).best * 1e6);
      report.extras.field_map_seconds = -spread_of(map_seconds).best;  // the least time: best of negated
    }
    if (gold_cells > 0) {
      if (!json) std::fprintf(stderr, "measuring the cost of pole currents ...\n");
      PeriodicBox gold(gold_cells, BoxFill::gold);
      gold.warm_up(warmup_steps);
      // With triad runs between its batches, as the rows: its ratio uses its own bandwidth.
      std::vector<double> rates, bandwidths;
      for (int b = 0; b < batches; ++b) {
        for (int r = 0; r < triad_runs_per_batch; ++r) bandwidths.push_back(triad.run_once());
        rates.push_back(gold.timed_mcells_per_second(steps));
      }
      report.extras.dispersive_cells = gold_cells;
      report.extras.dispersive_mcells = spread_of(rates).best;
      report.extras.dispersive_triad_GBps = spread_of(bandwidths).best;
      report.extras.dispersive_bytes_per_cell_step = gold_bytes_per_cell_step();
    }
    if (sphere_cells > 0) {
      omp_set_num_threads(threads);
      if (!json) std::fprintf(stderr, "measuring the cost of subcell averaging ...\n");
      report.averaging = measure_averaging_cost(sphere_cells, steps, batches);
    }
    if (!scan_scene.empty()) {
      if (!json) std::fprintf(stderr, "running %s ...\n", scan_scene.c_str());
      report.extras.scan_scene = scan_scene;
      report.extras.scan_seconds = time_scene_run(scan_scene).seconds;
    }
    if (!triad.result_is_right()) throw std::runtime_error("the triad left wrong values in a[]");
    std::fputs((json ? json_text(report) + "\n" : table_text(report)).c_str(), stdout);
    return report.fields_identical() ? 0 : 2;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "yeegap_benchmark: %s\n", e.what());
    return 1;
  }
}
