// A linear, isotropic, dispersive medium as the solver sees it: eps_inf, a static conductivity and
// any number of Drude and Lorentz poles, all in SI (rad/s, S/m). Convention exp(-i omega t), so a
// passive medium has Im eps >= 0.
//   Drude:   -omega_p^2 / (omega^2 + i gamma omega)
//   Lorentz: delta_eps omega_0^2 / (omega_0^2 - omega^2 - i gamma omega)
//   conductivity: + i sigma / (eps0 omega)
#pragma once

#include <complex>
#include <string>
#include <vector>

namespace yeegap::materials {

struct DrudePole {
  double omega_p = 0;  // plasma frequency of this pole, rad/s
  double gamma = 0;    // damping, rad/s
};

struct LorentzPole {
  double delta_eps = 0;  // oscillator strength (dimensionless)
  double omega_0 = 0;    // resonance, rad/s
  double gamma = 0;      // damping, rad/s
};

struct PoleSet {
  double eps_inf = 1.0;
  double conductivity = 0.0;  // static conductivity sigma, S/m
  std::vector<DrudePole> drude;
  std::vector<LorentzPole> lorentz;

  bool dispersive() const { return !drude.empty() || !lorentz.empty(); }
};

/// The continuous model's relative permittivity at angular frequency omega (rad/s, > 0).
std::complex<double> permittivity(const PoleSet& poles, double omega);

}  // namespace yeegap::materials
