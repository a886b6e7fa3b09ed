// Simmons' closed-form planar tunnel junction at low bias: the mean barrier height and effective
// width of the image-force-rounded barrier, and the low-voltage conductance per unit area
// (J. G. Simmons, J. Appl. Phys. 34, 1793 (1963); physics.md 1.7, with beta = 1). Approximate by
// design: a WKB exponent linearised about E_F, without the prefactor of the exact transmission.
#pragma once

namespace yeegap::materials {

/// Simmons' image-rounded barrier reduced to a mean height over an effective width (SI: J, m).
struct SimmonsBarrier {
  double lambda = 0;           // J: e^2 ln2/(8 pi K eps0 s)
  double s1 = 0, s2 = 0;       // m: where the barrier starts and ends, s1 = 1.2 lambda s/phi0, s2 = s - s1
  double effective_width = 0;  // m: Delta_s = s2 - s1
  double mean_height = 0;      // J: phi_bar above the Fermi level
  bool collapsed = false;      // the image force pulls the barrier below the Fermi level (phi_bar <= 0)
};

/// phi_bar = phi0 - [1.15 lambda s/(s2 - s1)] ln[s2 (s - s1)/(s1 (s - s2))] for a gap of width s
/// (m), barrier height phi0 (J, the work function for a vacuum gap) and relative permittivity K.
SimmonsBarrier simmons_image_barrier(double barrier_height, double width, double relative_permittivity);

/// Low-bias conductance per unit area, S/m^2:
/// G_A = (e/h)^2 sqrt(2 m phi_bar)/Delta_s * exp(-4 pi Delta_s sqrt(2 m phi_bar)/h).
/// For a rectangular barrier (phi_bar = W, Delta_s = s) this is the WKB result of physics.md 1.5.
/// NaN when the barrier has collapsed (phi_bar <= 0 or Delta_s <= 0): the formula does not apply.
double simmons_conductance_per_area(double mean_height, double effective_width);

}  // namespace yeegap::materials
