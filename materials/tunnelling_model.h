// The quantum-corrected gap medium of Esteban et al., Nat. Commun. 3, 825 (2012): a local Drude
// medium eps_g(l, omega) = eps_b - omega_p^2/(omega (omega + i gamma_g(l))) whose damping follows the
// tunnelling conductivity, gamma_g = eps0 omega_p^2/sigma0(l), sigma0 = l G_A(l) (physics.md 1.1-1.4).
// A barrier gives sigma0 -> 0 as l -> 0, so at short gaps the damping is joined to the bulk value.
#pragma once

#include <complex>

#include "materials/pole_set.h"
#include "materials/tunnelling_metals.h"

namespace yeegap::materials {

/// Where G_A(l) comes from.
enum class BarrierKind {
  rectangular,      // height E_F + W, exact transmission (physics.md 1.6)
  image_rounded,    // Simmons' image-force barrier, transmission through the profile (physics.md 1.7)
  exponential_fit,  // no barrier: gamma_g = gamma_p exp(l/l_c) (physics.md 1.3)
};

/// "rectangular", "image_rounded", "exponential_fit".
const char* barrier_kind_name(BarrierKind kind);

struct TunnellingOptions {
  double background = 1.0;             // eps_b of the medium filling the gap (1: vacuum)
  double barrier_permittivity = 1.0;   // K in Simmons' image force (image_rounded only)
  // Short-gap join (published QCM anchoring, physics.md 1.3): below the width l' where T(E_F)
  // falls to this value, gamma_g = gamma_p exp(l/l_c), l_c chosen to meet the barrier result at l'.
  // 0 turns the join off: the barrier's own damping at every width (infinite at contact).
  double join_transmission = 1e-2;
  // The cut-off width is where gamma_g reaches this multiple of gamma_p. There the tunnelling term
  // adds omega_p^2/(omega gamma_g) ~ 1e-3 to Im eps at 1 eV for gold (omega_p 9 eV, gamma_p 0.07 eV),
  // so a gap wider than the cut-off may be left as background medium.
  double cutoff_damping_ratio = 1e6;
  double max_slab = 1e-12;             // m: slab thickness of the image_rounded profile (0.01 A)
  double max_width = 5e-9;             // m: widths searched for the join and the cut-off
};

/// A ready-to-use tunnelling model: the inputs, plus the join and cut-off widths found from them by
/// make_tunnelling_model. Plain data, so the solver can hold one per metal pair.
struct TunnellingModel {
  TunnellingMetal metal;
  BarrierKind barrier = BarrierKind::rectangular;
  TunnellingOptions options;
  double join_width = 0;         // m: l' (0 for exponential_fit and without a join)
  double join_decay_length = 0;  // m: l_c used below l' (metal.fit_decay_length for exponential_fit; 0 without a join)
  double cutoff_width = 0;       // m: gamma_g(cutoff_width) = cutoff_damping_ratio * gamma_p (max_width if never)
};

TunnellingModel make_tunnelling_model(const TunnellingMetal& metal, BarrierKind barrier,
                                      const TunnellingOptions& options = {});

/// One row of the tunnelling table (`yeegap tunnelling`), SI.
struct TunnellingPoint {
  double gap = 0;                   // m: l
  double transmission_fermi = 0;    // T(E_F, l) of the barrier; NaN for exponential_fit
  double conductance_per_area = 0;  // S/m^2: the barrier's G_A (exponential_fit: sigma0/l)
  double conductivity = 0;          // S/m: sigma0 of the gap medium, eps0 omega_p^2/gamma_g
                                    // (equals l G_A from l' on; below l' it follows the join)
  double damping = 0;               // rad/s: gamma_g
};

TunnellingPoint evaluate_tunnelling(const TunnellingModel& model, double gap);

/// T(E_F, l) through the model's barrier (rectangular or image_rounded).
double barrier_transmission_fermi(const TunnellingModel& model, double gap);
/// G_A(l) of the model's barrier (rectangular or image_rounded), S/m^2.
double barrier_conductance_per_area(const TunnellingModel& model, double gap);

/// gamma_g(l), rad/s: gamma_p at l = 0, growing without bound with l (infinity once G_A underflows).
double gap_damping(const TunnellingModel& model, double gap);

/// gamma = eps0 omega_p^2/sigma0: the damping of a Drude medium (eps_inf term aside) whose DC
/// conductivity is sigma0 (physics.md 1.2).
double damping_from_conductivity(double plasma_frequency, double conductivity);

/// eps_g(l, omega) = eps_b - omega_p^2/(omega (omega + i gamma_g(l))), exp(-i omega t).
std::complex<double> gap_permittivity(const TunnellingModel& model, double gap, double omega);

/// The same medium as a PoleSet for the solver: eps_inf = eps_b and one Drude pole (omega_p, gamma_g);
/// no pole where gamma_g is infinite (the gap is then plain background).
PoleSet gap_pole_set(const TunnellingModel& model, double gap);

}  // namespace yeegap::materials
