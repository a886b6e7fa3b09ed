// R and T of a 30 nm gold film at normal incidence, 450-900 nm, within 0.005 of the transfer matrix of
// the same continuous model (Born & Wolf 1999, sec. 1.6); 0.5 nm cells put its faces midway between E
// nodes, so the thickness is exact. A, measured on its own from the field inside the film (discrete
// Poynting theorem), makes R + T + A = 1 within 1e-3 a real check.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/discrete_permittivity.h"
#include "materials/library.h"
#include "materials/transfer_matrix.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"
#include "measured_table.h"

namespace yeegap::solver {
namespace {

using constants::c0;
using constants::pi;

constexpr double dz = 0.5e-9;
// Film interfaces at 0.25 and 30.25 nm: midway between the E nodes at multiples of 0.5 nm.
constexpr double film_lo = 0.25e-9, film_hi = 30.25e-9;
constexpr double z_source = -100e-9, z_front = -50e-9, z_back = 80e-9;

struct FilmRun {
  std::vector<double> omegas, front, back;  // flux through the two planes
  std::vector<double> absorbed;              // power absorbed in the film (empty run: zeros)
  double dt = 0;
};

FilmRun run(const materials::PoleSet* gold) {
  // 600 cells from -150 to 150 nm; 40-cell absorbers at both ends (a generous layer: in 1D it is cheap).
  Scene s = testing::vacuum_box({1, 1, 600}, dz,
                                {EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic,
                                 EdgeKind::cpml, EdgeKind::cpml});
  s.domain.cpml.cells = 40;
  FrequencyList omegas;
  for (double lambda = 450e-9; lambda <= 900.1e-9; lambda += 25e-9) omegas.push_back(2 * pi * c0 / lambda);
  if (gold) {
    MaterialSpec m;
    m.name = "gold";
    m.poles = *gold;
    s.materials.push_back(m);
    s.bodies.push_back({geometry::make_slab(2, film_lo, film_hi), 1, {}});
  }
  DipoleSpec sheet;
  sheet.position = {0, 0, z_source};
  sheet.direction = {1, 0, 0};
  sheet.waveform.omega_min = 2 * pi * c0 / 900e-9;
  sheet.waveform.omega_max = 2 * pi * c0 / 450e-9;
  s.dipoles.push_back(sheet);
  s.fluxes.push_back({"front", {{0, 0, z_front}, {0, 0, z_front}}, omegas, {}});
  s.fluxes.push_back({"back", {{0, 0, z_back}, {0, 0, z_back}}, omegas, {}});
  s.field_maps.push_back({"film", {{0, 0, 0}, {0, 0, 30.5e-9}}, omegas, {Component::Ex}, {}});
  s.stop.energy_below = 1e-9;
  Simulation sim(s);
  const RunResults r = sim.run();
  EXPECT_EQ(r.summary.stop_reason, "energy_below");
  FilmRun out;
  out.omegas = omegas;
  out.front = r.fluxes[0].power;
  out.back = r.fluxes[1].power;
  out.dt = sim.dt();
  const FieldMapResult& map = r.field_maps[0];
  for (std::size_t q = 0; q < omegas.size(); ++q) {
    double p = 0;
    if (gold) {
      const double w = omegas[q];
      const double loss = 0.5 * materials::yee_omega(w, out.dt) * constants::eps0 *
                          materials::discrete_permittivity(*gold, w, out.dt).imag();
      for (std::size_t k = 0; k < map.z.size(); ++k)
        if (map.z[k] > film_lo && map.z[k] < film_hi) p += loss * std::norm(map.values[q][0][k]) * dz;
    }
    out.absorbed.push_back(p);
  }
  return out;
}

void check_film(const char* library_name, const std::string& figure) {
  const materials::LibraryEntry* entry = materials::find_material(library_name);
  ASSERT_NE(entry, nullptr);
  const FilmRun empty = run(nullptr);
  const FilmRun film = run(&entry->poles);
  // The flux planes cover one 0.5 nm x 0.5 nm cell; the absorbed power is per unit area.
  const double area = dz * dz;
  double worst_r = 0, worst_t = 0, worst_sum = 0;
  for (std::size_t q = 0; q < film.omegas.size(); ++q) {
    const double w = film.omegas[q];
    const double R = 1 - film.front[q] / empty.front[q];
    const double T = film.back[q] / empty.back[q];
    const double A = film.absorbed[q] * area / empty.front[q];
    const materials::Multilayer stack{1.0, {{materials::permittivity(entry->poles, w), film_hi - film_lo}}, 1.0};
    const materials::StackResponse ref = materials::stack_response(stack, w, 0.0, materials::Polarization::s);
    std::printf("%s %3.0f nm: R = %.5f (matrix %.5f), T = %.5f (matrix %.5f), A = %.5f (matrix %.5f), R+T+A = %.6f\n",
                library_name, 2 * pi * c0 / w * 1e9, R, ref.R, T, ref.T, A, ref.A, R + T + A);
    EXPECT_NEAR(R, ref.R, 0.005) << 2 * pi * c0 / w;
    EXPECT_NEAR(T, ref.T, 0.005) << 2 * pi * c0 / w;
    EXPECT_NEAR(R + T + A, 1.0, 1e-3) << 2 * pi * c0 / w;
    worst_r = std::max(worst_r, std::abs(R - ref.R));
    worst_t = std::max(worst_t, std::abs(T - ref.T));
    worst_sum = std::max(worst_sum, std::abs(R + T + A - 1));
  }
  std::printf("%s: worst |R - R_matrix| = %.2e, |T - T_matrix| = %.2e, |R + T + A - 1| = %.2e\n", library_name,
              worst_r, worst_t, worst_sum);
  test_support::check_figure_against_page(
      "README.md", figure,
      "R within " + test_support::scientific(worst_r, 1) + ", T within " + test_support::scientific(worst_t, 1) +
          "; R+T+A = 1 within " + test_support::scientific(worst_sum, 1));
}

TEST(MetalFilm, RakicGoldFilmMatchesTransferMatrixFrom450To900nm) {
  check_film("Au", "metal_film_rakic");  // Rakic et al., Appl. Opt. 37, 5271 (1998)
}

TEST(MetalFilm, CriticalPointGoldFilmMatchesTransferMatrixFrom450To900nm) {
  // Etchegoin, Le Ru, Meyer, J. Chem. Phys. 125, 164705 (2006).
  check_film("Au_critical_points", "metal_film_critical_points");
}

}  // namespace
}  // namespace yeegap::solver
