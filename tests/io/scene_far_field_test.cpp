// The outputs around a dipole as read from a scene (io/scene/scene_outputs.cpp, docs/scene.md):
// far_field and decay_rate (defaults, angle units, grids and lists of directions, collection cones)
// and energy (its box), and the mistakes the reader refuses with the place and what was expected.
#include <cmath>
#include <string>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/constants.h"
#include "base/errors.h"
#include "io/scene/scene_reader.h"
#include "scene_refusal.h"

namespace {

using ::testing::HasSubstr;
using yeegap::io::read_scene_text;
using yeegap::constants::pi;

const std::string head = R"(scene: {version: 1}
domain: {size: 800 nm, step: 20 nm}
excitation:
  - dipole: {position: [0, 0, 0], direction: z, band: {from: 500 nm, to: 800 nm}}
stop: {energy_below: 1e-5}
outputs:
)";

std::string failure_of(const std::string& outputs) { return yeegap::io::testing::scene_refusal(head + outputs).what(); }

TEST(SceneFarField, ReadsAGridOfAnglesACollectionConeAndADecayRate) {
  const auto s = read_scene_text(head + R"(  - far_field:
      name: far
      frequencies: [600 nm, 700 nm]
      angles: {theta_count: 3, phi_count: 4}
      collection: {direction: -z, numerical_aperture: 0.8}
  - decay_rate: {name: rate, radiated: far, box_size: 100 nm}
)", "ok.yaml");
  ASSERT_EQ(s.far_fields.size(), 1u);
  const auto& f = s.far_fields[0];
  EXPECT_FALSE(f.box_given);
  EXPECT_EQ(f.theta_count, 3);
  EXPECT_EQ(f.phi_count, 4);
  ASSERT_EQ(f.theta.size(), 12u);
  EXPECT_DOUBLE_EQ(f.theta[4], pi / 2);   // second theta, phi fastest
  EXPECT_DOUBLE_EQ(f.phi[5], pi / 2);
  EXPECT_DOUBLE_EQ(f.theta[11], pi);
  EXPECT_DOUBLE_EQ(f.collection_axis.z, -1.0);
  EXPECT_DOUBLE_EQ(f.numerical_aperture, 0.8);
  ASSERT_EQ(s.decay_rates.size(), 1u);
  EXPECT_EQ(s.decay_rates[0].radiated, "far");
  EXPECT_EQ(s.decay_rates[0].dipole, 0);
  EXPECT_TRUE(s.decay_rates[0].omegas.empty());  // taken from 'far' by the solver
  EXPECT_NEAR(s.decay_rates[0].box_size, 100e-9, 1e-18);
}

TEST(SceneFarField, ReadsDirectionsInDegreesAndRadiansAndAGivenBox) {
  const auto s = read_scene_text(head + R"(  - far_field:
      name: far
      frequencies: 600 nm
      box: {from: [-200 nm, -200 nm, -200 nm], to: [200 nm, 200 nm, 200 nm]}
      directions: [[90 deg, 45 deg], [0.5 rad, 0 deg]]
)", "ok.yaml");
  const auto& f = s.far_fields[0];
  EXPECT_TRUE(f.box_given);
  EXPECT_NEAR(f.box.hi.x, 200e-9, 1e-18);
  EXPECT_EQ(f.theta_count, 0);
  ASSERT_EQ(f.theta.size(), 2u);
  EXPECT_DOUBLE_EQ(f.theta[0], pi / 2);
  EXPECT_DOUBLE_EQ(f.phi[0], pi / 4);
  EXPECT_DOUBLE_EQ(f.theta[1], 0.5);
}

TEST(SceneFarField, DefaultsToTenDegreeSteps) {
  const auto s = read_scene_text(head + "  - far_field: {name: far, frequencies: 600 nm}\n", "ok.yaml");
  EXPECT_EQ(s.far_fields[0].theta_count, 19);
  EXPECT_EQ(s.far_fields[0].phi_count, 36);
  EXPECT_EQ(s.far_fields[0].theta.size(), 19u * 36u);
}

TEST(SceneFarField, RefusesABareAngle) {
  EXPECT_THAT(failure_of("  - far_field: {name: far, frequencies: 600 nm, directions: [[90, 0 deg]]}\n"),
              HasSubstr("must be an angle like '30 deg' or '0.5 rad'"));
}

TEST(SceneFarField, RefusesBothAnglesAndDirections) {
  EXPECT_THAT(failure_of("  - far_field: {name: far, frequencies: 600 nm, angles: {theta_count: 3}, "
                         "directions: [[0 deg, 0 deg]]}\n"),
              HasSubstr("either 'angles' (a grid) or 'directions' (a list)"));
}

TEST(SceneFarField, RefusesANumericalApertureAboveTheBackgroundIndex) {
  EXPECT_THAT(failure_of("  - far_field: {name: far, frequencies: 600 nm, collection: {numerical_aperture: 1.2}}\n"),
              HasSubstr("cannot exceed the background's refractive index 1"));
}

TEST(SceneFarField, RefusesARadiatedOutputThatDoesNotExistOrIsAPlane) {
  EXPECT_THAT(failure_of("  - decay_rate: {name: rate, radiated: far}\n"),
              HasSubstr("'far' is not a far_field or flux output of this scene"));
  EXPECT_THAT(failure_of("  - flux: {name: top, plane: {axis: z, at: 100 nm}, frequencies: 600 nm}\n"
                         "  - decay_rate: {name: rate, radiated: top}\n"),
              HasSubstr("the flux 'top' is a plane"));
}

TEST(SceneFarField, DecayRateNeedsFrequenciesOrARadiatedOutput) {
  EXPECT_THAT(failure_of("  - decay_rate: {name: rate}\n"), HasSubstr("missing key 'frequencies'"));
}

TEST(SceneEnergy, ReadsItsBox) {
  const auto s = read_scene_text(head + "  - energy: {name: inner, box: {from: [-100 nm, -50 nm, 0], to: [100 nm, 50 nm, 60 nm]}}\n",
                                 "ok.yaml");
  ASSERT_EQ(s.energies.size(), 1u);
  EXPECT_EQ(s.energies[0].name, "inner");
  EXPECT_NEAR(s.energies[0].region.lo.y, -50e-9, 1e-18);
  EXPECT_NEAR(s.energies[0].region.hi.z, 60e-9, 1e-18);
}

TEST(SceneEnergy, RefusesAMissingBoxAFlatBoxAndAnUnknownKey) {
  EXPECT_THAT(failure_of("  - energy: {name: inner}\n"), HasSubstr("missing key 'box'"));
  EXPECT_THAT(failure_of("  - energy: {name: inner, box: {from: [0, 0, 0], to: [100 nm, 100 nm, 0]}}\n"),
              HasSubstr("positive extent"));
  EXPECT_THAT(failure_of("  - energy: {name: inner, plane: {axis: z, at: 0}, box: {from: [0, 0, 0], to: [1 nm, 1 nm, 1 nm]}}\n"),
              HasSubstr("unknown key 'plane'"));
}

}  // namespace
