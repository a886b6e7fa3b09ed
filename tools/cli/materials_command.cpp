// `yeegap materials`: the built-in library (materials/library.h) and the pole fit of measured n, k
// (materials/fit.h). `list` names every entry with its model, range and source; `show NAME` tables
// eps and n, k over a wavelength range (exp(-i omega t): eps_im >= 0 absorbs); `fit FILE.csv` prints
// the fit's error and a `materials:` block that a scene accepts as is. Products go to stdout, notes
// and warnings to stderr.
#include <algorithm>
#include <cctype>
#include <cmath>
#include <complex>
#include <cstdio>
#include <filesystem>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "base/errors.h"
#include "base/units.h"
#include "commands.h"
#include "io/results/pole_block_writer.h"
#include "io/suggest.h"
#include "io/written_units.h"
#include "json.h"
#include "materials/fit.h"
#include "materials/library.h"
#include "materials/nk_table.h"

namespace yeegap::cli {

namespace {

// More rows than this is almost certainly a unit slip (a step in pm, a range in m).
constexpr long max_rows = 100000;
// Rounding slack when comparing a requested wavelength with an entry's range ends.
constexpr double range_slack = 1e-9;
// Largest relative deviation of a fit above which the program suggests more poles (our choice, as
// for `table:` in a scene: a few per cent is the scatter between measurements of one metal).
constexpr double loose_fit = 0.05;

[[noreturn]] void option_error(const std::string& option, const std::string& message) {
  throw SceneError(Where{}, fmt::format("{}: {}", option, message));
}

// A wavelength as the scene reader takes a length: "400nm", "0.4 um", or a bare number in nm.
double parse_wavelength(const std::string& option, const std::string& text) {
  const auto nu = io::split_number_unit(text);
  if (!nu) option_error(option, fmt::format("expected a wavelength such as '400nm', got '{}'", text));
  const auto si = io::to_si(io::Dimension::length, nu->value, nu->unit.empty() ? "nm" : nu->unit);
  if (!si)
    option_error(option, fmt::format("'{}' is not a length unit{}", nu->unit,
                                     io::suggestion(nu->unit, io::units_of(io::Dimension::length))));
  if (!(*si > 0)) option_error(option, fmt::format("must be a positive wavelength, got '{}'", text));
  return *si;
}

// "248 nm", "12.4 um": four significant digits, um from 10 um up, for listings and the README.
std::string wavelength_text(double metres) {
  const double nm = metres / units::nm;
  return nm < 1e4 ? fmt::format("{:.4g} nm", nm) : fmt::format("{:.4g} um", metres / units::um);
}

std::string range_text(const materials::LibraryEntry& e) {
  return wavelength_text(e.wavelength_min) + " to " + wavelength_text(e.wavelength_max);
}

// What the PoleSet holds, in words: "Drude + 5 Lorentz", "3 lossless Lorentz", "Drude + 2 critical points".
std::string model_text(const materials::PoleSet& p) {
  std::vector<std::string> parts;
  if (p.drude.size() == 1) parts.emplace_back("Drude");
  if (p.drude.size() > 1) parts.push_back(fmt::format("{} Drude", p.drude.size()));
  if (!p.lorentz.empty()) {
    const bool lossless = std::all_of(p.lorentz.begin(), p.lorentz.end(),
                                      [](const materials::LorentzPole& l) { return l.gamma == 0; });
    parts.push_back(fmt::format("{} {}Lorentz", p.lorentz.size(), lossless ? "lossless " : ""));
  }
  if (!p.critical_points.empty())
    parts.push_back(fmt::format("{} critical point{}", p.critical_points.size(), p.critical_points.size() == 1 ? "" : "s"));
  if (p.conductivity != 0) parts.emplace_back("conductivity");
  if (parts.empty()) return "constant";
  return fmt::format("{}", fmt::join(parts, " + "));
}

void print_json_rows(const std::vector<std::string>& rows) {
  std::printf("[\n");
  for (size_t i = 0; i < rows.size(); ++i) std::printf("  %s%s\n", rows[i].c_str(), i + 1 < rows.size() ? "," : "");
  std::printf("]\n");
}

// ---- list ----

int run_list(bool json) {
  std::vector<std::string> rows;
  if (!json) std::printf("%-20s %-26s %-22s %s\n", "name", "model", "valid range", "summary");
  for (const materials::LibraryEntry& e : materials::library()) {
    if (json) {
      JsonObject j;
      j.text("name", e.name)
          .text("summary", e.summary)
          .text("model", model_text(e.poles))
          .number("wavelength_min_nm", e.wavelength_min / units::nm)
          .number("wavelength_max_nm", e.wavelength_max / units::nm)
          .text("valid_range", range_text(e))
          .text("source", e.source)
          .add("from_memory", e.from_memory ? "true" : "false")
          .text("notes", e.notes);
      rows.push_back(j.str());
    } else {
      std::printf("%-20s %-26s %-22s %s\n", e.name.c_str(), model_text(e.poles).c_str(), range_text(e).c_str(),
                  e.summary.c_str());
      std::printf("%-20s source: %s\n", "", e.source.c_str());
    }
  }
  if (json) print_json_rows(rows);
  return exit_ok;
}

// ---- show ----

struct ShowOptions {
  std::string name;
  std::string from = "400nm";
  std::string to = "900nm";
  std::string step = "10nm";
  bool json = false;
};

const materials::LibraryEntry& entry_named(const std::string& name) {
  if (const materials::LibraryEntry* e = materials::find_material(name)) return *e;
  throw SceneError(Where{}, fmt::format("unknown material '{}'{} (yeegap materials list shows them all)", name,
                                        io::suggestion(name, materials::material_names())));
}

std::vector<double> wavelengths(const ShowOptions& o) {
  const double from = parse_wavelength("--from", o.from), to = parse_wavelength("--to", o.to);
  const double step = parse_wavelength("--step", o.step);
  if (!(to >= from)) option_error("--to", fmt::format("'{}' is below --from '{}'", o.to, o.from));
  // The small allowance keeps `to` in the table when (to - from)/step is an integer up to rounding.
  const double count = std::floor((to - from) / step + 1e-9) + 1;
  if (count > max_rows)
    option_error("--step", fmt::format("{} rows from {} to {}; at most {} (check the units)", count, o.from, o.to,
                                       max_rows));
  std::vector<double> out;
  for (long i = 0; i < static_cast<long>(count); ++i) out.push_back(from + static_cast<double>(i) * step);
  return out;
}

int run_show(const ShowOptions& o) {
  const materials::LibraryEntry& e = entry_named(o.name);
  const std::vector<double> lambdas = wavelengths(o);
  std::fprintf(stderr, "%s: %s\n  model %s, valid %s\n  source: %s\n", e.name.c_str(), e.summary.c_str(),
               model_text(e.poles).c_str(), range_text(e).c_str(), e.source.c_str());
  const double lo = lambdas.front(), hi = lambdas.back();
  if (lo < e.wavelength_min * (1 - range_slack) || hi > e.wavelength_max * (1 + range_slack))
    std::fprintf(stderr, "warning: %s to %s leaves the valid range of %s, %s; outside it the model is an "
                 "extrapolation\n", wavelength_text(lo).c_str(), wavelength_text(hi).c_str(), e.name.c_str(),
                 range_text(e).c_str());

  std::vector<std::string> rows;
  if (!o.json) std::printf("%-14s %-12s %-12s %-10s %-10s\n", "wavelength_nm", "eps_re", "eps_im", "n", "k");
  for (double lambda : lambdas) {
    const double omega = units::wavelength_to_omega(lambda);
    const std::complex<double> eps = materials::permittivity(e.poles, omega);
    const std::complex<double> nk = materials::refractive_index(e.poles, omega);
    if (o.json) {
      JsonObject j;
      j.number("wavelength_nm", lambda / units::nm)
          .number("eps_re", eps.real())
          .number("eps_im", eps.imag())
          .number("n", nk.real())
          .number("k", nk.imag());
      rows.push_back(j.str());
    } else {
      std::printf("%-14.6g %-12.6g %-12.6g %-10.5g %-10.5g\n", lambda / units::nm, eps.real(), eps.imag(), nk.real(),
                  nk.imag());
    }
  }
  if (o.json) print_json_rows(rows);
  return exit_ok;
}

// ---- fit ----

struct FitOptionsText {
  std::string file;
  long lorentz = 2;
  long drude = 1;
  std::string name;
  bool json = false;
};

bool valid_material_name(const std::string& name) {
  if (name.empty() || !std::isalpha(static_cast<unsigned char>(name[0]))) return false;
  return std::all_of(name.begin(), name.end(),
                     [](char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '-'; });
}

// The table file's stem made into a material name: "jc-gold 1972.csv" -> "jc-gold_1972".
std::string name_from_file(const std::string& file) {
  std::string s = std::filesystem::path(file).stem().string();
  for (char& c : s)
    if (!std::isalnum(static_cast<unsigned char>(c)) && c != '_' && c != '-') c = '_';
  if (s.empty() || !std::isalpha(static_cast<unsigned char>(s[0]))) s = "fitted_" + s;
  return s;
}

std::string pole_counts(int drude, int lorentz) {
  std::string s;
  if (drude > 0) s = fmt::format("{} Drude", drude);
  if (lorentz > 0) s += fmt::format("{}{} Lorentz", s.empty() ? "" : " + ", lorentz);
  return s + (drude + lorentz == 1 ? " pole" : " poles");
}

int run_fit(const FitOptionsText& o) {
  if (o.lorentz < 0) option_error("--poles", fmt::format("must be 0 or more, got {}", o.lorentz));
  if (o.drude < 0) option_error("--drude", fmt::format("must be 0 or more, got {}", o.drude));
  if (o.lorentz + o.drude == 0) option_error("--poles", "a fit needs at least one pole (--poles or --drude)");
  const std::string name = o.name.empty() ? name_from_file(o.file) : o.name;
  if (!valid_material_name(name))
    option_error("--name", fmt::format("'{}' is not a usable material name: start with a letter, then letters, "
                                       "digits, '_' or '-'", name));
  materials::FitOptions options;
  options.lorentz_poles = static_cast<int>(o.lorentz);
  options.drude_poles = static_cast<int>(o.drude);

  const materials::NkTable table = materials::read_nk_table(o.file);  // mistakes: SceneError with file:line
  const materials::FitResult fit = materials::fit_poles(table, options);
  const double lo = std::min(table.wavelength.front(), table.wavelength.back());
  const double hi = std::max(table.wavelength.front(), table.wavelength.back());
  const std::string counts = pole_counts(options.drude_poles, options.lorentz_poles);
  const std::string errors = fmt::format("RMS |delta eps| {:.4g}, max |delta eps| {:.4g}, max relative {:.4g} %",
                                         fit.rms_error, fit.max_error, 100.0 * fit.max_relative_error);
  const std::string snippet =
      fmt::format("# {} fitted to {} ({} rows, {} to {}) by yeegap materials fit\n# {}\n", counts,
                  std::filesystem::path(o.file).filename().string(), table.size(), wavelength_text(lo),
                  wavelength_text(hi), errors) +
      io::material_block_text(name, fit.poles);

  if (o.json) {
    std::vector<std::string> drude, lorentz;
    for (const materials::DrudePole& p : fit.poles.drude) {
      JsonObject j;
      j.number("plasma_frequency_eV", units::omega_to_eV(p.omega_p)).number("damping_eV", units::omega_to_eV(p.gamma));
      drude.push_back(j.str());
    }
    for (const materials::LorentzPole& p : fit.poles.lorentz) {
      JsonObject j;
      j.number("strength", p.delta_eps)
          .number("resonance_eV", units::omega_to_eV(p.omega_0))
          .number("damping_eV", units::omega_to_eV(p.gamma));
      lorentz.push_back(j.str());
    }
    JsonObject j;
    j.text("file", o.file)
        .text("name", name)
        .number("rows", static_cast<double>(table.size()))
        .number("wavelength_min_nm", lo / units::nm)
        .number("wavelength_max_nm", hi / units::nm)
        .number("rms_error", fit.rms_error)
        .number("max_error", fit.max_error)
        .number("max_relative_error", fit.max_relative_error)
        .number("eps_inf", fit.poles.eps_inf)
        .add("drude", json_array(drude))
        .add("lorentz", json_array(lorentz))
        .text("snippet", snippet);
    std::printf("%s\n", j.str().c_str());
  } else {
    std::fprintf(stderr, "%s: %zu rows, %s to %s; fitted %s\n  %s\n", o.file.c_str(), table.size(),
                 wavelength_text(lo).c_str(), wavelength_text(hi).c_str(), counts.c_str(), errors.c_str());
    std::printf("%s", snippet.c_str());
  }
  if (fit.max_relative_error > loose_fit)
    std::fprintf(stderr, "warning: the fit deviates from the table by up to %.3g %%; try more poles (--poles) or "
                 "a narrower table\n", 100.0 * fit.max_relative_error);
  return exit_ok;
}

}  // namespace

void add_materials_command(CLI::App& app, int& exit_code) {
  CLI::App* cmd = app.add_subcommand("materials", "the built-in materials library and pole fits of n, k tables");
  cmd->require_subcommand(1);
  cmd->footer(
      "Examples:\n"
      "  yeegap materials list\n"
      "  yeegap materials show Au --from 400nm --to 900nm --step 10nm --json\n"
      "  yeegap materials fit gold.csv --poles 2 --drude 1 > gold.yaml");

  auto list_json = std::make_shared<bool>(false);
  CLI::App* list = cmd->add_subcommand("list", "every library entry: name, model, valid wavelength range, source");
  list->footer("Example:\n  yeegap materials list --json");
  list->add_flag("--json", *list_json, "print a JSON array of entries on stdout");
  list->callback([list_json, &exit_code] { exit_code = guarded([&] { return run_list(*list_json); }); });

  auto show = std::make_shared<ShowOptions>();
  CLI::App* s = cmd->add_subcommand(
      "show", "permittivity and n, k of a library entry over a wavelength range (exp(-i omega t): eps_im >= 0)");
  s->footer("Example:\n  yeegap materials show Au_critical_points --from 500nm --to 700nm --step 50nm\n"
            "A range outside the entry's valid range is printed with a warning on stderr.");
  s->add_option("name", show->name, "library entry, e.g. Au (see `yeegap materials list`)")->required();
  s->add_option("--from", show->from, "shortest vacuum wavelength")->capture_default_str();
  s->add_option("--to", show->to, "longest vacuum wavelength")->capture_default_str();
  s->add_option("--step", show->step, "wavelength step")->capture_default_str();
  s->add_flag("--json", show->json, "print a JSON array of rows on stdout");
  s->callback([show, &exit_code] { exit_code = guarded([&] { return run_show(*show); }); });

  auto fit = std::make_shared<FitOptionsText>();
  CLI::App* f = cmd->add_subcommand(
      "fit", "fit passive Drude and Lorentz poles to a CSV table of wavelength, n, k; print a scene block");
  f->footer("The CSV header names the columns: wavelength_nm (or wavelength_um, wavelength_m), n, k.\n"
            "The printed block goes into a scene as is; a scene can also fit on load with "
            "'table: FILE.csv' (docs/scene.md).");
  f->add_option("file", fit->file, "CSV table of wavelength, n, k")->required();
  f->add_option("--poles", fit->lorentz, "number of Lorentz poles")->capture_default_str();
  f->add_option("--drude", fit->drude, "number of Drude poles (0 for a dielectric)")->capture_default_str();
  f->add_option("--name", fit->name, "material name in the printed block (default: from the file name)");
  f->add_flag("--json", fit->json, "print one JSON object (poles in eV, errors, the block as 'snippet') on stdout");
  f->callback([fit, &exit_code] { exit_code = guarded([&] { return run_fit(*fit); }); });
}

}  // namespace yeegap::cli
