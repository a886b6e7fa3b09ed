// The sensor output's second scan (solver/sensor_scan.h): the raised index is exactly n + delta_n at
// the scan frequency for a lossless pole model and for an absorbing one, nothing else changes, and
// with a transfer-matrix stand-in for the angle-scan engine (Born & Wolf's characteristic matrix)
// the pair gives the Kretschmann sensitivity found in spr_sensor_validation_test.cpp.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>

#include "base/constants.h"
#include "base/errors.h"
#include "materials/library.h"
#include "solver/sensor_scan.h"
#include "tests/solver/tmm_angle_scan.h"

namespace yeegap::solver {
namespace {

constexpr double wavelength = 632.8e-9;
const double omega = 2 * constants::pi * constants::c0 / wavelength;
constexpr double deg = constants::pi / 180;

MaterialSpec index_material(const std::string& name, double n) {
  MaterialSpec m;
  m.name = name;
  m.poles.eps_inf = n * n;
  return m;
}

// Prism (BK7, 1.5151), gold (library Au_critical_points), water (library, Daimon & Masumura 2007).
Scene chip() {
  Scene s;
  s.materials.push_back(index_material("prism", 1.5151));
  MaterialSpec gold;
  gold.name = "gold";
  gold.poles = materials::find_material("Au_critical_points")->poles;
  s.materials.push_back(gold);
  MaterialSpec water;
  water.name = "water";
  water.poles = materials::find_material("water")->poles;
  s.materials.push_back(water);
  return s;
}

// Stand-in for the angle-scan engine: the prism / 50 nm gold / water stack from the scene's own
// materials, by the transfer matrix, 62 to 85 deg in 0.05 deg steps, listed from high to low angles
// (the figures must not depend on the order).
AngleScanCurve tmm_scan(const Scene& s) {
  const materials::Multilayer m{materials::permittivity(s.materials[0].poles, omega),
                                {{materials::permittivity(s.materials[1].poles, omega), 50e-9}},
                                materials::permittivity(s.materials[2].poles, omega)};
  AngleScanCurve c{omega, {}, {}};
  for (int k = 460; k >= 0; --k) {
    c.angles.push_back((62 + 0.05 * k) * deg);
    c.reflectance.push_back(testing::tmm_reflectance(m, wavelength, 62 + 0.05 * k));
  }
  return c;
}

TEST(SensorScan, RaisedIndexIsExactlyDeltaNHigherAtTheScanFrequency) {
  const Scene s = chip();
  for (int medium : {2, 1}) {  // lossless water, absorbing gold
    const Scene r = with_raised_index(s, medium, 1e-3, omega);
    const std::complex<double> n0 = materials::refractive_index(s.materials[medium].poles, omega);
    const std::complex<double> n1 = materials::refractive_index(r.materials[medium].poles, omega);
    EXPECT_NEAR(n1.real() - n0.real(), 1e-3, 1e-12) << medium;
    EXPECT_NEAR(n1.imag() - n0.imag(), 0.0, 1e-12) << medium;
    // Only the constant term and the conductivity changed: at another frequency the raise differs.
    EXPECT_EQ(r.materials[medium].poles.lorentz.size(), s.materials[medium].poles.lorentz.size());
    for (int other = 0; other < 3; ++other) {
      if (other == medium) continue;
      EXPECT_EQ(materials::permittivity(r.materials[other].poles, omega),
                materials::permittivity(s.materials[other].poles, omega));
    }
  }
}

TEST(SensorScan, PairOfScansGivesTheKretschmannSensitivity) {
  // Reference: the exact minima of the transfer-matrix curves (golden section) at the library water
  // index (1.33211 in vacuum at 632.8 nm, Daimon & Masumura 2007) and 1e-3 above it. The dip finder
  // on 0.05 deg scans is within 1e-3 deg and 0.3 % of them (as in spr_sensor_validation_test.cpp).
  const Scene s = chip();
  const double n = materials::refractive_index(s.materials[2].poles, omega).real();
  auto stack = [&](double n_water) {
    return materials::Multilayer{1.5151 * 1.5151,
                                 {{materials::permittivity(s.materials[1].poles, omega), 50e-9}},
                                 n_water * n_water};
  };
  const double exact0 = testing::tmm_minimum_deg(stack(n), wavelength, 65, 80);
  const double exact1 = testing::tmm_minimum_deg(stack(n + 1e-3), wavelength, 65, 80);
  const SensorSpec spec{"chip", 2, 1e-3, {}};
  const SensorResult r = run_sensor(s, spec, tmm_scan(s), tmm_scan);
  EXPECT_EQ(r.medium, "water");
  EXPECT_NEAR(r.index, n, 1e-12);
  EXPECT_EQ(r.figures.flags, 0u) << describe_dip_flags(r.figures.flags);
  EXPECT_NEAR(r.dip.position / deg, exact0, 1e-3);
  EXPECT_NEAR(r.dip_raised.position / deg, exact1, 1e-3);
  EXPECT_NEAR(r.figures.sensitivity / deg / ((exact1 - exact0) / 1e-3), 1.0, 3e-3);
  EXPECT_NEAR(r.figures.figure_of_merit, std::abs(r.figures.sensitivity) / r.dip.width, 1e-12);
  ASSERT_EQ(r.angles.size(), 461u);
  EXPECT_LT(r.angles.front(), r.angles.back());  // sorted
  EXPECT_NE(r.reflectance_raised[300], r.reflectance[300]);
}

TEST(SensorScan, RefusesAPerfectConductorAsSensingMedium) {
  Scene s = chip();
  s.materials[1].perfect_conductor = true;
  EXPECT_THROW(with_raised_index(s, 1, 1e-3, omega), RunError);
}

TEST(SensorScan, RefusesAnAngleScannedTwice) {
  const Scene s = chip();
  AngleScanCurve c = tmm_scan(s);
  c.angles[1] = c.angles[0];
  EXPECT_THROW(sensor_result(s, SensorSpec{"chip", 2, 1e-3, {}}, c, c), RunError);
}

}  // namespace
}  // namespace yeegap::solver
