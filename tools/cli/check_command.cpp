// `yeegap check SCENE`: validates the scene and prints the grid, time step, steps, memory and a
// cost estimate. The estimate steps the run for about a second to measure this machine's rate for
// this scene (check_timing.h); `--quick` skips that and allocates nothing.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <optional>

#include <fmt/format.h>

#include "base/errors.h"
#include "check_timing.h"
#include "commands.h"
#include "io/scene/scene_reader.h"
#include "json.h"
#include "machine_memory.h"
#include "solver/runs/run_plan.h"

namespace yeegap::cli {

namespace {

// Cell updates per second assumed by `check --quick` (and where the run is not timed): a 3D vacuum
// rate of two cores; 1D stacks, poles and averaging run several times slower (docs/performance.md).
constexpr double assumed_cell_updates_per_second = 1.0e8;
// Seconds of stepping that `check` times.
constexpr double timing_budget_seconds = 1.0;
// Above this memory a run is not built just to time it: on a shared login node, or for a run
// meant for a cluster, a validation should not take minutes and gigabytes.
constexpr double largest_timed_bytes = 4e9;
// Gaps listed one per line before the rest are summed up.
constexpr std::size_t gaps_listed = 12;

struct CheckOptions {
  std::string scene;
  std::vector<std::string> overrides;
  bool json = false;
  bool quick = false;
  std::string memory;
};

// How the time estimate was made.
struct Rate {
  double cell_updates_per_second = assumed_cell_updates_per_second;
  double setup_seconds = 0;
  std::optional<StepTiming> timing;  // empty: assumed
  std::string why_assumed;           // when not timed
  double seconds(double cell_updates) const { return setup_seconds + cell_updates / cell_updates_per_second; }
};

Rate measure_rate(const CheckOptions& o, const solver::RunPlan& plan) {
  Rate r;
  if (o.quick) {
    r.why_assumed = "--quick";
    return r;
  }
  try {
    refuse_if_over_memory(static_cast<double>(plan.summary.memory_bytes),
                          o.memory.empty() ? std::nullopt : parse_memory_size(o.memory));
  } catch (const RunError&) {
    r.why_assumed = "not timed: the run would not fit in memory";
    return r;
  }
  if (static_cast<double>(plan.summary.memory_bytes) > largest_timed_bytes) {
    r.why_assumed = fmt::format("not timed: a run of {} is not built just to time it", format_bytes(
                                    static_cast<double>(plan.summary.memory_bytes)));
    return r;
  }
  const StepTiming t = time_steps(plan, timing_budget_seconds);
  if (!(t.cell_updates_per_second > 0)) {
    r.why_assumed = "not timed: the run ended before a step could be timed";
    return r;
  }
  r.timing = t;
  r.cell_updates_per_second = t.cell_updates_per_second;
  r.setup_seconds = t.setup_seconds;
  return r;
}

// "42 s", "7.5 min", "3.2 h".
std::string duration_text(double s) {
  if (s < 10) return fmt::format("{:.2g} s", s);
  if (s < 120) return fmt::format("{:.0f} s", s);
  if (s < 7200) return fmt::format("{:.2g} min", s / 60);
  return fmt::format("{:.2g} h", s / 3600);
}

std::string rate_text(const Rate& r) {
  if (!r.timing)
    return fmt::format("at an assumed {:.0f} Mcells/s ({})", r.cell_updates_per_second / 1e6, r.why_assumed);
  return fmt::format("at {:.3g} Mcells/s, this machine's rate for this scene ({} steps timed in {:.2f} s after a "
                     "{:.2f} s set-up; --quick skips the timing)",
                     r.cell_updates_per_second / 1e6, r.timing->timed_steps, r.timing->timed_seconds, r.setup_seconds);
}

std::vector<std::string> gap_rows(const solver::ModelSummary& m) {
  std::vector<std::string> rows;
  for (const auto& g : m.gaps) {
    JsonObject j;
    j.add("bodies", json_array({fmt::format("{}", g.body_a), fmt::format("{}", g.body_b)}))
        .number("width_m", g.width)
        .add("middle_m", json_array({json_number(g.middle.x), json_number(g.middle.y), json_number(g.middle.z)}))
        .add("cells_across", fmt::format("{}", g.cells_across));
    rows.push_back(j.str());
  }
  return rows;
}

std::vector<std::string> note_rows(const solver::ModelSummary& m) {
  std::vector<std::string> rows;
  for (const auto& n : m.mesh_notes) rows.push_back(json_string(n));
  return rows;
}

// Cells a uniform grid of the smallest cell would need over the same domain (invariant axes stay
// one cell): what the graded mesh saves.
std::vector<std::string> warning_rows(const solver::ModelSummary& m) {
  std::vector<std::string> rows;
  for (const auto& w : m.warnings) rows.push_back(json_string(w));
  return rows;
}

double uniform_cells_at(const solver::Scene& scene, const solver::ModelSummary& m) {
  double n = 1;
  for (int a = 0; a < 3; ++a)
    if (m.cells[a] > 1) n *= std::max(1.0, std::round(scene.domain.size[a] / m.smallest_cell));
  return n;
}

double cell_updates(const solver::ModelSummary& m) { return static_cast<double>(m.cell_count) * m.steps; }

// A scene with a sweep block: every point is read and planned (so a mistake in any point shows
// now); the whole sweep's cost is the sum over the points, whose grids may differ.
struct SweepCost {
  std::size_t points = 0;
  std::string combine;
  double cell_updates = 0;
  long long fewest_cells = 0, most_cells = 0;
  std::size_t memory_bytes = 0;  // the largest point's: points run one at a time by default
  std::vector<std::string> rows;  // JSON per point
};

SweepCost sweep_cost(const std::string& text, const CheckOptions& o, const io::SweepPlan& plan) {
  SweepCost c;
  c.points = plan.point_count();
  c.combine = plan.combine == io::Combine::zip ? "zip" : "grid";
  for (std::size_t k = 0; k < c.points; ++k) {
    const solver::Scene s = io::read_scene_point(text, o.scene, plan, k, o.overrides, k == 0 ? io::NoteSink(io::notes_to_stderr)
                                                                                              : io::NoteSink([](const std::string&) {}));
    solver::ModelSummary m;
    try {
      m = solver::plan_run(s).summary;
    } catch (const RunError& e) {
      throw RunError(fmt::format("sweep point {} ({}): {}", k, plan.describe(k), e.what()));
    }
    c.cell_updates += cell_updates(m);
    c.fewest_cells = k == 0 ? m.cell_count : std::min(c.fewest_cells, m.cell_count);
    c.most_cells = std::max(c.most_cells, m.cell_count);
    c.memory_bytes = std::max(c.memory_bytes, m.memory_bytes);
    JsonObject row;
    row.number("point", static_cast<double>(k))
        .text("values", plan.describe(k))
        .number("cells", static_cast<double>(m.cell_count))
        .number("steps", static_cast<double>(m.steps))
        .number("cell_updates", cell_updates(m));
    c.rows.push_back(row.str());
  }
  return c;
}

// `check --json`: the same figures as one object on stdout.
void print_json(const CheckOptions& o, const solver::Scene& scene, const solver::RunPlan& run_plan,
                const std::optional<SweepCost>& sweep, double uniform, const Rate& rate) {
  const solver::ModelSummary& m = run_plan.summary;
  JsonObject j;
  if (sweep) {
    JsonObject s;
    s.number("points", static_cast<double>(sweep->points))
        .text("combine", sweep->combine)
        .number("cell_updates", sweep->cell_updates)
        .number("estimated_seconds", rate.seconds(sweep->cell_updates) + (sweep->points - 1) * rate.setup_seconds)
        .number("largest_memory_bytes", static_cast<double>(sweep->memory_bytes))
        .add("per_point", json_array(sweep->rows));
    j.add("sweep", s.str());
  }
  j.text("scene", o.scene)
      .text("run", run_plan.description())
      .add("grid", json_array({fmt::format("{}", m.cells[0]), fmt::format("{}", m.cells[1]), fmt::format("{}", m.cells[2])}))
      .number("cells", static_cast<double>(m.cell_count))
      .number("smallest_cell_m", m.smallest_cell)
      .number("largest_cell_m", m.largest_cell)
      .add("smallest_cell_per_axis_m", json_array({json_number(m.min_cell[0]), json_number(m.min_cell[1]),
                                                   json_number(m.min_cell[2])}))
      .add("largest_cell_per_axis_m", json_array({json_number(m.max_cell[0]), json_number(m.max_cell[1]),
                                                  json_number(m.max_cell[2])}))
      .add("domain_size_m", json_array({json_number(scene.domain.size[0]), json_number(scene.domain.size[1]),
                                        json_number(scene.domain.size[2])}))
      .number("uniform_cells_at_smallest", uniform)
      .add("gaps", json_array(gap_rows(m)))
      .add("mesh_notes", json_array(note_rows(m)))
      .add("warnings", json_array(warning_rows(m)))
      .number("memory_bytes", static_cast<double>(m.memory_bytes))
      .number("time_step_s", m.time_step)
      .number("courant_limit_s", m.courant_limit)
      .number("steps", static_cast<double>(m.steps))
      .add("steps_estimated", m.steps_estimated ? "true" : "false")
      .number("estimated_seconds", rate.seconds(cell_updates(m)))
      .number("cell_updates_per_second", rate.cell_updates_per_second)
      .text("rate_source", rate.timing ? "timed" : "assumed")
      .number("setup_seconds", rate.setup_seconds)
      .number("timed_steps", rate.timing ? static_cast<double>(rate.timing->timed_steps) : 0.0);
  std::printf("%s\n", j.str().c_str());
}

int run_check(const CheckOptions& o) {
  const std::string text = io::read_scene_file_text(o.scene);
  const io::SweepPlan plan = io::read_sweep_plan(text, o.scene);
  std::optional<SweepCost> sweep;
  if (!plan.empty()) sweep = sweep_cost(text, o, plan);
  // The details below are those of the scene, or of a sweep's first point.
  const solver::Scene scene = plan.empty() ? io::read_scene_text(text, o.scene, o.overrides)
                                           : io::read_scene_point(text, o.scene, plan, 0, o.overrides,
                                                                  [](const std::string&) {});
  const solver::RunPlan run_plan = solver::plan_run(scene);
  const solver::ModelSummary& m = run_plan.summary;
  const double uniform = uniform_cells_at(scene, m);
  if (o.json) {
    print_json(o, scene, run_plan, sweep, uniform, measure_rate(o, run_plan));
    return exit_ok;
  }
  std::fprintf(stderr, "%s: valid\n", o.scene.c_str());
  if (sweep) {
    std::fprintf(stderr, "  sweep       %zu points (%s), %lld to %lld cells each\n", sweep->points, sweep->combine.c_str(),
                 sweep->fewest_cells, sweep->most_cells);
    std::fprintf(stderr, "  sweep cost  about %.3g cell updates in all, one point at a time (largest point %.1f MB); "
                 "time below\n", sweep->cell_updates, sweep->memory_bytes / 1e6);
    std::fprintf(stderr, "  below: point 0 (%s)\n", plan.describe(0).c_str());
  }
  std::fprintf(stderr, "  run         %s\n", run_plan.description().c_str());
  std::fprintf(stderr, "  grid        %d x %d x %d = %lld cells, cells %.4g to %.4g nm\n", m.cells[0], m.cells[1], m.cells[2],
               m.cell_count, m.smallest_cell * 1e9, m.largest_cell * 1e9);
  for (int a = 0; a < 3; ++a)
    std::fprintf(stderr, "  %c axis      %d cells, %.4g to %.4g nm\n", "xyz"[a], m.cells[a], m.min_cell[a] * 1e9,
                 m.max_cell[a] * 1e9);
  // Every gap up to a screenful; an array of bodies has hundreds: the rest summed up (all in --json).
  const std::size_t shown = m.gaps.size() <= 2 * gaps_listed ? m.gaps.size() : gaps_listed;
  for (std::size_t i = 0; i < shown; ++i) {
    const auto& g = m.gaps[i];
    // Rounding leaves 1e-16 m where the middle lies on an axis: print it as 0.
    auto nm = [&](double v) { return std::abs(v) < 1e-4 * g.width ? 0.0 : v * 1e9; };
    std::fprintf(stderr, "  gap         bodies %d and %d: %.4g nm wide at (%.4g, %.4g, %.4g) nm, %d cells across\n",
                 g.body_a, g.body_b, g.width * 1e9, nm(g.middle.x), nm(g.middle.y), nm(g.middle.z), g.cells_across);
  }
  if (shown < m.gaps.size()) {
    double narrowest = m.gaps[shown].width, widest = narrowest;
    for (std::size_t i = shown; i < m.gaps.size(); ++i) {
      narrowest = std::min(narrowest, m.gaps[i].width);
      widest = std::max(widest, m.gaps[i].width);
    }
    std::fprintf(stderr, "  gaps        and %zu more, %.4g to %.4g nm wide (all of them with --json)\n",
                 m.gaps.size() - shown, narrowest * 1e9, widest * 1e9);
  }
  if (uniform > static_cast<double>(m.cell_count))
    std::fprintf(stderr, "  uniform     a uniform grid of %.4g nm cells would need %.4g cells, %.0fx more\n",
                 m.smallest_cell * 1e9, uniform, uniform / static_cast<double>(m.cell_count));
  for (const auto& note : m.mesh_notes) std::fprintf(stderr, "  note        %s\n", note.c_str());
  for (const auto& w : m.warnings) std::fprintf(stderr, "  warning     %s\n", w.c_str());
  std::fprintf(stderr, "  time step   %.4g fs (Courant limit %.4g fs)\n", m.time_step * 1e15, m.courant_limit * 1e15);
  std::fprintf(stderr, "  steps       %s%ld (%.4g fs)\n", m.steps_estimated ? "about " : "", m.steps, m.steps * m.time_step * 1e15);
  const auto available = available_memory_bytes();
  std::fprintf(stderr, "  memory      %.1f MB%s\n", m.memory_bytes / 1e6,
               available ? fmt::format(" (this machine has {} free)", format_bytes(*available)).c_str() : "");
  try {
    refuse_if_over_memory(static_cast<double>(m.memory_bytes), o.memory.empty() ? std::nullopt : parse_memory_size(o.memory));
  } catch (const RunError& e) {
    std::fprintf(stderr, "  warning     %s: `run` here would refuse it\n", e.what());
  }
  const Rate rate = measure_rate(o, run_plan);
  std::fprintf(stderr, "  cost        about %.3g cell updates: %s%s %s\n", cell_updates(m),
               m.steps_estimated ? "about " : "", duration_text(rate.seconds(cell_updates(m))).c_str(),
               rate_text(rate).c_str());
  if (sweep)
    std::fprintf(stderr, "  sweep time  %s%s for all %zu points at point 0's rate\n", m.steps_estimated ? "about " : "",
                 duration_text(rate.seconds(sweep->cell_updates) + (sweep->points - 1) * rate.setup_seconds).c_str(),
                 sweep->points);
  return exit_ok;
}

}  // namespace

void add_check_command(CLI::App& app, int& exit_code) {
  auto opts = std::make_shared<CheckOptions>();
  CLI::App* cmd = app.add_subcommand("check", "validate a scene and print grid, time step, steps, memory and cost");
  cmd->footer("Examples:\n  yeegap check examples/dipole_near_sphere.yaml --json\n"
              "  yeegap check examples/tunnelling_gap_sweep.yaml      a sweep: points, cost of all of them, point 0 in detail");
  cmd->add_option("scene", opts->scene, "scene file (YAML)")->required();
  cmd->add_option("--set", opts->overrides, "override a scene value, e.g. --set domain.step=2nm (repeatable)");
  cmd->add_flag("--json", opts->json, "print one JSON object on stdout");
  cmd->add_flag("--quick", opts->quick,
                "do not step the run for a second to time it: estimate the cost at an assumed 100 Mcells/s");
  add_memory_option(*cmd, opts->memory);
  cmd->callback([opts, &exit_code] { exit_code = guarded([&] { return run_check(*opts); }); });
}

}  // namespace yeegap::cli
