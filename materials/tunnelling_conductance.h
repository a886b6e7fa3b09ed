// Low-bias conductance per unit area of a planar barrier from its transmission (Tsu-Esaki /
// Landauer, independent electrons, T = 0 K; derivation in physics.md 1.5):
//   G_A = e^2 m/(2 pi^2 hbar^3) * integral_0^E_F T(E_z) dE_z,
// with E_z the normal energy from the band bottom. SI: J, S/m^2.
#pragma once

#include <functional>

namespace yeegap::materials {

/// e^2 m/(2 pi^2 hbar^3), S m^-2 J^-1 (1.61831e14 S m^-2 eV^-1).
double conductance_prefactor();

/// integral_0^E_F T(E) dE (J), by composite 8-point Gauss-Legendre with the panel count doubled
/// until two estimates agree to `relative_tolerance`. T(E) of a barrier is smooth (analytic in E for
/// a piecewise-constant profile) and grows roughly like exp(2 l E dkappa/dE), so a few dozen
/// panels reach 1e-12 even for 2 nm gaps.
double integrate_transmission(const std::function<double(double)>& transmission, double fermi_energy,
                              double relative_tolerance = 1e-10);

/// G_A = conductance_prefactor() * integrate_transmission(T, E_F), S/m^2.
double conductance_per_area(const std::function<double(double)>& transmission, double fermi_energy,
                            double relative_tolerance = 1e-10);

}  // namespace yeegap::materials
