// Round trip of the sensor group (io/results/sensor_writer.h, layout in docs/results_file.md): a sensor result made
// from two Lorentzian dips is written through write_results and read back with the plain HDF5 C API.
#include <gtest/gtest.h>
#include <hdf5.h>
#include <unistd.h>

#include <cmath>
#include <filesystem>
#include <string>
#include <vector>

#include "base/constants.h"
#include "io/results/results_writer.h"
#include "solver/outputs/reflectance_dip.h"

namespace fs = std::filesystem;
using namespace yeegap;

namespace {

double attribute(hid_t file, const char* name) {
  double v = std::nan("");
  const hid_t a = H5Aopen_by_name(file, "/outputs/chip", name, H5P_DEFAULT, H5P_DEFAULT);
  if (a >= 0) {
    H5Aread(a, H5T_NATIVE_DOUBLE, &v);
    H5Aclose(a);
  }
  return v;
}

std::vector<double> dataset(hid_t file, const char* path) {
  const hid_t d = H5Dopen2(file, path, H5P_DEFAULT);
  if (d < 0) return {};
  const hid_t space = H5Dget_space(d);
  std::vector<double> v(static_cast<std::size_t>(H5Sget_simple_extent_npoints(space)));
  H5Dread(d, H5T_NATIVE_DOUBLE, H5S_ALL, H5S_ALL, H5P_DEFAULT, v.data());
  H5Sclose(space);
  H5Dclose(d);
  return v;
}

TEST(SensorWriter, WritesBothCurvesAndTheFiguresInRadiansAndDegrees) {
  constexpr double deg = constants::pi / 180;
  solver::SensorResult s;
  s.name = "chip";
  s.medium = "water";
  s.delta_n = 1e-3;
  s.index = 1.3317;
  s.omega = 2 * constants::pi * constants::c0 / 632.8e-9;
  for (int k = 0; k <= 400; ++k) {
    const double t = (60 + 0.05 * k) * deg;
    s.angles.push_back(t);
    auto lorentz = [&](double centre) { return 0.98 - 0.95 / (1 + std::pow((t - centre) / (1.7 * deg), 2)); };
    s.reflectance.push_back(lorentz(71 * deg));
    s.reflectance_raised.push_back(lorentz(71.15 * deg));
  }
  s.dip = solver::find_reflectance_dip(s.angles, s.reflectance);
  s.dip_raised = solver::find_reflectance_dip(s.angles, s.reflectance_raised);
  s.figures = solver::sensor_figures(s.dip, s.dip_raised, s.delta_n);

  solver::RunResults r;
  r.sensors.push_back(s);
  const fs::path path = fs::temp_directory_path() / ("yeegap_sensor_" + std::to_string(::getpid()) + ".h5");
  io::write_results(path.string(), r, solver::Scene{}, io::WriteInfo{"test", "test", "now", 1});
  const hid_t f = H5Fopen(path.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT);
  ASSERT_GE(f, 0);
  EXPECT_NEAR(attribute(f, "resonance_angle_deg"), 71.0, 1e-6);
  EXPECT_NEAR(attribute(f, "resonance_angle"), 71.0 * deg, 1e-8);
  EXPECT_NEAR(attribute(f, "resonance_angle_deg_raised"), 71.15, 1e-6);
  EXPECT_NEAR(attribute(f, "sensitivity_deg_per_riu"), 150.0, 1e-3);
  EXPECT_NEAR(attribute(f, "r_min"), 0.03, 1e-9);
  EXPECT_NEAR(attribute(f, "width_deg"), s.dip.width / deg, 1e-12);
  EXPECT_NEAR(attribute(f, "figure_of_merit"), 150.0 / (s.dip.width / deg), 1e-3);
  EXPECT_NEAR(attribute(f, "wavelength_nm"), 632.8, 1e-9);
  EXPECT_DOUBLE_EQ(attribute(f, "delta_n"), 1e-3);
  const std::vector<double> a = dataset(f, "/outputs/chip/angle_deg"), rr = dataset(f, "/outputs/chip/reflectance_raised");
  ASSERT_EQ(a.size(), 401u);
  ASSERT_EQ(rr.size(), 401u);
  EXPECT_NEAR(a[3], 60.15, 1e-12);
  EXPECT_DOUBLE_EQ(rr[100], s.reflectance_raised[100]);
  H5Fclose(f);
  fs::remove(path);
}

}  // namespace
