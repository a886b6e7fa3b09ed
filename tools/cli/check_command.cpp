// `yeegap check SCENE`: validates the scene and prints the grid, time step, steps, memory and a
// cost estimate without running anything (and without allocating the fields).
#include <algorithm>
#include <cmath>
#include <cstdio>

#include <fmt/format.h>

#include "commands.h"
#include "io/scene_reader.h"
#include "json.h"
#include "solver/run_scene.h"

namespace yeegap::cli {

namespace {

// Cell updates per second assumed for the time estimate until the benchmark figure of this
// machine is known: a conservative figure for two cores (docs/performance.md).
constexpr double assumed_cell_updates_per_second = 1.0e8;

struct CheckOptions {
  std::string scene;
  std::vector<std::string> overrides;
  bool json = false;
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
double uniform_cells_at(const solver::Scene& scene, const solver::ModelSummary& m) {
  double n = 1;
  for (int a = 0; a < 3; ++a)
    if (m.cells[a] > 1) n *= std::max(1.0, std::round(scene.domain.size[a] / m.smallest_cell));
  return n;
}

int run_check(const CheckOptions& o) {
  const solver::Scene scene = io::read_scene_file(o.scene, o.overrides);
  const solver::ModelSummary m = solver::plan_scene(scene);
  const double cost_seconds = static_cast<double>(m.cell_count) * m.steps / assumed_cell_updates_per_second;
  const double uniform = uniform_cells_at(scene, m);
  if (o.json) {
    JsonObject j;
    j.text("scene", o.scene)
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
        .number("memory_bytes", static_cast<double>(m.memory_bytes))
        .number("time_step_s", m.time_step)
        .number("courant_limit_s", m.courant_limit)
        .number("steps", static_cast<double>(m.steps))
        .add("steps_estimated", m.steps_estimated ? "true" : "false")
        .number("estimated_seconds", cost_seconds);
    std::printf("%s\n", j.str().c_str());
    return exit_ok;
  }
  std::fprintf(stderr, "%s: valid\n", o.scene.c_str());
  std::fprintf(stderr, "  grid        %d x %d x %d = %lld cells, cells %.4g to %.4g nm\n", m.cells[0], m.cells[1], m.cells[2],
               m.cell_count, m.smallest_cell * 1e9, m.largest_cell * 1e9);
  for (int a = 0; a < 3; ++a)
    std::fprintf(stderr, "  %c axis      %d cells, %.4g to %.4g nm\n", "xyz"[a], m.cells[a], m.min_cell[a] * 1e9,
                 m.max_cell[a] * 1e9);
  for (const auto& g : m.gaps) {
    // Rounding leaves 1e-16 m where the middle lies on an axis: print it as 0.
    auto nm = [&](double v) { return std::abs(v) < 1e-4 * g.width ? 0.0 : v * 1e9; };
    std::fprintf(stderr, "  gap         bodies %d and %d: %.4g nm wide at (%.4g, %.4g, %.4g) nm, %d cells across\n",
                 g.body_a, g.body_b, g.width * 1e9, nm(g.middle.x), nm(g.middle.y), nm(g.middle.z), g.cells_across);
  }
  if (uniform > static_cast<double>(m.cell_count))
    std::fprintf(stderr, "  uniform     a uniform grid of %.4g nm cells would need %.4g cells, %.0fx more\n",
                 m.smallest_cell * 1e9, uniform, uniform / static_cast<double>(m.cell_count));
  for (const auto& note : m.mesh_notes) std::fprintf(stderr, "  note        %s\n", note.c_str());
  std::fprintf(stderr, "  time step   %.4g fs (Courant limit %.4g fs)\n", m.time_step * 1e15, m.courant_limit * 1e15);
  std::fprintf(stderr, "  steps       %s%ld (%.4g fs)\n", m.steps_estimated ? "about " : "", m.steps, m.steps * m.time_step * 1e15);
  std::fprintf(stderr, "  memory      %.1f MB\n", m.memory_bytes / 1e6);
  std::fprintf(stderr, "  cost        about %.3g cell updates, %.0f s at %.0f Mcells/s\n",
               static_cast<double>(m.cell_count) * m.steps, cost_seconds, assumed_cell_updates_per_second / 1e6);
  return exit_ok;
}

}  // namespace

void add_check_command(CLI::App& app, int& exit_code) {
  auto opts = std::make_shared<CheckOptions>();
  CLI::App* cmd = app.add_subcommand("check", "validate a scene and print grid, time step, steps, memory and cost");
  cmd->footer("Example:\n  yeegap check examples/dipole_near_sphere.yaml --json");
  cmd->add_option("scene", opts->scene, "scene file (YAML)")->required();
  cmd->add_option("--set", opts->overrides, "override a scene value, e.g. --set domain.step=2nm (repeatable)");
  cmd->add_flag("--json", opts->json, "print one JSON object on stdout");
  cmd->callback([opts, &exit_code] { exit_code = guarded([&] { return run_check(*opts); }); });
}

}  // namespace yeegap::cli
