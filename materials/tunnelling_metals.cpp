// The tunnelling metal presets (see tunnelling_metals.h). Work functions: CRC Handbook of Chemistry
// and Physics, "Electron work function of the elements" (Michaelson, J. Appl. Phys. 48, 4729 (1977)),
// polycrystalline values. Fermi energies: Ashcroft & Mermin, Solid State Physics (1976), Table 2.1.
// Both are recalled, not re-read (physics.md 1.8 marks them [M]).
#include "materials/tunnelling_metals.h"

#include <cctype>
#include <cmath>

#include "base/constants.h"
#include "base/units.h"

#include <fmt/format.h>

namespace yeegap::materials {

namespace {

constexpr double angstrom = 1e-10;

TunnellingMetal make(const char* name, const char* summary, double work_function_eV, double fermi_eV,
                 double omega_p_eV, double gamma_p_eV, const char* sources) {
  TunnellingMetal m;
  m.name = name;
  m.summary = summary;
  m.work_function = work_function_eV * constants::eV;
  m.fermi_energy = fermi_eV * constants::eV;
  m.plasma_frequency = units::eV_to_omega(omega_p_eV);
  m.damping = units::eV_to_omega(gamma_p_eV);
  m.fit_decay_length = wkb_decay_length(m.work_function);
  m.sources = sources;
  return m;
}

std::vector<TunnellingMetal> build() {
  std::vector<TunnellingMetal> all;
  // Gold, Drude set of Esteban et al., Faraday Discuss. 178, 151 (2015): the QCM's practical-gold fit.
  TunnellingMetal au = make("Au", "gold: W 5.1 eV, E_F 5.53 eV, Drude 9.065/0.0708 eV (Esteban 2015)", 5.1, 5.53,
                        9.065, 0.0708,
                        "W 5.1 eV polycrystalline (CRC Handbook, Michaelson 1977) [from memory]; E_F 5.53 eV "
                        "(Ashcroft & Mermin Table 2.1) [from memory]; hbar omega_p 9.065 eV, hbar gamma_p "
                        "0.0708 eV (Esteban et al., Faraday Discuss. 178, 151 (2015), secondary summary); "
                        "l_c 0.4 A (widely quoted for Au in QCM work) [from memory]");
  au.fit_decay_length = 0.4 * angstrom;
  all.push_back(au);
  // Jellium-like gold of the first QCM paper: eps_inf = 1, valid below the interband edge (~2 eV).
  TunnellingMetal au_jellium = make("Au-jellium", "jellium gold: W 5.1 eV, E_F 5.53 eV, Drude 7.9/0.09 eV (Esteban 2012)",
                                5.1, 5.53, 7.9, 0.09,
                                "W, E_F as for Au [from memory]; hbar omega_p 7.9 eV, hbar gamma_p 0.09 eV "
                                "(Esteban et al., Nat. Commun. 3, 825 (2012), secondary summary); l_c 0.4 A "
                                "[from memory]");
  au_jellium.fit_decay_length = 0.4 * angstrom;
  all.push_back(au_jellium);
  // Silver: no QCM Drude set is recorded, so the Drude term of Rakic's Lorentz-Drude fit is used:
  // omega_p sqrt(f0) = 9.01 sqrt(0.845) eV, Gamma0 = 0.048 eV.
  all.push_back(make("Ag", "silver: W 4.26 eV, E_F 5.49 eV, Drude term of Rakic 1998", 4.26, 5.49,
                     9.01 * std::sqrt(0.845), 0.048,
                     "W 4.26 eV polycrystalline (CRC Handbook, Michaelson 1977) [from memory]; E_F 5.49 eV "
                     "(Ashcroft & Mermin Table 2.1) [from memory]; Drude term of Rakic et al., Appl. Opt. 37, "
                     "5271 (1998); l_c = 1/(2 kappa_F) = 0.47 A, a WKB estimate (physics.md 1.3)"));
  // Sodium as a free-electron (jellium) metal: omega_p from the density that E_F implies.
  TunnellingMetal na = make("Na", "sodium-like jellium: W 2.75 eV, E_F 3.24 eV, free-electron omega_p", 2.75, 3.24, 0,
                        0,
                        "W 2.75 eV (CRC Handbook, Michaelson 1977) [from memory]; E_F 3.24 eV (Ashcroft & Mermin "
                        "Table 2.1) [from memory]; omega_p of the free-electron gas with that E_F (6.04 eV); "
                        "gamma_p = 1/tau, tau = 3.2e-14 s at 273 K (Ashcroft & Mermin Table 1.3) [from memory]; "
                        "l_c = 1/(2 kappa_F) = 0.59 A, a WKB estimate (physics.md 1.3)");
  na.plasma_frequency = free_electron_plasma_frequency(na.fermi_energy);
  na.damping = 1.0 / 3.2e-14;
  all.push_back(na);
  return all;
}

bool same_ignoring_case(std::string_view a, std::string_view b) {
  if (a.size() != b.size()) return false;
  for (size_t i = 0; i < a.size(); ++i)
    if (std::tolower(static_cast<unsigned char>(a[i])) != std::tolower(static_cast<unsigned char>(b[i]))) return false;
  return true;
}

}  // namespace

TunnellingMetal with_changes(TunnellingMetal m, const TunnellingMetalChanges& c) {
  std::string changed;
  auto note = [&](const char* what, double eV) { changed += fmt::format("{}{} {:.6g} eV", changed.empty() ? "" : ", ", what, eV); };
  if (c.work_function) m.work_function = *c.work_function, note("W", *c.work_function / constants::eV);
  if (c.fermi_energy) m.fermi_energy = *c.fermi_energy, note("E_F", *c.fermi_energy / constants::eV);
  if (c.plasma_frequency) m.plasma_frequency = *c.plasma_frequency, note("hbar omega_p", units::omega_to_eV(*c.plasma_frequency));
  if (c.damping) m.damping = *c.damping, note("hbar gamma_p", units::omega_to_eV(*c.damping));
  if (changed.empty()) return m;
  m.summary += "; given instead: " + changed;
  m.sources += "; given by the user instead: " + changed;
  return m;
}

const std::vector<TunnellingMetal>& tunnelling_metals() {
  static const std::vector<TunnellingMetal> all = build();
  return all;
}

const TunnellingMetal* find_tunnelling_metal(std::string_view name) {
  for (const TunnellingMetal& m : tunnelling_metals())
    if (m.name == name) return &m;
  for (const TunnellingMetal& m : tunnelling_metals())
    if (same_ignoring_case(m.name, name)) return &m;
  return nullptr;
}

std::vector<std::string> tunnelling_metal_names() {
  std::vector<std::string> names;
  for (const TunnellingMetal& m : tunnelling_metals()) names.push_back(m.name);
  return names;
}

double free_electron_plasma_frequency(double fermi_energy) {
  const double k_f = std::sqrt(2.0 * constants::m_e * fermi_energy) / constants::hbar;
  const double density = k_f * k_f * k_f / (3.0 * constants::pi * constants::pi);
  return std::sqrt(density * constants::e_charge * constants::e_charge / (constants::eps0 * constants::m_e));
}

double wkb_decay_length(double work_function) {
  return constants::hbar / (2.0 * std::sqrt(2.0 * constants::m_e * work_function));
}

}  // namespace yeegap::materials
