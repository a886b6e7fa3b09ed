// Physical constants in SI units, CODATA 2018 (e, h and c exact since the 2019 SI redefinition).
// The only place these numbers are written; everything else includes this header.
#pragma once

namespace yeegap::constants {

inline constexpr double pi = 3.14159265358979323846;
inline constexpr double c0 = 299792458.0;                 // speed of light in vacuum, m/s
inline constexpr double eps0 = 8.8541878128e-12;          // vacuum permittivity, F/m
inline constexpr double mu0 = 1.25663706212e-6;           // vacuum permeability, H/m
inline constexpr double eta0 = 376.730313668;             // sqrt(mu0/eps0), ohm
inline constexpr double e_charge = 1.602176634e-19;       // elementary charge, C
inline constexpr double h_planck = 6.62607015e-34;        // Planck constant, J s
inline constexpr double hbar = 1.054571817e-34;           // reduced Planck constant, J s
inline constexpr double m_e = 9.1093837015e-31;           // electron mass, kg
inline constexpr double eV = e_charge;                    // 1 eV in J
inline constexpr double eV_to_rad_per_s = e_charge / hbar;  // 1.519267447e15 rad/s per eV

}  // namespace yeegap::constants
