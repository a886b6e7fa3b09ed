// `yeegap tunnelling`: the tunnelling model on its own (materials/tunnelling_model.h), a table of gap
// width -> barrier transmission at E_F, conductance per area, sigma0, gap damping and the gap
// permittivity at one photon energy. The table is the product, so it goes to stdout; notes to stderr.
#include <cmath>
#include <cstdlib>
#include <complex>
#include <cstdio>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "base/units.h"
#include "commands.h"
#include "io/suggest.h"
#include "io/written_units.h"
#include "json.h"
#include "materials/tunnelling_model.h"

namespace yeegap::cli {

namespace {

struct TunnellingOptionsText {
  std::string metal = "Au";
  std::string from = "0.1nm";
  std::string to = "1.2nm";
  std::string step = "0.05nm";
  std::string at = "1.8eV";
  std::string barrier = "rectangular";
  std::string join;  // a transmission T(E_F), or "none"; empty: the model's default (1e-2)
  // A paper's numbers in place of the preset's; empty keeps the preset's.
  std::string work_function, fermi_energy, plasma_frequency, damping;
  bool json = false;
};

// More rows than this is almost certainly a unit slip (a step in pm, a range in um).
constexpr long max_rows = 10000;

[[noreturn]] void option_error(const std::string& option, const std::string& message) {
  throw SceneError(Where{}, fmt::format("{}: {}", option, message));
}

// A length as the scene reader takes it: "0.5nm", "5e-10 m", or a bare number in nm.
double parse_length(const std::string& option, const std::string& text) {
  const auto nu = io::split_number_unit(text);
  if (!nu) option_error(option, fmt::format("expected a length such as '0.5nm', got '{}'", text));
  const auto si = io::to_si(io::Dimension::length, nu->value, nu->unit.empty() ? "nm" : nu->unit);
  if (!si)
    option_error(option, fmt::format("'{}' is not a length unit{}", nu->unit,
                                     io::suggestion(nu->unit, io::units_of(io::Dimension::length))));
  return *si;
}

// A photon energy or wavelength ("1.8eV", "700nm"); a bare number is refused as ambiguous.
double parse_spectral(const std::string& option, const std::string& text) {
  const auto nu = io::split_number_unit(text);
  if (!nu || nu->unit.empty())
    option_error(option, fmt::format("expected a photon energy or wavelength with its unit, such as '1.8eV' or "
                                     "'700nm', got '{}'",
                                     text));
  const auto omega = io::spectral_to_omega(nu->value, nu->unit);
  if (!omega)
    option_error(option, fmt::format("'{}' is not a spectral unit{}", nu->unit,
                                     io::suggestion(nu->unit, io::units_of(io::Dimension::spectral))));
  if (!(*omega > 0)) option_error(option, fmt::format("must be positive, got '{}'", text));
  return *omega;
}

// An electron energy in eV or meV, J.
double parse_energy(const std::string& option, const std::string& text) {
  const auto nu = io::split_number_unit(text);
  if (!nu || (nu->unit != "eV" && nu->unit != "meV") || !(nu->value > 0))
    option_error(option, fmt::format("expected a positive energy in eV or meV, such as '5.1eV', got '{}'", text));
  return nu->value * (nu->unit == "eV" ? 1.0 : 1e-3) * constants::eV;
}

materials::TunnellingMetal given_metal(const materials::TunnellingMetal& preset,
                                       const TunnellingOptionsText& o) {
  materials::TunnellingMetalChanges c;
  if (!o.work_function.empty()) c.work_function = parse_energy("--work-function", o.work_function);
  if (!o.fermi_energy.empty()) c.fermi_energy = parse_energy("--fermi-energy", o.fermi_energy);
  if (!o.plasma_frequency.empty()) c.plasma_frequency = parse_spectral("--plasma-frequency", o.plasma_frequency);
  if (!o.damping.empty()) c.damping = parse_spectral("--damping", o.damping);
  return materials::with_changes(preset, c);
}

materials::TunnellingOptions tunnelling_options(const TunnellingOptionsText& o, materials::BarrierKind kind) {
  materials::TunnellingOptions options;
  if (o.join.empty()) return options;
  if (kind == materials::BarrierKind::exponential_fit)
    option_error("--join", "the exponential_fit barrier has no join (it is the exponential at every width)");
  if (o.join == "none") {
    options.join_transmission = 0;
    return options;
  }
  char* end = nullptr;
  const double t = std::strtod(o.join.c_str(), &end);
  if (end == o.join.c_str() || *end != '\0' || !(t > 0 && t < 1))
    option_error("--join", fmt::format("expected a transmission T(E_F) between 0 and 1 (exclusive), or none, got '{}'",
                                       o.join));
  options.join_transmission = t;
  return options;
}

materials::BarrierKind parse_barrier(const std::string& word) {
  if (word == "rectangular") return materials::BarrierKind::rectangular;
  // The scene's words (io/scene/scene_tunnelling.cpp) and their short forms.
  if (word == "image_rounded" || word == "image") return materials::BarrierKind::image_rounded;
  if (word == "exponential_fit" || word == "fit") return materials::BarrierKind::exponential_fit;
  option_error("--barrier", fmt::format("unknown barrier '{}' (expected rectangular, image_rounded or "
                                        "exponential_fit){}",
                                        word, io::suggestion(word, {"rectangular", "image_rounded", "exponential_fit"})));
}

const materials::TunnellingMetal& parse_metal(const std::string& name) {
  if (const materials::TunnellingMetal* m = materials::find_tunnelling_metal(name)) return *m;
  option_error("--metal",
               fmt::format("unknown metal '{}'{}", name, io::suggestion(name, materials::tunnelling_metal_names())));
}

std::vector<double> gap_widths(const TunnellingOptionsText& o) {
  const double from = parse_length("--from", o.from), to = parse_length("--to", o.to);
  const double step = parse_length("--step", o.step);
  if (!(from >= 0)) option_error("--from", fmt::format("a gap width cannot be negative, got '{}'", o.from));
  if (!(to >= from)) option_error("--to", fmt::format("'{}' is below --from '{}'", o.to, o.from));
  if (!(step > 0)) option_error("--step", fmt::format("must be positive, got '{}'", o.step));
  // The small allowance keeps `to` in the table when (to - from)/step is an integer up to rounding.
  const double count = std::floor((to - from) / step + 1e-9) + 1;
  if (count > max_rows)
    option_error("--step", fmt::format("{} rows from {} to {}; at most {} (check the units)", count, o.from, o.to,
                                       max_rows));
  std::vector<double> widths;
  for (long i = 0; i < static_cast<long>(count); ++i) widths.push_back(from + static_cast<double>(i) * step);
  return widths;
}

std::string cell(double v) { return std::isfinite(v) ? fmt::format("{:<12.4e}", v) : fmt::format("{:<12}", "-"); }

int run_tunnelling(const TunnellingOptionsText& o) {
  const materials::TunnellingMetal metal = given_metal(parse_metal(o.metal), o);
  const materials::BarrierKind kind = parse_barrier(o.barrier);
  const std::vector<double> widths = gap_widths(o);
  const double omega = parse_spectral("--at", o.at);
  const materials::TunnellingModel model =
      materials::make_tunnelling_model(metal, kind, tunnelling_options(o, kind));

  const double photon_eV = units::omega_to_eV(omega);
  std::fprintf(stderr, "%s: %s\n", metal.name.c_str(), metal.summary.c_str());
  std::fprintf(stderr, "  barrier %s; permittivity at %.4g eV (%.1f nm)\n", materials::barrier_kind_name(kind),
               photon_eV, units::eV_to_wavelength_nm(photon_eV));
  if (kind == materials::BarrierKind::exponential_fit) {
    std::fprintf(stderr, "  gamma_g = gamma_p exp(l/l_c), l_c = %.4g nm; G/A and sigma0 follow from gamma_g\n",
                 model.join_decay_length / units::nm);
  } else if (model.options.join_transmission == 0) {
    std::fprintf(stderr, "  no short-gap join: sigma0 = l G/A at every width, so gamma_g grows without bound as l -> 0\n");
  } else {
    // The join (docs/gaps.md, "The short-gap join"): l G/A -> 0 at contact, so the barrier alone
    // would make the gap vacuum-like as it closes; the published anchoring ties gamma_g to gamma_p.
    std::fprintf(stderr,
                 "  short-gap join: below l' = %.4g nm, where T(E_F) falls to %g, gamma_g = gamma_p exp(l/l_c) with\n"
                 "  l_c = %.4g nm (meets the barrier value at l'), and sigma0 = eps0 wp^2/gamma_g there; from l' on\n"
                 "  sigma0 = l G/A. --join T moves l', --join none turns it off (docs/gaps.md)\n",
                 model.join_width / units::nm, model.options.join_transmission, model.join_decay_length / units::nm);
  }
  std::fprintf(stderr, "  cut-off %.4g nm: gamma_g = %g gamma_p, tunnelling negligible beyond\n",
               model.cutoff_width / units::nm, model.options.cutoff_damping_ratio);

  std::vector<std::string> rows;
  if (!o.json)
    std::printf("%-9s %-12s %-12s %-12s %-12s %-12s %-12s\n", "gap_nm", "T(E_F)", "G/A_S/m2", "sigma0_S/m",
                "gamma_g_eV", "eps_re", "eps_im");
  for (double l : widths) {
    const materials::TunnellingPoint p = materials::evaluate_tunnelling(model, l);
    const std::complex<double> eps = materials::gap_permittivity(model, l, omega);
    const double gamma_eV = units::omega_to_eV(p.damping);
    if (o.json) {
      JsonObject j;
      j.number("gap_nm", l / units::nm)
          .number("transmission_fermi", p.transmission_fermi)
          .number("conductance_per_area_S_m2", p.conductance_per_area)
          .number("sigma0_S_m", p.conductivity)
          .number("gamma_g_eV", gamma_eV)
          .number("eps_re", eps.real())
          .number("eps_im", eps.imag());
      rows.push_back(j.str());
    } else {
      std::printf("%-9.4f %s %s %s %s %s %s\n", l / units::nm, cell(p.transmission_fermi).c_str(),
                  cell(p.conductance_per_area).c_str(), cell(p.conductivity).c_str(), cell(gamma_eV).c_str(),
                  cell(eps.real()).c_str(), cell(eps.imag()).c_str());
    }
  }
  if (o.json) {
    std::printf("[\n");
    for (size_t i = 0; i < rows.size(); ++i) std::printf("  %s%s\n", rows[i].c_str(), i + 1 < rows.size() ? "," : "");
    std::printf("]\n");
  }
  return exit_ok;
}

}  // namespace

void add_tunnelling_command(CLI::App& app, int& exit_code) {
  auto opts = std::make_shared<TunnellingOptionsText>();
  CLI::App* cmd = app.add_subcommand(
      "tunnelling", "tunnelling model: gap width -> transmission, conductance, damping, gap permittivity");
  cmd->footer(
      "Example:\n  yeegap tunnelling --metal Au --from 0.1nm --to 1.2nm --step 0.05nm --at 1.8eV --barrier image --json\n"
      "  yeegap tunnelling --metal Au --fermi-energy 5.53eV --work-function 5.31eV --plasma-frequency 9eV --join none\n"
      "Metals: Au, Au-jellium, Ag, Na. Barriers: rectangular (exact), image (Simmons image force), fit "
      "(gamma_p exp(l/l_c)).");
  cmd->add_option("--metal", opts->metal, "metal preset")->capture_default_str();
  cmd->add_option("--from", opts->from, "smallest gap width")->capture_default_str();
  cmd->add_option("--to", opts->to, "largest gap width")->capture_default_str();
  cmd->add_option("--step", opts->step, "gap width step")->capture_default_str();
  cmd->add_option("--at", opts->at, "photon energy or vacuum wavelength for eps_g (1.8eV, 700nm)")
      ->capture_default_str();
  cmd->add_option("--barrier", opts->barrier, "rectangular, image_rounded or exponential_fit (as in scenes; image and fit also accepted)")->capture_default_str();
  cmd->add_option("--join", opts->join,
                  "short-gap join: the T(E_F) at which gamma_g joins gamma_p exp(l/l_c) (default 0.01), or none");
  cmd->add_option("--work-function", opts->work_function, "work function W in place of the preset's (5.1eV)");
  cmd->add_option("--fermi-energy", opts->fermi_energy, "Fermi energy E_F in place of the preset's (5.53eV)");
  cmd->add_option("--plasma-frequency", opts->plasma_frequency,
                  "Drude plasma frequency omega_p of metal and gap medium in place of the preset's (9eV)");
  cmd->add_option("--damping", opts->damping, "bulk Drude damping gamma_p in place of the preset's (0.07eV)");
  cmd->add_flag("--json", opts->json, "print a JSON array of rows on stdout");
  cmd->callback([opts, &exit_code] { exit_code = guarded([&] { return run_tunnelling(*opts); }); });
}

}  // namespace yeegap::cli
