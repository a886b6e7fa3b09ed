// Metals for the tunnelling model: work function and Fermi energy (they set the barrier), and
// the Drude plasma frequency and damping the gap medium shares with the metal (Esteban et al.,
// Nat. Commun. 3, 825 (2012)). Each preset names where every number comes from (physics.md 1.1-1.8).
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace yeegap::materials {

struct TunnellingMetal {
  std::string name;             // the word the command line uses: Au, Au-jellium, Ag, Na
  std::string summary;          // one line for listings
  double work_function = 0;     // J: barrier height above E_F for a vacuum gap
  double fermi_energy = 0;      // J: free-electron E_F, measured from the band bottom
  double plasma_frequency = 0;  // rad/s: Drude omega_p of the metal and of the gap medium
  double damping = 0;           // rad/s: bulk Drude gamma_p, the gap damping as l -> 0
  double fit_decay_length = 0;  // m: l_c of the published fit gamma_g = gamma_p exp(l/l_c)
  std::string sources;          // where each number comes from, with its reliability
};

/// Values a user gives in place of a preset's, to reproduce a paper's parameters (SI; unset keeps the preset's).
struct TunnellingMetalChanges {
  std::optional<double> work_function;     // J
  std::optional<double> fermi_energy;      // J
  std::optional<double> plasma_frequency;  // rad/s
  std::optional<double> damping;           // rad/s
};

/// The preset with the given values replaced; its summary says which ones, so every table printed
/// from it names the numbers it was made with.
TunnellingMetal with_changes(TunnellingMetal metal, const TunnellingMetalChanges& changes);

/// Every preset, in a fixed order. Built once; never changes.
const std::vector<TunnellingMetal>& tunnelling_metals();

/// The preset called `name` (exact match first, then ignoring case), or nullptr.
const TunnellingMetal* find_tunnelling_metal(std::string_view name);

/// All preset names, in order (for "did you mean ...?" and listings).
std::vector<std::string> tunnelling_metal_names();

/// omega_p of a free-electron gas whose Fermi energy is `fermi_energy` (J):
/// n = (2 m E_F)^{3/2}/(3 pi^2 hbar^3), omega_p = sqrt(n e^2/(eps0 m)) (Ashcroft & Mermin 1976, ch. 1-2).
double free_electron_plasma_frequency(double fermi_energy);

/// 1/(2 kappa_F), kappa_F = sqrt(2 m W)/hbar: the decay length of the WKB conductance
/// exp(-2 kappa_F l), used as l_c where no published value exists (physics.md 1.3).
double wkb_decay_length(double work_function);

}  // namespace yeegap::materials
