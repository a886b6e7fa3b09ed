// Storage of the polarization currents (solver/media/dispersive.h): only the E locations of dispersive
// materials hold state, so memory follows the metal volume, not the domain (DEVELOPERS.md).
#include <gtest/gtest.h>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/discrete_permittivity.h"
#include "materials/library.h"
#include "solver/media/material_map.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

Scene box_with_sphere(bool gold) {
  Scene s = testing::vacuum_box({24, 24, 24}, 2e-9, testing::all_edges(EdgeKind::periodic));
  MaterialSpec m;
  m.name = "sphere";
  if (gold) m.poles = materials::find_material("Au")->poles;  // Rakic 1998: 1 Drude + 5 Lorentz
  s.materials.push_back(m);
  s.bodies.push_back({geometry::make_sphere({0, 0, 0}, 8e-9), 1, {}});
  return s;
}

TEST(DispersiveCurrents, HoldsExactlyTheEOfDispersiveBodies) {
  const Scene s = box_with_sphere(true);
  Simulation sim(s);
  const auto cells = sim.dispersive().cells(1);
  long long expected = 0;
  for (int c = 0; c < 3; ++c)
    for (int k = 0; k < 24; ++k)
      for (int j = 0; j < 24; ++j)
        for (int i = 0; i < 24; ++i)
          expected += material_at(s, yee_position(sim.grid(), static_cast<Component>(c), i, j, k)) == 1;
  EXPECT_EQ(static_cast<long long>(cells.size()), expected);
  for (const DispersiveCell& cell : cells)
    EXPECT_EQ(material_at(s, yee_position(sim.grid(), cell.component, cell.i, cell.j, cell.k)), 1);
  EXPECT_TRUE(sim.dispersive().cells(0).empty()) << "vacuum holds no currents";
}

TEST(DispersiveCurrents, MemoryFollowsMetalVolume) {
  Simulation gold(box_with_sphere(true));
  Simulation plain(box_with_sphere(false));
  EXPECT_TRUE(plain.dispersive().empty());
  const std::size_t n = gold.dispersive().cells(1).size();
  // Per location: an 8-byte offset, J of the Drude pole, J and P of five Lorentz poles, and the sum
  // of the currents one step leaves for the next pass.
  const std::size_t per_cell = sizeof(std::ptrdiff_t) + 12 * sizeof(real);
  EXPECT_GE(gold.dispersive().memory_bytes(), n * per_cell);
  EXPECT_LE(gold.dispersive().memory_bytes(), n * per_cell + 1024);  // plus shared coefficients
  EXPECT_EQ(gold.summary().memory_bytes - plain.summary().memory_bytes, gold.dispersive().memory_bytes());
  EXPECT_LT(n, 24u * 24u * 24u / 4u) << "the sphere fills a small part of the box";
}

TEST(DispersiveCurrents, CriticalPointsAddTheirImplicitTermToTheEUpdate) {
  // discrete_permittivity.cpp: the critical point's current holds eps0 a1/(2 (1 + G dt)) E^{n+1},
  // so with x = sum a1 dt / (2 (1 + G dt)): cb = dt / (eps0 (eps_inf + x)), ca = eps_inf / (eps_inf + x).
  Scene s = testing::vacuum_box({1, 1, 8}, 1e-9, testing::all_edges(EdgeKind::periodic));
  s.materials[0].poles = materials::find_material("Au_critical_points")->poles;
  const double dt = 1e-18;
  double implicit = 0;
  for (const auto& cp : s.materials[0].poles.critical_points) {
    const auto a = materials::critical_point_ade(cp);
    implicit += 0.5 * a.a1 * dt / (1 + 0.5 * a.damping * dt);
  }
  ASSERT_GT(implicit, 0);
  const ECoefficients ec = e_coefficients(s, dt);
  const double eps_inf = s.materials[0].poles.eps_inf;
  EXPECT_NEAR(ec.cb[0], dt / (constants::eps0 * (eps_inf + implicit)), 1e-6 * ec.cb[0]);
  EXPECT_NEAR(ec.ca[0], eps_inf / (eps_inf + implicit), 1e-6);
}

}  // namespace
}  // namespace yeegap::solver
