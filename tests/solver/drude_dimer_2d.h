// The 2D dimer of the quantum-corrected-model checks (Esteban, Borisov, Nordlander, Aizpurua, Nat.
// Commun. 3, 825 (2012)): two infinite cylinders of a free-electron (Drude) metal across a gap of a
// few tenths of a nanometre, lit by a plane wave with E along the dimer axis, run in half the domain
// (the plane between them is an electric wall) on a graded grid with 4 cells across the gap. Shared
// by drude_dimer_gap_validation_test.cpp (cheap) and drude_dimer_gap_slow_test.cpp (the series).
#pragma once

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <vector>

#include "base/constants.h"
#include "base/units.h"
#include "geometry/shapes.h"
#include "materials/tunnelling_model.h"
#include "materials/tunnelling_metals.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver::testing {

/// The metal: the jellium-like gold of Esteban et al. 2012 (eps_inf = 1, hbar omega_p = 7.9 eV,
/// hbar gamma_p = 0.09 eV; the `Au-jellium` preset). A pure Drude metal is what the model's gap
/// medium is made of (the same omega_p and eps_inf = 1), so metal and gap are one description;
/// the Au and Na presets would add an interband-free Drude of a different fit or a longer ring-down
/// (Na's gamma_p is 4.5x smaller), at no gain for the check.
inline const materials::TunnellingMetal& dimer_metal() { return *materials::find_tunnelling_metal("Au-jellium"); }

/// The tunnelling model: the published exponential fit gamma_g = gamma_p exp(l/l_c), l_c = 0.4 A (widely
/// quoted for gold in QCM work; from memory, physics.md 1.3), whose conductance decays by the
/// tenfold per Angstrom of a 5 eV barrier (physics.md 1.3 table).
inline materials::TunnellingModel dimer_tunnelling_model() {
  return materials::make_tunnelling_model(dimer_metal(), materials::BarrierKind::exponential_fit);
}

struct DimerSettings {
  double radius = 10e-9;     // m, cylinder radius
  double gap = 0.5e-9;       // m, surface to surface on the axis
  bool quantum = true;       // quantum_corrected or classical
  double e_min_eV = 0.6;     // band of the pulse and of the spectrum
  double e_max_eV = 5.0;
  int count = 89;            // frequencies, evenly spaced (0.05 eV apart for the defaults)
  double energy_below = 1e-5;// stop when the field energy has fallen to this fraction of its peak
  double cell = 0.5e-9;      // m, cells over the cylinders (20 per radius)
  double axis_cell = 0.2e-9; // m, cells along y near the axis, |y| < 2.5 nm
};

inline Scene drude_cylinder_dimer(const DimerSettings& o) {
  const double nm = 1e-9, R = o.radius;
  const double mid = o.cell;  // also the invariant cell along z
  // Half domain x >= 0: x 80 nm, y 160 nm. The absorbers (12 cells of 2 nm) start about 3R from
  // the dimer's centre, where its near field has fallen to a tenth of its value at the surface.
  Scene s = vacuum_box({40, 80, 1}, 2 * nm,
                       {EdgeKind::mirror_odd, EdgeKind::cpml, EdgeKind::cpml, EdgeKind::cpml,
                        EdgeKind::periodic, EdgeKind::periodic});
  s.domain.step = {2 * nm, 2 * nm, mid};
  s.domain.size.z = mid;
  s.domain.center = {40 * nm, 0, 0};
  // Cells of o.cell over the cylinders and, near the axis, o.axis_cell along y: the gap width
  // l(y) = s + y^2/R grows by 0.2 nm at y = 1.4 nm (R = 10 nm), so the conducting strip of a
  // 0.1 nm gap (l below about 0.25 nm, where the gap damping passes omega_p^2/omega) is about
  // 12 cells of 0.2 nm wide. Along x the gap search adds 4 cells across the gap itself.
  s.domain.refine.push_back({{{0, -R - 3 * nm, -mid / 2}, {2 * R + 3 * nm, R + 3 * nm, mid / 2}}, {mid, mid, mid}});
  s.domain.refine.push_back({{{0, -2.5 * nm, -mid / 2}, {1 * nm, 2.5 * nm, mid / 2}}, {o.axis_cell, o.axis_cell, mid}});
  s.domain.gap_cells = 4;

  const materials::TunnellingMetal& metal = dimer_metal();
  MaterialSpec jellium;
  jellium.name = "jellium_gold";
  jellium.poles.drude.push_back({metal.plasma_frequency, metal.damping});
  s.materials.push_back(jellium);
  // Both cylinders are in the scene (the gap search and the gap widths need the pair); the left
  // one lies beyond the mirror plane and only its image is simulated.
  const double cx = R + o.gap / 2;
  s.bodies.push_back({geometry::make_cylinder({-cx, 0, 0}, {0, 0, 1}, R, 1.0), 1, {}, "left"});
  s.bodies.push_back({geometry::make_cylinder({cx, 0, 0}, {0, 0, 1}, R, 1.0), 1, {}, "right"});
  TunnellingSpec t;
  t.pairs = {{0, 1}};
  t.quantum = o.quantum;
  t.model = dimer_tunnelling_model();
  s.tunnelling.push_back(t);

  PlaneWaveSpec w;
  w.box = {{0, -R - 5 * nm, -1}, {2 * R + 5 * nm, R + 5 * nm, 1}};
  w.axis = 1;  // travels along +y, E along the dimer axis x: drives the bonding modes
  w.sign = +1;
  w.polarization = {1, 0, 0};
  w.waveform.omega_min = units::eV_to_omega(o.e_min_eV);
  w.waveform.omega_max = units::eV_to_omega(o.e_max_eV);
  s.plane_waves.push_back(w);
  CrossSectionSpec cs;
  cs.name = "dimer";
  for (int q = 0; q < o.count; ++q)
    cs.omegas.push_back(units::eV_to_omega(o.e_min_eV + (o.e_max_eV - o.e_min_eV) * q / (o.count - 1)));
  s.cross_sections.push_back(cs);
  s.stop.energy_below = o.energy_below;
  return s;
}

struct DimerSpectrum {
  std::vector<double> energy_eV, extinction, absorption;  // m (per unit length)
  long steps = 0;
  double time_step = 0;
  TunnellingGap tunnelling_gap;
};

inline DimerSpectrum run_dimer(const DimerSettings& o) {
  const RunResults r = Simulation(drude_cylinder_dimer(o)).run();
  DimerSpectrum d;
  const CrossSectionResult& x = r.cross_sections.at(0);
  for (std::size_t q = 0; q < x.omegas.size(); ++q) {
    d.energy_eV.push_back(units::omega_to_eV(x.omegas[q]));
    d.extinction.push_back(x.extinction[q]);
    d.absorption.push_back(x.absorption[q]);
  }
  d.steps = r.summary.steps;
  d.time_step = r.summary.time_step;
  if (!r.tunnelling_gaps.empty()) d.tunnelling_gap = r.tunnelling_gaps[0];
  return d;
}

struct Peak {
  double energy_eV = 0;  // parabola through the sample maximum and its neighbours
  double height = 0;     // m, the extinction there
};

/// Local maxima of the extinction above `min_fraction` of the largest value, lowest energy first.
inline std::vector<Peak> extinction_peaks(const DimerSpectrum& d, double min_fraction) {
  const auto& y = d.extinction;
  const double top = *std::max_element(y.begin(), y.end());
  std::vector<Peak> peaks;
  for (std::size_t i = 1; i + 1 < y.size(); ++i) {
    if (!(y[i] > y[i - 1] && y[i] >= y[i + 1] && y[i] > min_fraction * top)) continue;
    const double h = d.energy_eV[i + 1] - d.energy_eV[i];
    const double curv = y[i - 1] - 2 * y[i] + y[i + 1];
    const double shift = curv < 0 ? 0.5 * (y[i - 1] - y[i + 1]) / curv : 0.0;  // in samples, |shift| <= 0.5
    peaks.push_back({d.energy_eV[i] + shift * h, y[i] - 0.25 * (y[i - 1] - y[i + 1]) * shift});
  }
  return peaks;
}

/// Quasi-static bonding modes of two cylinders of permittivity eps in vacuum, from Laplace's
/// equation in bipolar coordinates (derived here; the textbook two-cylinder separation, e.g. Morse &
/// Feshbach, Methods of Theoretical Physics (1953), ch. 10): with cosh(xi0) = (R + s/2)/R the
/// potential odd in x, A e^{-n xi} inside and B sinh(n xi) outside, matches at xi0 when
/// eps = -coth(n xi0). For a Drude metal with eps_inf = 1, hbar omega_n = hbar omega_p/sqrt(1 + coth(n xi0))
/// (gamma neglected). The n = 1 mode carries the largest dipole of the pair: the bonding peak.
inline double bonding_mode_eV(double radius, double gap, int n) {
  const double xi0 = std::acosh(1 + gap / (2 * radius));
  const double wp_eV = units::omega_to_eV(dimer_metal().plasma_frequency);
  return wp_eV / std::sqrt(1 + 1 / std::tanh(n * xi0));
}

/// Maxima below this share of a spectrum's largest value are not peaks: the ring-down is cut at
/// 1e-5 (1e-4) of the peak energy, which leaves ripples of a few tenths of a nm (0.1-0.5 % of the
/// largest value) at low energies.
inline constexpr double peak_floor = 0.05;

/// The local maximum nearest `energy_eV` within `window_eV`, if any (height 0 if none).
inline Peak peak_near(const DimerSpectrum& d, double energy_eV, double window_eV) {
  Peak best;
  double distance = window_eV;
  for (const Peak& p : extinction_peaks(d, peak_floor))
    if (std::abs(p.energy_eV - energy_eV) <= distance) {
      distance = std::abs(p.energy_eV - energy_eV);
      best = p;
    }
  return best;
}

/// The strongest local maximum within `window_eV` of `energy_eV` (height 0 if none). The bonding
/// peak is found this way around the quasi-static estimate: near it the staircased cylinders also
/// show weaker side maxima, which the nearest-maximum rule could pick instead.
inline Peak strongest_peak_near(const DimerSpectrum& d, double energy_eV, double window_eV) {
  Peak best;
  for (const Peak& p : extinction_peaks(d, peak_floor))
    if (std::abs(p.energy_eV - energy_eV) <= window_eV && p.height > best.height) best = p;
  return best;
}

/// Extinction at `energy_eV`, linear between samples.
inline double extinction_at(const DimerSpectrum& d, double energy_eV);

/// The largest extinction within `window_eV` of `energy_eV` (samples and the window's ends).
inline double largest_extinction_near(const DimerSpectrum& d, double energy_eV, double window_eV) {
  double top = std::max(extinction_at(d, energy_eV - window_eV), extinction_at(d, energy_eV + window_eV));
  for (std::size_t q = 0; q < d.energy_eV.size(); ++q)
    if (std::abs(d.energy_eV[q] - energy_eV) <= window_eV) top = std::max(top, d.extinction[q]);
  return top;
}

/// A charge-transfer peak of the quantum-corrected spectrum `q` against the classical `c` with
/// bonding peak `bonding`: the strongest local maximum more than 0.3 eV (three linewidths) below
/// the bonding peak, at least three times the classical extinction at its energy and at least 5 %
/// of the classical bonding peak (height 0 if none).
inline Peak charge_transfer_peak(const DimerSpectrum& q, const DimerSpectrum& c, const Peak& bonding) {
  Peak best;
  for (const Peak& p : extinction_peaks(q, 0.0))
    if (p.energy_eV < bonding.energy_eV - 0.3 && p.height > 3 * extinction_at(c, p.energy_eV) &&
        p.height > 0.05 * bonding.height && p.height > best.height)
      best = p;
  return best;
}

/// Extinction at `energy_eV`, linear between samples.
inline double extinction_at(const DimerSpectrum& d, double energy_eV) {
  const auto& e = d.energy_eV;
  const auto it = std::upper_bound(e.begin(), e.end(), energy_eV);
  if (it == e.begin()) return d.extinction.front();
  if (it == e.end()) return d.extinction.back();
  const std::size_t i = static_cast<std::size_t>(it - e.begin());
  const double f = (energy_eV - e[i - 1]) / (e[i] - e[i - 1]);
  return (1 - f) * d.extinction[i - 1] + f * d.extinction[i];
}

/// The widths that set where tunnelling matters at photon energy `energy_eV`, from the gap
/// permittivity eps_g = 1 - wp^2/(w(w + i gamma_g(l))) alone (derived here, a circuit argument; the
/// gap is the capacitor that holds the bonding mode's charges, shunted by the tunnelling conductance):
/// - `weakening`: below it the gap's charge relaxation rate sigma0/eps0 = wp^2/gamma_g exceeds the
///   metal's damping gamma_p. Above it the gap adds at most f wp^2/gamma_g (f <= 1: the share of the
///   mode's energy in the gap) to the mode's loss rate, so the peak keeps at least
///   gamma_p/(gamma_p + wp^2/gamma_g) of its classical height (`height_bound`).
/// - `lossy`: below it Im eps_g > 1: the conduction current exceeds the displacement current, the
///   gap leaks its charge within a cycle and the bonding mode is damped away.
/// - `conducting`: below it Re eps_g < 0: the gap responds like a (lossy) metal bridge and charge
///   flows from one cylinder to the other: a charge-transfer mode at lower energy.
struct GapThresholds {
  double weakening = 0, lossy = 0, conducting = 0;  // m
};

inline GapThresholds gap_thresholds(double energy_eV) {
  const materials::TunnellingModel model = dimer_tunnelling_model();
  const double w = units::eV_to_omega(energy_eV);
  const double wp = model.metal.plasma_frequency, gp = model.metal.damping;
  auto widest = [&](auto holds) {  // bisection: holds(l) is true below the threshold, false above
    double lo = 0, hi = model.cutoff_width;
    for (int it = 0; it < 60; ++it) {
      const double mid = 0.5 * (lo + hi);
      (holds(mid) ? lo : hi) = mid;
    }
    return lo;
  };
  GapThresholds t;
  t.weakening = widest([&](double l) { return wp * wp / materials::gap_damping(model, l) > gp; });
  // Im eps_g rises with l while gamma_g < omega and falls after; only the falling side counts.
  t.lossy = widest([&](double l) {
    return materials::gap_damping(model, l) < w || materials::gap_permittivity(model, l, w).imag() > 1.0;
  });
  t.conducting = widest([&](double l) { return materials::gap_permittivity(model, l, w).real() < 0.0; });
  return t;
}

/// The least fraction of its classical height the bonding peak keeps at gap `l` (see GapThresholds).
inline double height_bound(double l) {
  const materials::TunnellingModel model = dimer_tunnelling_model();
  const double wp = model.metal.plasma_frequency, gp = model.metal.damping;
  return gp / (gp + wp * wp / materials::gap_damping(model, l));
}

inline void print_spectrum(const char* label, const DimerSpectrum& d) {
  std::printf("%s: %ld steps of %.3g as; gap cells %ld, narrowest %.4f nm\n", label, d.steps, d.time_step * 1e18,
              d.tunnelling_gap.cells, d.tunnelling_gap.smallest_width * 1e9);
  for (std::size_t q = 0; q < d.energy_eV.size(); ++q)
    std::printf("  %5.3f eV  %8.1f nm  C_ext %8.3f nm  C_abs %8.3f nm\n", d.energy_eV[q], 1239.842 / d.energy_eV[q],
                d.extinction[q] * 1e9, d.absorption[q] * 1e9);
}

}  // namespace yeegap::solver::testing
