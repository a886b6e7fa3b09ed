// Staircase voxelisation and E update coefficients (see material_map.h). With conductivity sigma,
// the semi-implicit average (E^{n+1}+E^n)/2 of the loss term gives (Taflove & Hagness 2005, eq. 3.31):
//   ca = (1 - sigma dt / 2 eps) / (1 + sigma dt / 2 eps),   cb = (dt / eps) / (1 + sigma dt / 2 eps).
#include "solver/media/material_map.h"

#include "base/constants.h"
#include "base/errors.h"
#include "solver/media/body_lookup.h"
#include "materials/discrete_permittivity.h"

namespace yeegap::solver {

namespace {

geometry::Aabb extent(const Grid& g) {
  return {{g.nodes[0].front(), g.nodes[1].front(), g.nodes[2].front()},
          {g.nodes[0].back(), g.nodes[1].back(), g.nodes[2].back()}};
}

}  // namespace

int material_at(const Scene& s, const Vec3& p) { return material_at_any(s, p); }

void fill_material_index(const Scene& s, const Grid& g, const BlockLayout& L, MaterialIndex& mi) {
  YG_CHECK(s.materials.size() < 255, "at most 254 materials fit the 8-bit material index");
  const auto wall = static_cast<std::uint8_t>(s.materials.size());
  std::vector<std::uint8_t> is_pec(s.materials.size() + 1, 0);
  for (std::size_t m = 0; m < s.materials.size(); ++m) is_pec[m] = s.materials[m].perfect_conductor;
  const BodyLookup bodies(s, extent(g));
  for (int c = 0; c < 3; ++c) {
    const auto comp = static_cast<Component>(c);
    auto& out = mi.e[c];
    out.assign(L.total, wall);  // halo locations never updated stay "wall"; harmless and safe
#pragma omp parallel for collapse(2) schedule(static)
    for (int k = 0; k < L.n[2]; ++k)
      for (int j = 0; j < L.n[1]; ++j)
        for (int i = 0; i < L.n[0]; ++i) {
          const std::array<int, 3> idx{i, j, k};
          bool on_wall = false;
          for (int a = 0; a < 3; ++a)
            // Tangential E on a bounded low face is held at zero, except on an even mirror plane.
            if (a != c && !g.periodic[a] && idx[a] == 0 && s.domain.edges[2 * a] != EdgeKind::mirror_even) on_wall = true;
          const int m = on_wall ? wall : bodies.material_at(yee_position(g, comp, i, j, k));
          out[L.at(i, j, k)] = is_pec[m] ? wall : static_cast<std::uint8_t>(m);
        }
  }
}

ECoefficients e_coefficients(const Scene& s, double dt) {
  ECoefficients ec;
  for (const MaterialSpec& m : s.materials) {
    // A critical point's current holds (eps0 a1 / (2 (1 + G dt))) E^{n+1} (dispersive.cpp), so it
    // adds to the E^{n+1} side like eps0 eps_inf / dt: fold it into the effective permittivity.
    double implicit = 0;
    for (const materials::CriticalPoint& cp : m.poles.critical_points) {
      const materials::CriticalPointAde a = materials::critical_point_ade(cp);
      implicit += 0.5 * a.a1 * dt / (1.0 + 0.5 * a.damping * dt);
    }
    const double eps = constants::eps0 * (m.poles.eps_inf + implicit);
    const double loss = m.poles.conductivity * dt / (2.0 * eps);
    const double eps_inf_part = m.poles.eps_inf / (m.poles.eps_inf + implicit);  // 1 without critical points
    ec.ca.push_back(m.perfect_conductor ? 0 : static_cast<real>((eps_inf_part - loss) / (1.0 + loss)));
    ec.cb.push_back(m.perfect_conductor ? 0 : static_cast<real>((dt / eps) / (1.0 + loss)));
  }
  ec.ca.push_back(0);
  ec.cb.push_back(0);
  return ec;
}

std::vector<std::uint8_t> cell_material_map(const Scene& s, const Grid& g) {
  std::vector<std::uint8_t> map(static_cast<std::size_t>(g.cell_count()));
  const BodyLookup bodies(s, extent(g));
  for (int k = 0; k < g.n[2]; ++k)
    for (int j = 0; j < g.n[1]; ++j)
      for (int i = 0; i < g.n[0]; ++i) {
        const Vec3 p{g.position(0, i, true), g.position(1, j, true), g.position(2, k, true)};
        map[(static_cast<std::size_t>(k) * g.n[1] + j) * g.n[0] + i] = static_cast<std::uint8_t>(bodies.material_at(p));
      }
  return map;
}

}  // namespace yeegap::solver
