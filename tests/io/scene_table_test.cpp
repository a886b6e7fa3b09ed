// `table: FILE.csv` in a material block: the n, k table beside the scene is fitted with poles on load,
// the fit's error is reported through the note sink, and mistakes in the table are reported at the
// table's own line and column, naming the scene key that read it.
#include <complex>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include <unistd.h>

#include <fmt/format.h>
#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/errors.h"
#include "base/units.h"
#include "io/scene/scene_reader.h"
#include "materials/pole_set.h"
#include "scene_refusal.h"

namespace {

namespace fs = std::filesystem;
using ::testing::HasSubstr;
using yeegap::SceneError;
using yeegap::materials::PoleSet;
namespace units = yeegap::units;

// A gold-like medium with invented numbers (eV), for a synthetic table the fit can represent exactly:
// eps_inf, one Drude pole and two Lorentz poles.
PoleSet gold_like() {
  PoleSet p;
  p.eps_inf = 2.0;
  p.drude.push_back({units::eV_to_omega(8.5), units::eV_to_omega(0.07)});
  p.lorentz.push_back({1.2, units::eV_to_omega(2.9), units::eV_to_omega(0.8)});
  p.lorentz.push_back({2.0, units::eV_to_omega(4.2), units::eV_to_omega(1.5)});
  return p;
}

// 400 to 1000 nm in 40 rows, n and k from the model.
std::string table_of(const PoleSet& p) {
  std::string s = "# synthetic table for a test\nwavelength_nm,n,k\n";
  for (int i = 0; i < 40; ++i) {
    const double nm = 400.0 + 600.0 * i / 39.0;
    const std::complex<double> nk = yeegap::materials::refractive_index(p, units::wavelength_to_omega(nm * units::nm));
    s += fmt::format("{:.10g},{:.10g},{:.10g}\n", nm, nk.real(), nk.imag());
  }
  return s;
}

std::string scene_with(const std::string& material_block) {
  return R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
materials:
  gold: )" + material_block + R"(
bodies:
  - {shape: sphere, material: gold, center: [0, 0, 0], radius: 40 nm}
excitation: {dipole: {position: [0, 0, 100 nm], direction: z, band: {from: 450 nm, to: 900 nm}}}
stop: {after: 100 fs}
)";
}

class SceneTable : public ::testing::Test {
 protected:
  void SetUp() override {
    const auto* info = ::testing::UnitTest::GetInstance()->current_test_info();
    dir_ = fs::temp_directory_path() / fmt::format("yeegap_scene_table_{}_{}", info->name(), ::getpid());
    fs::remove_all(dir_);
    fs::create_directories(dir_ / "data");
  }
  void TearDown() override { fs::remove_all(dir_); }

  void write(const std::string& name, const std::string& text) const { std::ofstream(dir_ / name) << text; }

  // Reads scene.yaml from the temporary folder (the process's working directory is elsewhere, so a
  // relative table path only resolves against the scene file's folder).
  yeegap::solver::Scene read(const std::string& material_block) {
    write("scene.yaml", scene_with(material_block));
    return yeegap::io::read_scene_file((dir_ / "scene.yaml").string(), {},
                                       [this](const std::string& m) { notes_.push_back(m); });
  }

  SceneError failure_of(const std::string& material_block) {
    return yeegap::io::testing::refusal_of([&] { read(material_block); }, material_block);
  }

  fs::path dir_;
  std::vector<std::string> notes_;
};

TEST_F(SceneTable, TableBesideTheSceneIsFittedOnLoadToWithinOnePercent) {
  const PoleSet truth = gold_like();
  write("data/gold.csv", table_of(truth));
  const auto scene = read("{table: data/gold.csv}");
  const PoleSet& got = scene.materials.at(0).poles;
  EXPECT_EQ(got.drude.size(), 1u);    // default counts: 1 Drude + 2 Lorentz
  EXPECT_EQ(got.lorentz.size(), 2u);
  // The brief's criterion: eps within 1 % across the table's band, on a grid finer than the table.
  double worst = 0;
  for (int i = 0; i <= 120; ++i) {
    const double omega = units::wavelength_to_omega((400.0 + 5.0 * i) * units::nm);
    const std::complex<double> want = yeegap::materials::permittivity(truth, omega);
    worst = std::max(worst, std::abs(yeegap::materials::permittivity(got, omega) - want) / std::abs(want));
  }
  std::printf("table fit on load: worst relative |delta eps| %.3g\n", worst);
  EXPECT_LT(worst, 0.01);
}

TEST_F(SceneTable, FitErrorIsReportedAtLoadTimeAtTheTableValue) {
  write("data/gold.csv", table_of(gold_like()));
  read("{table: data/gold.csv}");
  ASSERT_EQ(notes_.size(), 1u);
  const std::string& note = notes_[0];
  EXPECT_THAT(note, HasSubstr("scene.yaml:4:17: note: materials.gold: fitted 1 Drude + 2 Lorentz poles to "
                              "'data/gold.csv' (40 rows, 400 nm to 1000 nm): RMS |delta eps| "));
  EXPECT_THAT(note, HasSubstr("max relative "));
}

TEST_F(SceneTable, PoleCountsChooseTheFittedModel) {
  write("data/gold.csv", table_of(gold_like()));
  const auto scene = read("{table: data/gold.csv, poles: 1, drude: 2}");
  EXPECT_EQ(scene.materials.at(0).poles.drude.size(), 2u);
  EXPECT_EQ(scene.materials.at(0).poles.lorentz.size(), 1u);
  ASSERT_EQ(notes_.size(), 1u);
  EXPECT_THAT(notes_[0], HasSubstr("fitted 2 Drude + 1 Lorentz poles"));
}

TEST_F(SceneTable, MissingTableFileIsAnErrorAtTheTableValue) {
  const SceneError e = failure_of("{table: nope.csv}");
  EXPECT_THAT(std::string(e.what()), HasSubstr("materials.gold.table: cannot open the table file 'nope.csv' (looked "
                                               "for '"));
  EXPECT_THAT(std::string(e.what()), HasSubstr("nope.csv')"));
  EXPECT_EQ(e.where().line, 4);
  EXPECT_EQ(e.where().column, 17);
}

TEST_F(SceneTable, BadCellIsReportedAtTheTablesOwnLineAndColumn) {
  write("bad.csv", "# comment\nwavelength_nm,n,k\n400,1.5,0.1\n500,1.4,0.1\n\n600, abc ,0.1\n700,1.2,0.1\n");
  const SceneError e = failure_of("{table: bad.csv}");
  EXPECT_EQ(fs::path(e.where().file).filename(), "bad.csv");
  EXPECT_EQ(e.where().line, 6);    // the blank and comment lines count
  EXPECT_EQ(e.where().column, 6);  // the cell's first character after trimming
  EXPECT_THAT(std::string(e.what()), HasSubstr("'abc' is not a number (the table of materials.gold.table, "));
  EXPECT_THAT(std::string(e.what()), HasSubstr("scene.yaml:4:17)"));
}

TEST_F(SceneTable, WavelengthOutOfOrderNamesBothLines) {
  write("bad.csv", "wavelength_nm,n,k\n400,1.5,0.1\n500,1.4,0.1\n450,1.3,0.1\n");
  const SceneError e = failure_of("{table: bad.csv}");
  EXPECT_EQ(e.where().line, 4);
  EXPECT_THAT(std::string(e.what()), HasSubstr("wavelengths must be monotonic: 450 follows 500"));
  EXPECT_THAT(std::string(e.what()), HasSubstr(" on line 3, but the table started increasing"));
}

TEST_F(SceneTable, TooFewRowsForThePolesIsAnErrorNamingTheTable) {
  write("short.csv", "wavelength_nm,n,k\n400,1.5,0.1\n500,1.4,0.1\n600,1.3,0.1\n");
  const SceneError e = failure_of("{table: short.csv}");  // 8 parameters need at least 5 rows
  EXPECT_EQ(fs::path(e.where().file).filename(), "short.csv");
  EXPECT_THAT(std::string(e.what()), HasSubstr("the table has 3 rows"));
}

TEST_F(SceneTable, ExplicitPolesBesideATableAreRefused) {
  write("data/gold.csv", table_of(gold_like()));
  const SceneError e = failure_of("{table: data/gold.csv, poles: {eps_inf: 2}}");
  EXPECT_THAT(std::string(e.what()), HasSubstr("with 'table', 'poles' is the number of Lorentz poles to fit"));
}

TEST_F(SceneTable, OtherModelKeysBesideATableAreRefusedAtTheKey) {
  write("data/gold.csv", table_of(gold_like()));
  const SceneError e = failure_of("{table: data/gold.csv, index: 1.5}");
  EXPECT_THAT(std::string(e.what()), HasSubstr("a table material takes its whole model from the fit of the table, "
                                               "found 'index'"));
  EXPECT_EQ(e.where().line, 4);
  EXPECT_EQ(e.where().column, 32);
}

TEST_F(SceneTable, DrudeCountWithoutATableIsRefused) {
  const SceneError e = failure_of("{permittivity: 2, drude: 1}");
  EXPECT_THAT(std::string(e.what()), HasSubstr("'drude' beside the model keys is the number of Drude poles to fit "
                                               "to a 'table'"));
}

TEST_F(SceneTable, ATableNeedsAtLeastOnePole) {
  write("data/gold.csv", table_of(gold_like()));
  const SceneError e = failure_of("{table: data/gold.csv, poles: 0, drude: 0}");
  EXPECT_THAT(std::string(e.what()), HasSubstr("fitting a table needs at least one pole"));
}

}  // namespace
