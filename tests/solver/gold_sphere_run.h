// One TFSF run of a gold sphere (radius 30 nm, Lorentz-Drude gold of Rakic et al., Appl. Opt. 37,
// 5271 (1998)) in water (index 1.333, dispersion-free) at a chosen number of cells per radius, with
// or without subcell averaging, and its extinction peak beside Mie theory for the same permittivity
// model (Bohren & Huffman 1983, ch. 4; materials/mie_sphere.h). A quarter of the domain: the scene
// is odd under x -> -x (E along x) and even under y -> -y (mirror_symmetry_validation_test).
#pragma once

#include <cmath>
#include <cstdio>
#include <vector>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/library.h"
#include "materials/mie_sphere.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver::testing {

struct SpherePeak {
  double fdtd_wavelength = 0, mie_wavelength = 0;  // m
  double fdtd_extinction = 0, mie_extinction = 0;  // m^2, at the peaks
  long steps = 0;
  long long mixed_cells = 0;
  double wavelength_error() const { return fdtd_wavelength / mie_wavelength - 1; }
  double extinction_ratio() const { return fdtd_extinction / mie_extinction; }
};

// Peak of a sampled curve refined by a parabola through the top three points.
inline std::pair<double, double> parabolic_peak(const std::vector<double>& x, const std::vector<double>& y) {
  std::size_t m = 1;
  for (std::size_t i = 1; i + 1 < y.size(); ++i)
    if (y[i] > y[m]) m = i;
  const double y0 = y[m - 1], y1 = y[m], y2 = y[m + 1], h = x[m + 1] - x[m];
  const double shift = 0.5 * (y0 - y2) / (y0 - 2 * y1 + y2);
  return {x[m] + shift * h, y1 - 0.25 * (y0 - y2) * shift};
}

/// How the sphere's surface cells are treated: staircase, the diagonal of the averaged tensor only,
/// or the whole tensor (solver/media/subcell_dispersive_cross_terms.h).
enum class Averaging { off, diagonal, full };
inline const char* name(Averaging a) { return a == Averaging::off ? "off" : (a == Averaging::diagonal ? "diagonal" : "full"); }

/// Cross sections of the sphere beside Mie's at the wavelengths asked (m^2).
struct SphereSpectra {
  std::vector<double> extinction, scattering, absorption;
  std::vector<double> mie_extinction, mie_scattering, mie_absorption;
};

inline constexpr double sphere_water_index = 1.333, sphere_radius = 30e-9;

/// The scene of the runs below: the sphere at `cells_per_radius`, centred on the mirror planes and
/// `z_offset` cells above a node along z, lit by a pulse from `lambda_short` to `lambda_long`.
inline Scene gold_sphere_scene(double cells_per_radius, Averaging averaging, double z_offset, int absorber,
                               double lambda_short, double lambda_long) {
  using constants::c0;
  using constants::pi;
  constexpr double n_water = sphere_water_index, radius = sphere_radius;
  const double d = radius / cells_per_radius;
  // TFSF box 10 nm (at least 4 cells) beyond the sphere; 4 cells to the absorber (8 cells by default).
  const double margin = std::max(10e-9, 4 * d);
  const int box_cells = static_cast<int>(std::ceil((radius + margin) / d));
  const int half = std::max(box_cells + 4 + absorber, 2 * absorber + 2);  // the check wants 2 layers + 2
  Scene s = vacuum_box({half, half, 2 * half}, d, all_edges(EdgeKind::cpml));
  s.domain.center = {half * d / 2, half * d / 2, 0};
  s.domain.edges[0] = EdgeKind::mirror_odd;
  s.domain.edges[2] = EdgeKind::mirror_even;
  s.domain.cpml.cells = absorber;
  s.domain.averaging = averaging != Averaging::off;
  s.domain.averaging_cross_terms = averaging == Averaging::full;
  s.materials[0].name = "water";
  s.materials[0].poles.eps_inf = n_water * n_water;
  const materials::PoleSet gold = materials::find_material("Au")->poles;
  MaterialSpec au;
  au.name = "Au";
  au.poles = gold;
  s.materials.push_back(au);
  s.bodies.push_back({geometry::make_sphere({0, 0, z_offset * d}, radius), 1, {}});
  PlaneWaveSpec w;
  const double b = box_cells * d;
  w.box = {{0, 0, -b}, {b, b, b}};
  w.axis = 2;
  w.sign = +1;
  w.polarization = {1, 0, 0};
  w.waveform.omega_min = 2 * pi * c0 / lambda_long;
  w.waveform.omega_max = 2 * pi * c0 / lambda_short;
  s.plane_waves.push_back(w);
  s.stop.energy_below = 1e-5;
  return s;
}

inline SphereSpectra gold_sphere_spectra(double cells_per_radius, Averaging averaging, const std::vector<double>& lambdas,
                                         double z_offset = 0.5, int absorber = 8) {
  using constants::c0;
  using constants::pi;
  Scene s = gold_sphere_scene(cells_per_radius, averaging, z_offset, absorber, 420e-9, 850e-9);
  CrossSectionSpec cs;
  cs.name = "sphere";
  for (double l : lambdas) cs.omegas.push_back(2 * pi * c0 / l);
  s.cross_sections.push_back(cs);
  const RunResults r = Simulation(s).run();
  SphereSpectra out;
  out.extinction = r.cross_sections.at(0).extinction;
  out.scattering = r.cross_sections.at(0).scattering;
  out.absorption = r.cross_sections.at(0).absorption;
  const materials::PoleSet gold = materials::find_material("Au")->poles;
  for (double l : lambdas) {
    const auto m = materials::mie_sphere_cross_sections(sphere_radius, l, materials::permittivity(gold, 2 * pi * c0 / l),
                                                        sphere_water_index);
    out.mie_extinction.push_back(m.extinction);
    out.mie_scattering.push_back(m.scattering);
    out.mie_absorption.push_back(m.absorption);
  }
  return out;
}

/// Runs the sphere at `cells_per_radius` (R / cell); the centre sits on the mirror planes and
/// `z_offset` cells above a node along z.
inline SpherePeak gold_sphere_peak(double cells_per_radius, Averaging averaging, double z_offset = 0.5,
                                   int absorber = 8) {
  using constants::c0;
  using constants::pi;
  constexpr double n_water = sphere_water_index, radius = sphere_radius;
  Scene s = gold_sphere_scene(cells_per_radius, averaging, z_offset, absorber, 420e-9, 750e-9);
  const materials::PoleSet gold = materials::find_material("Au")->poles;
  CrossSectionSpec cs;
  cs.name = "sphere";
  std::vector<double> lambdas;
  for (double l = 490e-9; l <= 580.1e-9; l += 2e-9) lambdas.push_back(l), cs.omegas.push_back(2 * pi * c0 / l);
  s.cross_sections.push_back(cs);
  Simulation sim(s);
  const RunResults r = sim.run();
  std::vector<double> mie;
  for (double l : lambdas)
    mie.push_back(
        materials::mie_sphere_cross_sections(radius, l, materials::permittivity(gold, 2 * pi * c0 / l), n_water).extinction);
  SpherePeak p;
  std::tie(p.fdtd_wavelength, p.fdtd_extinction) = parabolic_peak(lambdas, r.cross_sections.at(0).extinction);
  std::tie(p.mie_wavelength, p.mie_extinction) = parabolic_peak(lambdas, mie);
  p.steps = r.summary.steps;
  p.mixed_cells = sim.summary().mixed_cells;
  std::printf("R/cell %5.2f, absorber %d, averaging %-8s: peak %.2f nm (Mie %.2f nm), error %+.3f %%, extinction %.4f of Mie, "
              "%lld mixed locations, %ld steps\n",
              cells_per_radius, absorber, name(averaging), p.fdtd_wavelength * 1e9, p.mie_wavelength * 1e9,
              100 * p.wavelength_error(), p.extinction_ratio(), p.mixed_cells, p.steps);
  std::fflush(stdout);
  return p;
}

}  // namespace yeegap::solver::testing
