// A thick gold film in the Kretschmann geometry (glass / 70 nm Rakic Au / air, p), one broadband run
// at fixed k_par: the reflectance dip against the bare-interface plasmon (Raether, Surface Plasmons,
// Springer 1988, eq. 2.2) and against the transfer matrix of the stack (Born & Wolf 1999, sec. 1.6).
// Why those two differ by about 0.45 %: docs/measurements.md.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <cstdio>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/library.h"
#include "materials/transfer_matrix.h"
#include "film_stack_scene.h"
#include "solver/outputs/reflectance_dip.h"
#include "solver/runs/run_plan.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;
constexpr double deg = pi / 180;
constexpr double nm = 1e-9;
constexpr double n_glass = 1.515, film = 70 * nm;

double omega_of(double lambda) { return 2 * pi * c0 / lambda; }
materials::PoleSet gold() { return materials::find_material("Au")->poles; }

// Re k_spp of the gold/air interface at omega (Raether 1988, eq. 2.2).
double k_spp(double omega) {
  const std::complex<double> em = materials::permittivity(gold(), omega), ed = 1.0;
  return (omega / c0 * std::sqrt(em * ed / (em + ed))).real();
}

// Transfer-matrix R at fixed k_par: each frequency at its own angle in the glass.
double tmm_R(double omega, double k_par) {
  materials::Multilayer m;
  m.eps_incident = n_glass * n_glass;
  m.layers.push_back({materials::permittivity(gold(), omega), film});
  m.eps_exit = 1.0;
  const double theta = std::asin(c0 * k_par / (n_glass * omega));
  return materials::stack_response(m, omega, theta, materials::Polarization::p).R;
}

// Frequency of least TMM reflectance at fixed k_par, by golden section in [lo, hi].
double tmm_dip_omega(double k_par, double lo, double hi) {
  const double g = (std::sqrt(5.0) - 1) / 2;
  for (int it = 0; it < 100; ++it) {
    const double a = hi - g * (hi - lo), b = lo + g * (hi - lo);
    if (tmm_R(a, k_par) < tmm_R(b, k_par)) hi = b;
    else lo = a;
  }
  return 0.5 * (lo + hi);
}

// One lateral cell (a stack runs as 1D), 2 nm cells with subcell averaging, 200 nm of glass into
// the absorber, the film from z = 0, 2 um of air (the plasmon's field falls off in 330 nm there,
// physics.md 4.3, so the absorber sees 1e-5 of its intensity).
Scene film_scene(double k_par_angle, double reference, double lambda_lo, double lambda_hi, int count) {
  Scene s = testing::film_stack_domain(2 * nm, 200 * nm, 2000 * nm);
  MaterialSpec air_medium, glass_medium, au;
  air_medium.name = "air";
  glass_medium.name = "glass";
  glass_medium.poles.eps_inf = n_glass * n_glass;
  au.name = "gold";
  au.poles = gold();
  s.materials = {air_medium, glass_medium, au};
  s.bodies.push_back({geometry::make_slab(2, -1.0, 0.0), 1, {}, "prism"});
  s.bodies.push_back({geometry::make_slab(2, 0.0, film), 2, {}, "gold"});
  BlochWaveSpec w;
  w.p_polarized = true;
  w.angle = k_par_angle;
  w.reference_omega = omega_of(reference);
  w.waveform.omega_min = omega_of(lambda_hi);
  w.waveform.omega_max = omega_of(lambda_lo);
  for (int i = 0; i < count; ++i)  // evenly in frequency, increasing
    w.omegas.push_back(w.waveform.omega_min + (w.waveform.omega_max - w.waveform.omega_min) * i / (count - 1));
  s.bloch_waves = {w};
  s.stop.energy_below = 1e-6;
  return s;
}

TEST(ThickFilmSpp, DipLiesOnThePlasmonWavevectorAndAtTheTransferMatrixFrequency) {
  // k_par fixed by 43.6 deg in the glass at 633 nm; the band keeps clear of 604 nm, where the wave
  // runs along the air side (c k_par = omega) and would never leave the cell.
  const double angle = 43.6 * deg, reference = 633 * nm;
  const double k_par = n_glass * omega_of(reference) / c0 * std::sin(angle);
  const RunResults r = run_scene(film_scene(angle, reference, 618 * nm, 660 * nm, 43));
  const ReflectanceResult& t = r.reflectance.at(0);
  for (std::size_t q = 0; q < t.omegas.size(); ++q)
    std::printf("  %.2f nm  R %.5f  TMM %.5f\n", 2 * pi * c0 / t.omegas[q] / nm, t.reflectance[q], tmm_R(t.omegas[q], k_par));
  const ReflectanceDip dip = find_reflectance_dip(t.omegas, t.reflectance);
  ASSERT_TRUE(dip.ok()) << describe_dip_flags(dip.flags);
  const double omega_tmm = tmm_dip_omega(k_par, t.omegas.front(), t.omegas.back());
  const double on_spp = k_par / k_spp(dip.position) - 1;          // grid dip against the bare interface
  const double tmm_on_spp = k_par / k_spp(omega_tmm) - 1;         // the film's own (radiation) shift
  const double grid_vs_tmm = k_spp(dip.position) / k_spp(omega_tmm) - 1;
  std::printf("  dip %.3f nm (R %.4f), TMM %.3f nm; k_par / Re k_spp - 1: grid %.3e, TMM %.3e; grid vs TMM in "
              "Re k_spp %.3e\n", 2 * pi * c0 / dip.position / nm, dip.r_min, 2 * pi * c0 / omega_tmm / nm, on_spp,
              tmm_on_spp, grid_vs_tmm);
  // Raether 1988, eq. 2.2: the dip's in-plane wavevector on the bare-interface plasmon within 0.5 %
  // (measured: 4.08e-3 above it; the transfer matrix: 4.13e-3).
  EXPECT_LT(std::abs(on_spp), 5e-3);
  // The same stack through the transfer matrix, shift included: within 1e-3 in Re k_spp at the dip
  // (measured: 4.8e-5; dip 639.32 nm against 639.35 nm, at 2 nm cells with subcell averaging).
  EXPECT_LT(std::abs(grid_vs_tmm), 1e-3);
  // The comparison sees the shift: the transfer matrix's own dip is off the bare k_spp by more than
  // the grid is off the transfer matrix.
  EXPECT_GT(std::abs(tmm_on_spp), 1e-3);
}

}  // namespace
}  // namespace yeegap::solver
