// The sensor output's second scan (solver/runs/sensor_scan.h): the raised index is exactly n + delta_n at
// the scan frequency for a lossless pole model and for an absorbing one, nothing else changes, and
// with a transfer-matrix stand-in for the angle-scan engine (Born & Wolf's characteristic matrix)
// the pair gives the Kretschmann sensitivity found in spr_sensor_validation_test.cpp.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>

#include "base/constants.h"
#include "base/errors.h"
#include "materials/library.h"
#include "solver/runs/sensor_scan.h"
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

// The chip with a 5 nm layer of index 1.45 on the gold (material 3, body 2), and a stand-in engine
// that reads the layer's material from the body, as the real one does through the material map.
Scene chip_with_layer() {
  Scene s = chip();
  s.materials.push_back(index_material("layer", 1.45));
  s.bodies.resize(3);
  s.bodies[0].material = 0;
  s.bodies[1].material = 1;
  s.bodies[2].material = 3;
  s.domain.background = 2;
  return s;
}

AngleScanCurve tmm_layer_scan(const Scene& s) {
  auto eps = [&](int m) { return materials::permittivity(s.materials[static_cast<std::size_t>(m)].poles, omega); };
  const materials::Multilayer m{eps(0), {{eps(1), 50e-9}, {eps(s.bodies[2].material), 5e-9}}, eps(2)};
  AngleScanCurve c{omega, {}, {}};
  for (int k = 0; k <= 460; ++k) {
    c.angles.push_back((62 + 0.05 * k) * deg);
    c.reflectance.push_back(testing::tmm_reflectance(m, wavelength, 62 + 0.05 * k));
  }
  return c;
}

TEST(SensorScan, BindingScanTakesTheLayerAwayAndGivesTheTransferMatrixShift) {
  // Reference: exact minima of the transfer-matrix curves with the 5 nm layer of 1.45 and with water
  // in its place (Born & Wolf's characteristic matrix); the dip finder is within 1e-3 deg of each.
  const Scene s = chip_with_layer();
  const Scene before = before_binding(s, 3, 2);
  EXPECT_EQ(before.bodies[2].material, 2);
  EXPECT_EQ(before.bodies[1].material, 1);
  const double n = materials::refractive_index(s.materials[2].poles, omega).real();
  auto stack = [&](double n_layer) {
    return materials::Multilayer{1.5151 * 1.5151,
                                 {{materials::permittivity(s.materials[1].poles, omega), 50e-9}, {n_layer * n_layer, 5e-9}},
                                 n * n};
  };
  const double with_layer = testing::tmm_minimum_deg(stack(1.45), wavelength, 65, 82);
  const double without = testing::tmm_minimum_deg(stack(n), wavelength, 65, 82);
  SensorSpec spec{"chip", 2, 1e-3, {}};
  spec.binding = 3;
  const SensorResult r = run_sensor(s, spec, tmm_layer_scan(s), tmm_layer_scan);
  EXPECT_EQ(r.binding, "layer");
  EXPECT_EQ(r.figures.flags, 0u) << describe_dip_flags(r.figures.flags);
  EXPECT_NEAR(r.dip.position / deg, with_layer, 1e-3);
  EXPECT_NEAR(r.dip_before_binding.position / deg, without, 1e-3);
  EXPECT_NEAR(r.binding_shift / deg, with_layer - without, 2e-3);
  EXPECT_GT(r.binding_shift / deg, 0.3);  // a denser layer moves the dip up (Raether 1988)
  EXPECT_NEAR(r.binding_equivalent_index, r.binding_shift / r.figures.sensitivity, 1e-15);
  ASSERT_EQ(r.reflectance_before_binding.size(), r.angles.size());
  // Without a binding material nothing of it is filled in.
  const SensorResult plain = run_sensor(s, SensorSpec{"chip", 2, 1e-3, {}}, tmm_layer_scan(s), tmm_layer_scan);
  EXPECT_TRUE(plain.binding.empty());
  EXPECT_TRUE(plain.reflectance_before_binding.empty());
}

TEST(SensorScan, RefusesABindingMaterialThatFillsTheBackground) {
  Scene s = chip_with_layer();
  s.domain.background = 3;
  EXPECT_THROW(before_binding(s, 3, 2), RunError);
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
