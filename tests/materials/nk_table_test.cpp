// The n,k table reader: units from the header, and one clear error (file, line, column, column name)
// for each kind of mistake.
#include <gtest/gtest.h>

#include <cstdio>
#include <fstream>
#include <string>

#include "base/errors.h"
#include "base/units.h"
#include "materials/nk_table.h"

namespace yeegap::materials {
namespace {

// Parses `text` expecting a SceneError; returns it for inspection.
SceneError error_of(const std::string& text, size_t min_rows = 2) {
  try {
    parse_nk_table(text, "t.csv", min_rows);
  } catch (const SceneError& e) {
    return e;
  }
  ADD_FAILURE() << "expected a SceneError for:\n" << text;
  return SceneError(Where{}, "none");
}

bool mentions(const SceneError& e, const std::string& word) {
  return std::string(e.what()).find(word) != std::string::npos;
}

TEST(NkTable, ReadsNanometreAndMicrometreTablesIntoMetres) {
  const NkTable a = parse_nk_table("# comment\n\nwavelength_nm,n,k\n500,0.97,1.87\n600,0.25,2.98\n", "a.csv");
  ASSERT_EQ(a.size(), 2u);
  EXPECT_DOUBLE_EQ(a.wavelength[0], 500 * units::nm);
  EXPECT_DOUBLE_EQ(a.k[1], 2.98);
  EXPECT_EQ(a.line[0], 4);
  // Columns in another order, micrometres, Windows line ends, spaces around cells, falling wavelengths.
  const NkTable b = parse_nk_table("k, n, wavelength_um\r\n 2.98 , 0.25 , 0.6\r\n1.87,0.97,0.5\r\n", "b.csv");
  ASSERT_EQ(b.size(), 2u);
  EXPECT_DOUBLE_EQ(b.wavelength[0], 0.6 * units::um);
  EXPECT_DOUBLE_EQ(b.n[1], 0.97);
  // eps = (n + i k)^2
  EXPECT_NEAR(b.permittivity(1).real(), 0.97 * 0.97 - 1.87 * 1.87, 1e-12);
  EXPECT_NEAR(b.permittivity(1).imag(), 2 * 0.97 * 1.87, 1e-12);
}

TEST(NkTable, MissingColumnIsReportedOnTheHeaderLine) {
  const SceneError e = error_of("# header next\nwavelength_nm,n\n500,1.0\n");
  EXPECT_EQ(e.where().file, "t.csv");
  EXPECT_EQ(e.where().line, 2);
  EXPECT_TRUE(mentions(e, "missing column 'k'")) << e.what();
}

TEST(NkTable, WavelengthWithoutUnitIsReportedWithItsColumn) {
  const SceneError e = error_of("n,k,wavelength\n1,0,500\n");
  EXPECT_EQ(e.where().line, 1);
  EXPECT_EQ(e.where().column, 5);
  EXPECT_TRUE(mentions(e, "wavelength_nm")) << e.what();
}

TEST(NkTable, UnknownOrRepeatedColumnIsReported) {
  const SceneError unknown = error_of("wavelength_nm,n,kappa\n500,1,0\n");
  EXPECT_EQ(unknown.where().column, 17);
  EXPECT_EQ(unknown.where().key_path, "kappa");
  const SceneError twice = error_of("wavelength_nm,n,k,n\n500,1,0,1\n");
  EXPECT_TRUE(mentions(twice, "appears twice")) << twice.what();
}

TEST(NkTable, NonNumericCellIsReportedWithLineColumnAndColumnName) {
  const SceneError e = error_of("wavelength_nm,n,k\n500,0.97,1.87\n600,abc,2.98\n");
  EXPECT_EQ(e.where().line, 3);
  EXPECT_EQ(e.where().column, 5);
  EXPECT_EQ(e.where().key_path, "n");
  EXPECT_TRUE(mentions(e, "t.csv:3:5")) << e.what();
  EXPECT_TRUE(mentions(e, "'abc' is not a number")) << e.what();
  // A number followed by junk, and an empty cell, are not numbers either.
  EXPECT_EQ(error_of("wavelength_nm,n,k\n500,0.97,1.87x\n").where().key_path, "k");
  EXPECT_EQ(error_of("wavelength_nm,n,k\n500,,1.87\n").where().key_path, "n");
}

TEST(NkTable, NonMonotonicWavelengthsAreReportedAtTheOffendingRow) {
  const SceneError back = error_of("wavelength_nm,n,k\n500,1,1\n600,1,1\n550,1,1\n");
  EXPECT_EQ(back.where().line, 4);
  EXPECT_EQ(back.where().key_path, "wavelength_nm");
  EXPECT_TRUE(mentions(back, "monotonic")) << back.what();
  const SceneError repeat = error_of("wavelength_nm,n,k\n500,1,1\n500,1,2\n");
  EXPECT_EQ(repeat.where().line, 3);
  EXPECT_TRUE(mentions(repeat, "repeats line 2")) << repeat.what();
}

TEST(NkTable, NegativeKIsReportedAsGain) {
  const SceneError e = error_of("wavelength_nm,n,k\n500,1,0.1\n600,1,-0.2\n");
  EXPECT_EQ(e.where().line, 3);
  EXPECT_EQ(e.where().key_path, "k");
  EXPECT_TRUE(mentions(e, "gain")) << e.what();
}

TEST(NkTable, NonPositiveWavelengthIsReported) {
  const SceneError e = error_of("wavelength_nm,n,k\n0,1,0.1\n600,1,0.2\n");
  EXPECT_EQ(e.where().line, 2);
  EXPECT_TRUE(mentions(e, "positive")) << e.what();
}

TEST(NkTable, RowWithWrongCellCountIsReported) {
  const SceneError e = error_of("wavelength_nm,n,k\n500,1,0.1\n600,1\n");
  EXPECT_EQ(e.where().line, 3);
  EXPECT_TRUE(mentions(e, "2 cells")) << e.what();
}

TEST(NkTable, TooFewRowsIsReported) {
  const SceneError e = error_of("wavelength_nm,n,k\n500,1,0.1\n600,1,0.2\n", /*min_rows=*/3);
  EXPECT_EQ(e.where().line, 3);
  EXPECT_TRUE(mentions(e, "2 data rows; at least 3")) << e.what();
  EXPECT_TRUE(mentions(error_of("# only a comment\n"), "no header")) << "empty table";
}

TEST(NkTable, ReadsAFileAndReportsAMissingOne) {
  const std::string path = testing::TempDir() + "yeegap_nk_table_test.csv";
  {
    std::ofstream out(path);
    out << "wavelength_um,n,k\n0.5,0.97,1.87\n0.6,0.25,2.98\n0.7,0.16,3.95\n";
  }
  const NkTable t = read_nk_table(path);
  EXPECT_EQ(t.size(), 3u);
  EXPECT_EQ(t.file, path);
  std::remove(path.c_str());
  try {
    read_nk_table(path);
    FAIL() << "expected a SceneError";
  } catch (const SceneError& e) {
    EXPECT_EQ(e.where().file, path);
    EXPECT_TRUE(mentions(e, "cannot open")) << e.what();
  }
}

}  // namespace
}  // namespace yeegap::materials
