// `yeegap check SCENE`: validates the scene and prints the grid, time step, steps, memory and a
// cost estimate without running anything (and without allocating the fields).
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <optional>

#include <fmt/format.h>

#include "base/errors.h"
#include "commands.h"
#include "io/scene/scene_reader.h"
#include "json.h"
#include "machine_memory.h"
#include "solver/runs/run_plan.h"

namespace yeegap::cli {

namespace {

// Cell updates per second assumed for the time estimate until the benchmark figure of this
// machine is known: a conservative figure for two cores (docs/performance.md).
constexpr double assumed_cell_updates_per_second = 1.0e8;
// Gaps listed one per line before the rest are summed up.
constexpr std::size_t gaps_listed = 12;

struct CheckOptions {
  std::string scene;
  std::vector<std::string> overrides;
  bool json = false;
  std::string memory;
};

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
        .number("estimated_seconds", cell_updates(m) / assumed_cell_updates_per_second);
    c.rows.push_back(row.str());
  }
  return c;
}

// `check --json`: the same figures as one object on stdout.
void print_json(const CheckOptions& o, const solver::Scene& scene, const solver::RunPlan& run_plan,
                const std::optional<SweepCost>& sweep, double uniform, double cost_seconds) {
  const solver::ModelSummary& m = run_plan.summary;
  JsonObject j;
  if (sweep) {
    JsonObject s;
    s.number("points", static_cast<double>(sweep->points))
        .text("combine", sweep->combine)
        .number("cell_updates", sweep->cell_updates)
        .number("estimated_seconds", sweep->cell_updates / assumed_cell_updates_per_second)
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
      .number("estimated_seconds", cost_seconds);
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
  const double cost_seconds = cell_updates(m) / assumed_cell_updates_per_second;
  const double uniform = uniform_cells_at(scene, m);
  if (o.json) {
    print_json(o, scene, run_plan, sweep, uniform, cost_seconds);
    return exit_ok;
  }
  std::fprintf(stderr, "%s: valid\n", o.scene.c_str());
  if (sweep) {
    const double seconds = sweep->cell_updates / assumed_cell_updates_per_second;
    std::fprintf(stderr, "  sweep       %zu points (%s), %lld to %lld cells each\n", sweep->points, sweep->combine.c_str(),
                 sweep->fewest_cells, sweep->most_cells);
    std::fprintf(stderr, "  sweep cost  about %.3g cell updates in all, %.3g s at %.0f Mcells/s (one point at a time; "
                 "largest point %.1f MB)\n", sweep->cell_updates, seconds, assumed_cell_updates_per_second / 1e6,
                 sweep->memory_bytes / 1e6);
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
  std::fprintf(stderr, "  cost        about %.3g cell updates, %.0f s at %.0f Mcells/s\n",
               static_cast<double>(m.cell_count) * m.steps, cost_seconds, assumed_cell_updates_per_second / 1e6);
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
  add_memory_option(*cmd, opts->memory);
  cmd->callback([opts, &exit_code] { exit_code = guarded([&] { return run_check(*opts); }); });
}

}  // namespace yeegap::cli
