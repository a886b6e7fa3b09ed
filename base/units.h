// Conversions between SI (used everywhere inside the code) and the units people write:
// nm, um, eV, THz, fs. A photon energy E and a vacuum wavelength lambda are tied by E = h c / lambda.
#pragma once

#include "base/constants.h"

namespace yeegap::units {

inline constexpr double nm = 1e-9;
inline constexpr double um = 1e-6;
inline constexpr double fs = 1e-15;

/// Angular frequency (rad/s) of a photon of energy `energy_eV`.
inline constexpr double eV_to_omega(double energy_eV) { return energy_eV * constants::eV_to_rad_per_s; }
/// Photon energy in eV of angular frequency `omega` (rad/s).
inline constexpr double omega_to_eV(double omega) { return omega / constants::eV_to_rad_per_s; }
/// Angular frequency (rad/s) of light with vacuum wavelength `lambda` (m).
inline constexpr double wavelength_to_omega(double lambda) { return 2.0 * constants::pi * constants::c0 / lambda; }
/// Vacuum wavelength (m) of angular frequency `omega` (rad/s).
inline constexpr double omega_to_wavelength(double omega) { return 2.0 * constants::pi * constants::c0 / omega; }
/// Vacuum wavelength in nm of a photon of energy `energy_eV`.
inline constexpr double eV_to_wavelength_nm(double energy_eV) {
  return constants::h_planck * constants::c0 / (energy_eV * constants::eV) / nm;
}

}  // namespace yeegap::units
