// Numbers with units: splitting "40 nm", the kind each unit belongs to, and conversion to SI. The
// spectral cross-check ties a wavelength to a photon energy through E = h c / lambda, a different
// route (h, c, e) from the reader's (omega = 2 pi c / lambda, omega = E / hbar).
#include <cmath>

#include <gtest/gtest.h>

#include "base/constants.h"
#include "base/units.h"
#include "io/written_units.h"

namespace {

using namespace yeegap::io;
namespace constants = yeegap::constants;

TEST(Units, SplitsNumberAndUnitWithOrWithoutSpace) {
  auto q = split_number_unit("40 nm");
  ASSERT_TRUE(q);
  EXPECT_EQ(q->value, 40.0);
  EXPECT_EQ(q->unit, "nm");
  q = split_number_unit("-2.5e-3um");
  ASSERT_TRUE(q);
  EXPECT_EQ(q->value, -2.5e-3);
  EXPECT_EQ(q->unit, "um");
  q = split_number_unit("+7");
  ASSERT_TRUE(q);
  EXPECT_EQ(q->value, 7.0);
  EXPECT_EQ(q->unit, "");
}

TEST(Units, NormalisesSpacesAndProductSignsInUnits) {
  EXPECT_EQ(split_number_unit("1e-30 C*m")->unit, "C m");
  EXPECT_EQ(split_number_unit("1e-30   C   m ")->unit, "C m");
  EXPECT_EQ(split_number_unit("2 e\xC2\xB7nm")->unit, "e nm");
}

TEST(Units, RefusesTextThatDoesNotStartWithAFiniteNumber) {
  EXPECT_FALSE(split_number_unit("nm"));
  EXPECT_FALSE(split_number_unit("abc"));
  EXPECT_FALSE(split_number_unit("inf nm"));
  EXPECT_FALSE(split_number_unit("4,5 nm"));
  EXPECT_FALSE(split_number_unit("4.5.1 nm"));
}

TEST(Units, ConvertsLinearKindsToSI) {
  EXPECT_DOUBLE_EQ(*to_si(Dimension::length, 40, "nm"), 40e-9);
  EXPECT_DOUBLE_EQ(*to_si(Dimension::length, 1.5, "um"), 1.5e-6);
  EXPECT_DOUBLE_EQ(*to_si(Dimension::time, 20, "fs"), 20e-15);
  EXPECT_DOUBLE_EQ(*to_si(Dimension::time, 0.2, "ps"), 0.2e-12);
  EXPECT_DOUBLE_EQ(*to_si(Dimension::conductivity, 1e4, "S/m"), 1e4);
  EXPECT_DOUBLE_EQ(*to_si(Dimension::dipole_moment, 1, "e nm"), constants::e_charge * 1e-9);
  EXPECT_FALSE(to_si(Dimension::length, 1, "fs"));
  EXPECT_FALSE(to_si(Dimension::length, 1, "parsec"));
  // A finite value whose frequency overflows gives nothing, not infinity (tests/fuzz/regressions/units).
  EXPECT_FALSE(spectral_to_omega(91e300, "eV"));
  EXPECT_FALSE(spectral_to_omega(1e300, "THz"));
  EXPECT_FALSE(spectral_to_omega(1e-308, "m"));
}

TEST(Units, KnowsWhichKindAUnitBelongsTo) {
  EXPECT_EQ(dimension_of_unit("fs"), Dimension::time);
  EXPECT_EQ(dimension_of_unit("eV"), Dimension::spectral);
  EXPECT_EQ(dimension_of_unit("nm"), Dimension::length);
  EXPECT_FALSE(dimension_of_unit("furlong"));
}

TEST(Units, WavelengthAndPhotonEnergyOfTheSameLightGiveTheSameOmega) {
  const double lambda_nm = 600;
  const double energy_eV = constants::h_planck * constants::c0 / (lambda_nm * 1e-9) / constants::e_charge;
  const double from_wavelength = *spectral_to_omega(lambda_nm, "nm");
  const double from_energy = *spectral_to_omega(energy_eV, "eV");
  // h = 2 pi hbar holds in CODATA 2018 to its 10 printed digits, hence 1e-9.
  EXPECT_NEAR(from_wavelength / from_energy, 1.0, 1e-9);
  EXPECT_DOUBLE_EQ(*spectral_to_omega(energy_eV * 1000, "meV"), from_energy);
  EXPECT_DOUBLE_EQ(*spectral_to_omega(0.6, "um"), from_wavelength);
  EXPECT_DOUBLE_EQ(*spectral_to_omega(500, "THz"), 2 * constants::pi * 500e12);
  EXPECT_DOUBLE_EQ(*spectral_to_omega(3e15, "rad/s"), 3e15);
  EXPECT_FALSE(spectral_to_omega(0, "nm"));   // a zero wavelength has no frequency
  EXPECT_FALSE(spectral_to_omega(1, "fs"));   // a time is not a spectral value
}

TEST(Units, ListsTheUnitsOfEachKindForMessages) {
  EXPECT_EQ(units_of(Dimension::length), (std::vector<std::string>{"nm", "um", "m"}));
  EXPECT_EQ(units_of(Dimension::spectral),
            (std::vector<std::string>{"nm", "um", "m", "eV", "meV", "THz", "GHz", "Hz", "rad/s"}));
  EXPECT_EQ(format_length(40e-9), "40 nm");
}

}  // namespace
