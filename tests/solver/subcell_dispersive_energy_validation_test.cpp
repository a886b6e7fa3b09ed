// Metal spheres with the whole averaged tensor in a closed periodic box: by Poynting's theorem the
// energy of passive media can only slosh and fall, so growth exposes an active update. Nearly lossless
// metal at 0.9 and 0.999 of the Courant limit (1e5 steps), on a graded mesh (6e4), and lossy
// critical-point gold (5e4), whose energy must fall. What a trial did: docs/measurements.md.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "materials/library.h"
#include "metal_sphere_box.h"
#include "solver/engine/simulation.h"
#include "solver/media/subcell_average.h"

namespace yeegap::solver {
namespace {

using testing::kick;
using testing::metal_sphere_box;

// A closed periodic box: the energy a dipole pulse leaves can only slosh around and fall; an update
// that is not passive would grow it exponentially (the coupling of a trial did, 1e14-fold between
// steps 5e4 and 1e5 with this nearly lossless Drude metal). Largest energy of the last 1e4 steps over
// the largest of the first fifth of the run (the pulse and what it leaves).
double energy_growth(const materials::PoleSet& metal, double courant, std::size_t* drawn_in, bool graded = false,
                     int steps = 100000) {
  Scene s = metal_sphere_box(12, metal, 3.6);
  if (graded) s.domain.refine.push_back({{{-1, -1, -1}, {1, 1, 0.4e-9}}, {0.5e-9, 0.5e-9, 0.5e-9}});
  s.domain.stability_fraction = courant;
  s.dipoles.push_back(kick({4.5e-9, 0.5e-9, 0}));
  Simulation sim(s);
  *drawn_in = 0;
  std::size_t triples = 0;
  for (const SubcellDispersiveCrossTerms& t : sim.subcell_average()->dispersive_cross_terms())
    *drawn_in += t.drawn_in(), triples += t.triples();
  EXPECT_GT(triples, 500u);
  double early = 0, late = 0;
  for (int n = 0; n < steps; ++n) {
    sim.step();
    if (n < steps / 5 && n % 50 == 0) early = std::max(early, sim.field_energy());
    if (n >= steps - 10000 && n % 50 == 0) late = std::max(late, sim.field_energy());
  }
  std::printf("courant %.3f%s: %zu of %zu triples drawn in, late/early energy %.3e\n", courant, graded ? ", graded" : "",
              *drawn_in, triples, late / early);
  return late / early;
}

// Drude metal with a plasma frequency of silver's order and a damping 100 times below a real
// metal's (values of our own making).
materials::PoleSet nearly_lossless_drude() {
  materials::PoleSet drude;
  drude.eps_inf = 1.0;
  drude.drude.push_back({1.37e16, 1e12});
  return drude;
}

TEST(SubcellDispersiveCrossTerms, ANearlyLosslessMetalSphereKeepsItsEnergyBoundedOverALongRun) {
  std::size_t drawn = 0;
  const double growth = energy_growth(nearly_lossless_drude(), 0.9, &drawn);
  EXPECT_TRUE(std::isfinite(growth));
  EXPECT_LT(growth, 2.0);
}

TEST(SubcellDispersiveCrossTerms, AtTheCourantLimitTheCapDrawsFillsInAndTheEnergyStaysBounded) {
  // With eps_inf 1 at the Courant limit the series fills of some triples must be drawn in.
  std::size_t drawn = 0;
  const double growth = energy_growth(nearly_lossless_drude(), 0.999, &drawn);
  EXPECT_GT(drawn, 0u);
  EXPECT_TRUE(std::isfinite(growth));
  EXPECT_LT(growth, 2.0);
}

TEST(SubcellDispersiveCrossTerms, OnAGradedMeshTheEnergyStaysBounded) {
  // Half the sphere in finer cells: the triples' shares are unequal there.
  std::size_t drawn = 0;
  const double growth = energy_growth(nearly_lossless_drude(), 0.99, &drawn, true, 60000);
  EXPECT_TRUE(std::isfinite(growth));
  EXPECT_LT(growth, 2.0);
}

TEST(SubcellDispersiveCrossTerms, CriticalPointGoldLosesEnergy) {
  // Critical-point gold (an implicit E share in its update), Etchegoin et al., J. Chem. Phys. 125,
  // 164705 (2006): lossy, so the energy falls.
  std::size_t drawn = 0;
  EXPECT_LT(energy_growth(materials::find_material("Au_critical_points")->poles, 0.99, &drawn, false, 50000), 1.0);
}

}  // namespace
}  // namespace yeegap::solver
