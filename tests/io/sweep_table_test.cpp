// The sweep's figures and files: the spectrum peak (largest sample refined by a parabola), the
// figure names a run's results give, the /sweep record of a point file read back, and the merged
// table's columns (numbers with units, texts, NaN for a figure a point lacks) in HDF5 and CSV.
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <unistd.h>

#include <gtest/gtest.h>

#include "base/constants.h"
#include "io/h5.h"
#include "io/sweep/sweep_figures.h"
#include "io/sweep/sweep_table.h"
#include "solver/outputs/record.h"

namespace yeegap::io {
namespace {

namespace fs = std::filesystem;
using solver::Peak;
using solver::spectrum_peak;

TEST(SpectrumPeak, ParabolaThroughThreeSamplesFindsTheExactVertex) {
  // y = 5 - 2 (w - 3.3)^2 sampled unevenly and out of order: the parabola through the largest
  // sample and its neighbours is the function itself, so the vertex comes out exactly.
  const std::vector<double> w = {4.0, 1.0, 3.0, 2.0, 3.7};
  std::vector<double> y;
  for (double x : w) y.push_back(5 - 2 * (x - 3.3) * (x - 3.3));
  const Peak p = spectrum_peak(w, y);
  EXPECT_NEAR(p.omega, 3.3, 1e-12);
  EXPECT_NEAR(p.value, 5.0, 1e-12);
}

TEST(SpectrumPeak, PeakAtTheBandEdgeIsTheSampleItself) {
  const Peak p = spectrum_peak({1, 2, 3}, {3, 2, 1});
  EXPECT_EQ(p.omega, 1);
  EXPECT_EQ(p.value, 3);
  const Peak single = spectrum_peak({2}, {7});
  EXPECT_EQ(single.omega, 2);
}

TEST(SpectrumPeak, RefinedPeakStaysBetweenTheNeighbours) {
  // A Lorentzian is not a parabola: the refined peak must still lie within the bracketing samples
  // and not below the largest sample.
  std::vector<double> w, y;
  for (int k = 0; k < 11; ++k) {
    w.push_back(1.0 + 0.1 * k);
    y.push_back(1.0 / (1 + std::pow((w.back() - 1.437) / 0.05, 2)));
  }
  const Peak p = spectrum_peak(w, y);
  EXPECT_GT(p.omega, 1.4);
  EXPECT_LT(p.omega, 1.5);
  EXPECT_GE(p.value, *std::max_element(y.begin(), y.end()));
}

TEST(SweepFigures, EachOutputGivesItsNamedPeaksAndTheGapItsWidth) {
  solver::RunResults r;
  solver::CrossSectionResult c;
  c.name = "dimer";
  c.omegas = {2e15, 3e15, 4e15};
  c.extinction = {1e-15, 3e-15, 2e-15};
  c.scattering = {1e-15, 2e-15, 1e-15};
  c.absorption = {0.5e-15, 1e-15, 1e-15};
  c.incident_intensity = {1, 1, 1};  // a whole result, as a run makes it (records check their sizes)
  r.cross_sections.push_back(c);
  solver::DecayRateResult d;
  d.name = "purcell";
  d.omegas = {2e15, 3e15};
  d.total = {10, 40};
  d.box_power = {1, 4};
  d.alone_power = {0.1, 0.1};
  r.decay_rates.push_back(d);
  solver::TunnellingGap g;
  g.pair = {0, 1};
  g.smallest_width = 0.4e-9;
  r.tunnelling_gaps.push_back(g);
  solver::Scene scene;
  scene.bodies.resize(2);
  scene.bodies[0].name = "left";
  scene.bodies[1].name = "right";
  const std::vector<Figure> f = compute_figures(r, scene);
  std::vector<std::string> names;
  for (const Figure& x : f) names.push_back(x.name);
  for (const char* want : {"dimer.extinction_peak", "dimer.extinction_peak_wavelength_nm", "dimer.scattering_peak",
                           "dimer.absorption_peak_wavelength_nm", "purcell.total_peak", "purcell.total_peak_wavelength_nm",
                           "gap.left-right.smallest_width_nm"})
    EXPECT_NE(std::find(names.begin(), names.end(), want), names.end()) << want;
  const auto value = [&](const std::string& n) {
    return std::find_if(f.begin(), f.end(), [&](const Figure& x) { return x.name == n; })->value;
  };
  EXPECT_NEAR(value("gap.left-right.smallest_width_nm"), 0.4, 1e-12);
  EXPECT_EQ(value("purcell.total_peak"), 40);  // at the band edge: the sample
  // The largest total is at the band's high-frequency edge, 3e15 rad/s: 2 pi c / omega = 627.9 nm.
  EXPECT_NEAR(value("purcell.total_peak_wavelength_nm"), 2 * constants::pi * constants::c0 / 3e15 * 1e9, 1e-9);
  EXPECT_GE(value("dimer.extinction_peak"), 3e-15);
}

class SweepFiles : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() / fs::path("yeegap_sweep_table_" + std::to_string(::getpid()));
    fs::create_directories(dir_);
  }
  void TearDown() override { fs::remove_all(dir_); }
  std::string make_results(const std::string& name, const std::string& scene_text) const {
    const std::string path = (dir_ / name).string();
    h5::File f = h5::File::create(path);
    f.create_group("scene").write_string("text", scene_text);
    f.close();
    return path;
  }
  fs::path dir_;
};

const char* const scene_text = "scene: {version: 1, title: ${gap}}\nsweep:\n  gap: [0.3 nm, 1 nm]\n  model: [a, b]\n";

TEST_F(SweepFiles, PointRecordReadsBackAsWritten) {
  const SweepPlan plan = read_sweep_plan(std::string(scene_text) + "# ${model}\n", "s.yaml");
  const std::string path = make_results("point_0003.h5", "substituted text");
  write_point_record(path, plan, 3, {{"x.power_peak", "W s^2", "largest power", 2.5}}, {"stop.after=1 fs"});
  const auto r = read_point_record(path);
  ASSERT_TRUE(r.has_value());
  EXPECT_EQ(r->point, 3u);
  EXPECT_EQ(r->parameter_names, (std::vector<std::string>{"gap", "model"}));
  EXPECT_EQ(r->parameter_values, (std::vector<std::string>{"1 nm", "b"}));
  EXPECT_EQ(r->overrides, (std::vector<std::string>{"stop.after=1 fs"}));
  EXPECT_EQ(r->scene_text, "substituted text");
  ASSERT_EQ(r->figures.size(), 1u);
  EXPECT_EQ(r->figures[0].unit, "W s^2");
  EXPECT_EQ(r->figures[0].value, 2.5);
  // A plain results file (no /sweep) and a missing file are not finished points.
  EXPECT_FALSE(read_point_record(make_results("plain.h5", "x")).has_value());
  EXPECT_FALSE(read_point_record((dir_ / "none.h5").string()).has_value());
  EXPECT_EQ(point_file_name(3, 10), "point_0003.h5");
  EXPECT_EQ(point_file_name(3, 123456), "point_000003.h5");
}

TEST_F(SweepFiles, MergedTableHasParameterAndFigureColumns) {
  const SweepPlan plan = read_sweep_plan(std::string(scene_text) + "# ${model}\n", "s.yaml");
  std::vector<PointRecord> rows(2);
  rows[0].point = 1;  // 0.3 nm, b
  rows[0].parameter_values = {"0.3 nm", "b"};
  rows[0].figures = {{"x.power_peak", "W s^2", "largest power", 2.5}, {"only.here", "1", "d", 7}};
  rows[1].point = 2;  // 1 nm, a
  rows[1].parameter_values = {"1 nm", "a"};
  rows[1].figures = {{"x.power_peak", "W s^2", "largest power", 4.0}};
  const std::string h5 = (dir_ / "sweep.h5").string(), csv = (dir_ / "sweep.csv").string();
  write_sweep_table(h5, csv, plan, rows, {"point_0001.h5", "point_0002.h5"}, "s.yaml", scene_text);

  const h5::File f = h5::File::open(h5);
  EXPECT_EQ(f.open_dataset("points/index").read_vector<std::int64_t>(), (std::vector<std::int64_t>{1, 2}));
  EXPECT_EQ(f.open_dataset("points/file").read_strings(), (std::vector<std::string>{"point_0001.h5", "point_0002.h5"}));
  EXPECT_EQ(f.open_dataset("parameters/gap").read_vector<double>(), (std::vector<double>{0.3, 1.0}));
  EXPECT_EQ(f.open_dataset("parameters/model").read_strings(), (std::vector<std::string>{"b", "a"}));
  EXPECT_EQ(f.open_dataset("figures/x.power_peak").read_vector<double>(), (std::vector<double>{2.5, 4.0}));
  const auto only = f.open_dataset("figures/only.here").read_vector<double>();
  EXPECT_EQ(only[0], 7);
  EXPECT_TRUE(std::isnan(only[1]));
  EXPECT_EQ(f.open_dataset("scene/text").read_string(), scene_text);

  std::ifstream in(csv);
  std::stringstream all;
  all << in.rdbuf();
  EXPECT_EQ(all.str(),
            "point,gap [nm],model,x.power_peak [W s^2],only.here\n"
            "1,0.3,b,2.5,7\n"
            "2,1,a,4,\n");
  EXPECT_FALSE(fs::exists(h5 + ".partial"));
}

}  // namespace
}  // namespace yeegap::io
