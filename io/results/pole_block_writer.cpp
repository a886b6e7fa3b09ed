// Scene text of a PoleSet (pole_block_writer.h). Spectral values go out in eV and phases in
// degrees, the units people read most easily; one pole per line in YAML flow form.
#include "io/results/pole_block_writer.h"

#include <fmt/format.h>

#include "base/constants.h"
#include "base/units.h"

namespace yeegap::io {
namespace {

std::string number(double v) { return fmt::format("{:.{}g}", v, pole_text_digits); }
std::string eV(double omega) { return number(units::omega_to_eV(omega)) + " eV"; }

}  // namespace

std::string material_block_text(const std::string& name, const materials::PoleSet& poles) {
  std::string s = fmt::format("materials:\n  {}:\n    poles:\n      eps_inf: {}\n", name, number(poles.eps_inf));
  if (!poles.drude.empty()) {
    s += "      drude:\n";
    for (const materials::DrudePole& p : poles.drude)
      s += fmt::format("        - {{plasma_frequency: {}, damping: {}}}\n", eV(p.omega_p), eV(p.gamma));
  }
  if (!poles.lorentz.empty()) {
    s += "      lorentz:\n";
    for (const materials::LorentzPole& p : poles.lorentz)
      s += fmt::format("        - {{strength: {}, resonance: {}, damping: {}}}\n", number(p.delta_eps),
                       eV(p.omega_0), eV(p.gamma));
  }
  if (!poles.critical_points.empty()) {
    s += "      critical_points:\n";
    for (const materials::CriticalPoint& p : poles.critical_points)
      s += fmt::format("        - {{amplitude: {}, phase: {} deg, resonance: {}, damping: {}}}\n",
                       number(p.amplitude), number(p.phase * 180.0 / constants::pi), eV(p.omega), eV(p.gamma));
  }
  if (poles.conductivity != 0) s += fmt::format("    conductivity: {} S/m\n", number(poles.conductivity));
  return s;
}

}  // namespace yeegap::io
