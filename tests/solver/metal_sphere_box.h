// A metal sphere off-centre in a closed periodic box of water with 1 nm cells and averaging on, and a
// broadband dipole kick beside it: the scene of the averaging tests at metal surfaces
// (subcell_dispersive_*_test.cpp).
#pragma once

#include "base/constants.h"
#include "geometry/shapes.h"
#include "materials/pole_set.h"
#include "solver/scene.h"
#include "test_scenes.h"

namespace yeegap::solver::testing {

inline Scene metal_sphere_box(int n, const materials::PoleSet& metal, double radius_cells) {
  Scene s = vacuum_box({n, n, n}, 1e-9, all_edges(EdgeKind::periodic));
  s.domain.center = {0, 0, 0};
  s.domain.averaging = true;
  s.materials[0].name = "water";
  s.materials[0].poles.eps_inf = 1.333 * 1.333;
  MaterialSpec m;
  m.name = "metal";
  m.poles = metal;
  s.materials.push_back(m);
  s.bodies.push_back({geometry::make_sphere({0.23e-9, -0.31e-9, 0.17e-9}, radius_cells * 1e-9), 1, {}});
  return s;
}

inline DipoleSpec kick(Vec3 at) {
  using constants::c0;
  using constants::pi;
  DipoleSpec dip;
  dip.position = at;
  dip.direction = {0.6, 0.64, 0.48};
  dip.waveform.omega_min = 2 * pi * c0 / 900e-9;
  dip.waveform.omega_max = 2 * pi * c0 / 300e-9;
  return dip;
}

}  // namespace yeegap::solver::testing
