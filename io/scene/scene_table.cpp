// `table: FILE.csv` in a material block: measured n, k (materials/nk_table.h) fitted on load with
// passive Drude and Lorentz poles (materials/fit.h). The file is found relative to the scene file.
// The fit's error goes to the note sink each time the scene is read, so a poor fit is never silent;
// the fit is deterministic (fixed seed), so every read of the same table gives the same poles.
#include <algorithm>
#include <filesystem>
#include <fstream>

#include <fmt/format.h>

#include "base/errors.h"
#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"
#include "io/written_units.h"
#include "materials/fit.h"
#include "io/file_hash.h"
#include "materials/nk_table.h"

namespace yeegap::io {
namespace {

// Guards against a slip such as 'poles: 30': each Lorentz pole adds three parameters to a multi-start
// fit whose cost grows with their square, and measured tables rarely support more than a few.
constexpr long max_lorentz_poles = 10;
constexpr long max_drude_poles = 4;
// Above this largest relative deviation the note becomes a warning suggesting more poles (our
// choice: a few per cent is the scatter between published measurements of the same metal).
constexpr double loose_fit = 0.05;

std::string pole_count_text(int drude, int lorentz) {
  std::string s;
  if (drude > 0) s = fmt::format("{} Drude", drude);
  if (lorentz > 0) s += fmt::format("{}{} Lorentz", s.empty() ? "" : " + ", lorentz);
  return s + (drude + lorentz == 1 ? " pole" : " poles");
}

std::filesystem::path table_path(const std::string& scene_file, const std::string& table) {
  const std::filesystem::path p(table);
  if (p.is_absolute()) return p;
  return std::filesystem::path(scene_file).parent_path() / p;
}

// A mistake inside the table keeps the table's own file:line:column (that is where to fix it) and
// says which scene key read it.
[[noreturn]] void rethrow_with_scene(const SceneError& e, const Node& table_value) {
  throw SceneError(e.where(), fmt::format("{} (the table of {}, {})", e.message(), table_value.path(),
                                          table_value.where().location()));
}

}  // namespace

materials::PoleSet read_table_material(const Node& block, const std::vector<std::string>& model_keys,
                                       solver::Scene& scene, const NoteSink& notes) {
  for (const std::string& k : model_keys)
    if (k != "table" && k != "poles" && k != "drude" && block.has(k))
      block.fail_key(k, fmt::format("{}: a table material takes its whole model from the fit of the table, found "
                                    "'{}' beside it (beside 'table' only 'poles' and 'drude', the pole counts)",
                                    block.path(), k));
  materials::FitOptions options;
  if (auto poles = block.get("poles")) {
    if (!poles->is_scalar())
      poles->fail(fmt::format("with 'table', 'poles' is the number of Lorentz poles to fit (e.g. 'poles: 2'), got "
                              "{}; a fitted table and explicit poles exclude each other", poles->found()));
    const long n = read_whole_number(*poles, 0);
    if (n > max_lorentz_poles)
      poles->fail(fmt::format("at most {} Lorentz poles are fitted, got {}", max_lorentz_poles, n));
    options.lorentz_poles = static_cast<int>(n);
  }
  if (auto drude = block.get("drude")) {
    const long n = read_whole_number(*drude, 0);
    if (n > max_drude_poles) drude->fail(fmt::format("at most {} Drude poles are fitted, got {}", max_drude_poles, n));
    options.drude_poles = static_cast<int>(n);
  }
  if (options.drude_poles + options.lorentz_poles == 0)
    block.fail_key(block.has("poles") ? "poles" : "drude",
                   fmt::format("{}: fitting a table needs at least one pole ('poles' Lorentz or 'drude' Drude)",
                               block.path()));

  const Node value = *block.get("table");
  const std::string written = read_text(value);
  const std::filesystem::path path = table_path(scene.file, written);
  if (!std::ifstream(path))
    value.fail(fmt::format("cannot open the table file '{}'{}", written,
                           path.string() == written ? std::string() : fmt::format(" (looked for '{}')", path.string())));

  materials::NkTable table;
  materials::FitResult fit;
  try {
    table = materials::read_nk_table(path.string());
    fit = materials::fit_poles(table, options);
  } catch (const SceneError& e) {
    rethrow_with_scene(e, value);
  }
  // A checkpoint refuses to resume once the table has changed (io/results/checkpoint.h).
  scene.input_files.push_back({path.string(), value.path(), file_hash(path.string())});

  const auto [lo, hi] = std::minmax(table.wavelength.front(), table.wavelength.back());
  const bool loose = fit.max_relative_error > loose_fit;
  std::string message = fmt::format(
      "{}: {}: {}: fitted {} to '{}' ({} rows, {} to {}): RMS |delta eps| {:.3g}, max |delta eps| {:.3g}, "
      "max relative {:.3g} %",
      value.where().location(), loose ? "warning" : "note", block.path(),
      pole_count_text(options.drude_poles, options.lorentz_poles), written, table.size(), format_length(lo),
      format_length(hi), fit.rms_error, fit.max_error, 100.0 * fit.max_relative_error);
  if (loose) message += "; a fit this loose changes the optics: try more poles ('poles: N') or a narrower table";
  notes(message);
  return fit.poles;
}

}  // namespace yeegap::io
