// Round trip of io/results_writer: a small hand-made RunResults (a probe, a 2-frequency field map on
// 3 x 4 x 1 nodes, a closed flux box) is written and read back with the plain HDF5 C API, so the
// checks see the file as any other reader would. Also: failures never damage an older file.
#include "io/results/results_writer.h"

#include <gtest/gtest.h>
#include <hdf5.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cmath>
#include <complex>
#include <filesystem>
#include <fstream>
#include <numbers>
#include <string>
#include <vector>

#include "base/units.h"

namespace fs = std::filesystem;
using namespace yeegap;
using solver::Component;

namespace {

// ---- reading with the C API ----

struct Closer {
  hid_t id;
  herr_t (*close)(hid_t);
  ~Closer() {
    if (id >= 0) close(id);
  }
};

std::string read_string_attribute(hid_t file, const std::string& object, const std::string& name) {
  Closer a{H5Aopen_by_name(file, object.c_str(), name.c_str(), H5P_DEFAULT, H5P_DEFAULT), H5Aclose};
  if (a.id < 0) return "<missing attribute " + object + "@" + name + ">";
  Closer type{H5Aget_type(a.id), H5Tclose};
  if (H5Tget_class(type.id) != H5T_STRING || H5Tis_variable_str(type.id) > 0) return "<not a fixed string>";
  std::string buffer(H5Tget_size(type.id), '\0');
  H5Aread(a.id, type.id, buffer.data());
  return buffer.substr(0, buffer.find('\0'));
}

std::vector<std::string> read_string_list_attribute(hid_t file, const std::string& object, const std::string& name) {
  Closer a{H5Aopen_by_name(file, object.c_str(), name.c_str(), H5P_DEFAULT, H5P_DEFAULT), H5Aclose};
  if (a.id < 0) return {};
  Closer type{H5Aget_type(a.id), H5Tclose};
  Closer space{H5Aget_space(a.id), H5Sclose};
  const std::size_t width = H5Tget_size(type.id);
  const auto n = static_cast<std::size_t>(H5Sget_simple_extent_npoints(space.id));
  std::string buffer(width * n, '\0');
  H5Aread(a.id, type.id, buffer.data());
  std::vector<std::string> out;
  for (std::size_t i = 0; i < n; ++i) {
    const std::string s = buffer.substr(i * width, width);
    out.push_back(s.substr(0, s.find('\0')));
  }
  return out;
}

template <class T>
T read_scalar_attribute(hid_t file, const std::string& object, const std::string& name, hid_t memory_type) {
  T value{};
  Closer a{H5Aopen_by_name(file, object.c_str(), name.c_str(), H5P_DEFAULT, H5P_DEFAULT), H5Aclose};
  if (a.id >= 0) H5Aread(a.id, memory_type, &value);
  return value;
}
double read_double_attribute(hid_t file, const std::string& object, const std::string& name) {
  return read_scalar_attribute<double>(file, object, name, H5T_NATIVE_DOUBLE);
}
long long read_int_attribute(hid_t file, const std::string& object, const std::string& name) {
  return read_scalar_attribute<long long>(file, object, name, H5T_NATIVE_LLONG);
}

std::vector<hsize_t> dataset_shape(hid_t file, const std::string& path) {
  Closer d{H5Dopen2(file, path.c_str(), H5P_DEFAULT), H5Dclose};
  if (d.id < 0) return {999};
  Closer space{H5Dget_space(d.id), H5Sclose};
  std::vector<hsize_t> dims(static_cast<std::size_t>(H5Sget_simple_extent_ndims(space.id)));
  H5Sget_simple_extent_dims(space.id, dims.data(), nullptr);
  return dims;
}

template <class T>
std::vector<T> read_dataset(hid_t file, const std::string& path, hid_t memory_type) {
  Closer d{H5Dopen2(file, path.c_str(), H5P_DEFAULT), H5Dclose};
  if (d.id < 0) return {};
  Closer space{H5Dget_space(d.id), H5Sclose};
  std::vector<T> values(static_cast<std::size_t>(H5Sget_simple_extent_npoints(space.id)));
  H5Dread(d.id, memory_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, values.data());
  return values;
}
std::vector<double> read_doubles(hid_t file, const std::string& path) {
  return read_dataset<double>(file, path, H5T_NATIVE_DOUBLE);
}

/// The file opened read-only for the duration of a test body.
struct Opened {
  explicit Opened(const fs::path& p) : file{H5Fopen(p.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), H5Fclose} {}
  Closer file;
  hid_t id() const { return file.id; }
};

// ---- a small hand-made run (invented numbers, only their round trip matters) ----

constexpr double dt = 1e-17;  // s
const double omega_500nm = units::wavelength_to_omega(500e-9);
const double omega_600nm = units::wavelength_to_omega(600e-9);

std::complex<double> map_value(std::size_t f, std::size_t c, std::size_t i) {
  return {100.0 * double(f) + 10.0 * double(c) + double(i), -0.5 * double(i + 1) * double(f + 1)};
}

solver::RunResults make_results(long steps = 1234) {
  solver::RunResults r;
  r.summary = {.steps = steps, .time_step = dt, .simulated_time = double(steps) * dt, .wall_seconds = 2.5,
               .cell_updates_per_second = 1e8, .stop_reason = "energy_below", .final_energy_fraction = 1e-5,
               .sources_end_time = 0, .divergence = {}};
  r.grid_x = {0, 1e-9, 2e-9, 3e-9};          // 3 cells
  r.grid_y = {0, 1e-9, 2.5e-9, 4e-9, 5e-9};  // 4 cells, graded
  r.grid_z = {-1e-9, 1e-9};                  // 1 cell
  r.material_names = {"vacuum", "gold"};
  for (int i = 0; i < 12; ++i) r.material_map.push_back(static_cast<std::uint8_t>(i % 3 == 0 ? 1 : 0));
  r.source_omegas = {omega_500nm, omega_600nm};
  r.source_spectra = {{{1.0, 2.0}, {3.0, -4.0}}};

  solver::ProbeResult p;
  p.name = "probe_a";
  p.position = {1e-9, 2e-9, 0};
  p.components = {Component::Ex, Component::Hy};
  p.sampled_at = {{1.5e-9, 2e-9, 0}, {1.5e-9, 2e-9, 0.5e-9}};
  p.time = {0, dt, 2 * dt};
  p.values = {{1.0, 2.0, 3.0}, {0.1, 0.2, 0.3}};
  r.probes.push_back(p);

  solver::FieldMapResult m;
  m.name = "map_a";
  m.x = {0, 1e-9, 2e-9};
  m.y = {0, 1e-9, 2e-9, 3e-9};
  m.z = {0};
  m.omegas = {omega_500nm, omega_600nm};
  m.components = {Component::Ex, Component::Ez, Component::Hy};
  m.values.assign(2, std::vector<std::vector<std::complex<double>>>(3, std::vector<std::complex<double>>(12)));
  for (std::size_t f = 0; f < 2; ++f)
    for (std::size_t c = 0; c < 3; ++c)
      for (std::size_t i = 0; i < 12; ++i) m.values[f][c][i] = map_value(f, c, i);
  r.field_maps.push_back(m);

  solver::FluxResult x;
  x.name = "box_a";
  x.closed = true;
  x.omegas = {omega_500nm, omega_600nm};
  x.power = {1.5e-20, 2.5e-20};
  r.fluxes.push_back(x);

  solver::DiffractionOrdersResult o;  // two rows: three reflected orders in the first, one in the second
  o.name = "orders_a";
  o.axis = 2;
  o.period = {900e-9, 1e-9};
  o.diffracting = {true, false};
  o.incident_index = 1.0;
  o.transmitted_index = 1.5;
  o.omegas = {omega_500nm, omega_600nm};
  o.incidence_angles = {0.1, 0.12};
  o.reflected_sum = {0.3, 0.2};
  o.transmitted_sum = {0.7, 0.8};
  o.row = {0, 0, 0, 1};
  o.side = {-1, -1, -1, -1};
  o.order_b = {-1, 0, 1, 0};
  o.order_c = {0, 0, 0, 0};
  o.direction = {{-0.5, 0, -0.8660254}, {0.1, 0, -0.99498744}, {0.7, 0, -0.71414284}, {0.12, 0, -0.99277389}};
  o.angle = {0.5235988, 0.1001674, 0.7753975, 0.1202899};
  o.efficiency = {0.1, 0.15, 0.05, 0.2};
  r.orders.push_back(o);
  return r;
}

solver::Scene make_scene() {
  solver::Scene s;
  s.title = "round trip";
  s.file = "round_trip.yaml";
  s.text = "scene: {version: 1, title: round trip}\n# comment\n";
  solver::DipoleSpec d;
  d.position = {1e-9, 2e-9, 3e-9};
  s.dipoles.push_back(d);
  return s;
}

io::WriteInfo make_info() { return {"0.1.0", "yeegap run round_trip.yaml -o out.h5", "2024-05-01T14:03:22+02:00", 2}; }

class ResultsWriter : public ::testing::Test {
 protected:
  void SetUp() override {
    const auto* info = ::testing::UnitTest::GetInstance()->current_test_info();
    dir_ = fs::temp_directory_path() / ("yeegap_results_writer_" + std::to_string(::getpid()) + "_" + info->name());
    fs::remove_all(dir_);
    fs::create_directories(dir_);
  }
  void TearDown() override {
    std::error_code ec;
    fs::permissions(dir_, fs::perms::owner_all, ec);
    for (const auto& e : fs::recursive_directory_iterator(dir_, ec)) fs::permissions(e.path(), fs::perms::owner_all, ec);
    fs::remove_all(dir_, ec);
  }
  /// Writes the standard results and returns the file path.
  fs::path write_standard(long steps = 1234) {
    const fs::path path = dir_ / "run.h5";
    io::write_results(path.string(), make_results(steps), make_scene(), make_info());
    return path;
  }
  /// True if this process can create files in a directory whose write bits are cleared (root can).
  bool permissions_are_bypassed(const fs::path& read_only_dir) {
    const fs::path probe = read_only_dir / "probe";
    std::ofstream f(probe);
    const bool ok = f.good();
    f.close();
    fs::remove(probe);
    return ok;
  }
  fs::path dir_;
};

TEST_F(ResultsWriter, WritesFormatNameAndVersionAtTheRoot) {
  Opened f(write_standard());
  ASSERT_GE(f.id(), 0);
  EXPECT_EQ(read_string_attribute(f.id(), "/", "format"), "yeegap-results");
  EXPECT_EQ(read_int_attribute(f.id(), "/", "format_version"), 1);
}

TEST_F(ResultsWriter, SuccessLeavesNoPartialFile) {
  const fs::path path = write_standard();
  EXPECT_TRUE(fs::exists(path));
  EXPECT_FALSE(fs::exists(path.string() + ".partial"));
  EXPECT_EQ(std::distance(fs::directory_iterator(dir_), fs::directory_iterator()), 1);
}

TEST_F(ResultsWriter, SecondWriteReplacesTheFirst) {
  write_standard(/*steps=*/10);
  Opened f(write_standard(/*steps=*/20));
  EXPECT_EQ(read_int_attribute(f.id(), "/summary", "steps"), 20);
}

herr_t collect_datasets(hid_t, const char* name, const H5O_info_t* info, void* out) {
  if (info->type == H5O_TYPE_DATASET) static_cast<std::vector<std::string>*>(out)->push_back(std::string("/") + name);
  return 0;
}

TEST_F(ResultsWriter, EveryDatasetCarriesAUnitsAttribute) {
  Opened f(write_standard());
  std::vector<std::string> datasets;
  H5Ovisit2(f.id(), H5_INDEX_NAME, H5_ITER_NATIVE, collect_datasets, &datasets, H5O_INFO_BASIC);
  // scene 1, grid 3, materials 2, sources 10 (3 axes, spectrum and incident re/im, position, direction,
  // moment), probe 4, field map 6 axes + 3 x 2 parts + E_squared, flux 4, orders 3 axes + 10
  EXPECT_EQ(datasets.size(), 1u + 3 + 2 + 10 + 4 + 13 + 4 + 13);
  for (const auto& d : datasets) {
    EXPECT_GT(H5Aexists_by_name(f.id(), d.c_str(), "units", H5P_DEFAULT), 0) << d;
    EXPECT_FALSE(read_string_attribute(f.id(), d, "units").empty()) << d;
  }
}

TEST_F(ResultsWriter, StringAttributesAreFixedLengthAsciiNullPadded) {
  Opened f(write_standard());
  for (const auto& [object, name] : {std::pair{"/", "format"}, {"/outputs/map_a", "kind"}, {"/grid/x", "units"}}) {
    Closer a{H5Aopen_by_name(f.id(), object, name, H5P_DEFAULT, H5P_DEFAULT), H5Aclose};
    ASSERT_GE(a.id, 0) << object << "@" << name;
    Closer type{H5Aget_type(a.id), H5Tclose};
    EXPECT_EQ(H5Tget_class(type.id), H5T_STRING);
    EXPECT_EQ(H5Tis_variable_str(type.id), 0);
    EXPECT_EQ(H5Tget_cset(type.id), H5T_CSET_ASCII);
    EXPECT_EQ(H5Tget_strpad(type.id), H5T_STR_NULLPAD);
  }
}

TEST_F(ResultsWriter, GridAndMaterialMapRoundTripWithXFastest) {
  Opened f(write_standard());
  const auto r = make_results();
  EXPECT_EQ(read_doubles(f.id(), "/grid/y"), r.grid_y);
  EXPECT_EQ(read_string_attribute(f.id(), "/grid/y", "units"), "m");
  EXPECT_EQ(dataset_shape(f.id(), "/materials/map"), (std::vector<hsize_t>{1, 4, 3}));  // cells (nz, ny, nx)
  EXPECT_EQ(read_dataset<std::uint8_t>(f.id(), "/materials/map", H5T_NATIVE_UINT8), r.material_map);
  EXPECT_EQ(dataset_shape(f.id(), "/materials/names"), (std::vector<hsize_t>{2}));
}

TEST_F(ResultsWriter, FieldMapPartsHaveShapeFrequencyZYXAndMatchTheInput) {
  Opened f(write_standard());
  const std::string g = "/outputs/map_a";
  EXPECT_EQ(read_string_attribute(f.id(), g, "kind"), "field_map");
  EXPECT_EQ(read_string_list_attribute(f.id(), g, "components"), (std::vector<std::string>{"Ex", "Ez", "Hy"}));
  const std::vector<hsize_t> shape{2, 1, 4, 3};
  const char* names[] = {"Ex", "Ez", "Hy"};
  for (std::size_t c = 0; c < 3; ++c) {
    const std::string base = g + "/" + names[c];
    ASSERT_EQ(dataset_shape(f.id(), base + "_re"), shape) << base;
    ASSERT_EQ(dataset_shape(f.id(), base + "_im"), shape) << base;
    EXPECT_EQ(read_string_attribute(f.id(), base + "_re", "units"), c < 2 ? "V s/m" : "A s/m");
    const auto re = read_doubles(f.id(), base + "_re");
    const auto im = read_doubles(f.id(), base + "_im");
    for (std::size_t fr = 0; fr < 2; ++fr)
      for (std::size_t j = 0; j < 4; ++j)
        for (std::size_t i = 0; i < 3; ++i) {
          const std::size_t node = j * 3 + i;               // x fastest in the input
          const std::size_t stored = (fr * 4 + j) * 3 + i;  // [f][k=0][j][i]
          EXPECT_EQ(re[stored], map_value(fr, c, node).real());
          EXPECT_EQ(im[stored], map_value(fr, c, node).imag());
        }
  }
}

TEST_F(ResultsWriter, ESquaredSumsOnlyTheElectricComponents) {
  Opened f(write_standard());
  const std::string d = "/outputs/map_a/E_squared";
  ASSERT_EQ(dataset_shape(f.id(), d), (std::vector<hsize_t>{2, 1, 4, 3}));
  EXPECT_EQ(read_string_list_attribute(f.id(), d, "components"), (std::vector<std::string>{"Ex", "Ez"}));
  EXPECT_EQ(read_string_attribute(f.id(), d, "units"), "V^2 s^2/m^2");
  const auto e2 = read_doubles(f.id(), d);
  for (std::size_t fr = 0; fr < 2; ++fr)
    for (std::size_t i = 0; i < 12; ++i)  // components 0 (Ex) and 1 (Ez); Hy (2) must not count
      EXPECT_DOUBLE_EQ(e2[fr * 12 + i], std::norm(map_value(fr, 0, i)) + std::norm(map_value(fr, 1, i)));
}

// A run lit by one plane wave, with a map of all three E components: the map also carries
// |E|^2 / |E_inc|^2 (the near-field enhancement), frequency by frequency.
solver::RunResults lit_results() {
  solver::RunResults r = make_results();
  r.incident_spectra = {{{2.0, 0.0}, {0.0, -0.5}}};  // |E_inc|^2 = 4 at 500 nm, 0.25 at 600 nm
  solver::FieldMapResult& m = r.field_maps[0];
  m.components = {Component::Ex, Component::Ey, Component::Ez};
  return r;
}

TEST_F(ResultsWriter, EnhancementIsESquaredOverTheIncidentIntensityPerFrequency) {
  const fs::path path = dir_ / "lit.h5";
  io::write_results(path.string(), lit_results(), make_scene(), make_info());
  Opened f(path);
  const std::string d = "/outputs/map_a/E_enhancement";
  ASSERT_EQ(dataset_shape(f.id(), d), (std::vector<hsize_t>{2, 1, 4, 3}));
  EXPECT_EQ(read_string_attribute(f.id(), d, "units"), "1");
  const auto en = read_doubles(f.id(), d);
  const double incident[2] = {4.0, 0.25};
  for (std::size_t fr = 0; fr < 2; ++fr)
    for (std::size_t i = 0; i < 12; ++i) {
      double sum = 0;
      for (std::size_t c = 0; c < 3; ++c) sum += std::norm(map_value(fr, c, i));
      EXPECT_DOUBLE_EQ(en[fr * 12 + i], sum / incident[fr]);
    }
}

TEST_F(ResultsWriter, NoEnhancementWithoutAPlaneWaveOrWithoutAllThreeEComponents) {
  Opened plain(write_standard());  // no plane wave
  EXPECT_LE(H5Lexists(plain.id(), "/outputs/map_a/E_enhancement", H5P_DEFAULT), 0);
  solver::RunResults two_components = lit_results();
  two_components.field_maps[0].components = {Component::Ex, Component::Ez, Component::Hy};
  const fs::path path = dir_ / "partial_e.h5";
  io::write_results(path.string(), two_components, make_scene(), make_info());
  Opened f(path);
  EXPECT_GT(H5Lexists(f.id(), "/outputs/map_a/E_squared", H5P_DEFAULT), 0);
  EXPECT_LE(H5Lexists(f.id(), "/outputs/map_a/E_enhancement", H5P_DEFAULT), 0);
}

TEST_F(ResultsWriter, SpectraCarryWavelengthAndPhotonEnergy) {
  Opened f(write_standard());
  for (const std::string g : {"/outputs/map_a", "/outputs/box_a", "/sources"}) {
    const auto wavelength = read_doubles(f.id(), g + "/wavelength_nm");
    const auto energy = read_doubles(f.id(), g + "/photon_energy_eV");
    ASSERT_EQ(wavelength.size(), 2u) << g;
    ASSERT_EQ(energy.size(), 2u) << g;
    EXPECT_NEAR(wavelength[0], 500.0, 1e-9) << g;
    EXPECT_NEAR(wavelength[1], 600.0, 1e-9) << g;
    // h c / e = 1239.841984 eV nm (CODATA 2018; h, c and e exact since the 2019 SI), to 1e-9 relative.
    EXPECT_NEAR(energy[0], 1239.841984 / 500.0, 1e-9 * energy[0]) << g;
    EXPECT_EQ(read_string_attribute(f.id(), g + "/omega", "units"), "rad/s");
    EXPECT_EQ(read_string_attribute(f.id(), g + "/photon_energy_eV", "units"), "eV");
  }
}

TEST_F(ResultsWriter, ProbeSeriesKeepUnitsAndTheHalfStepLagOfH) {
  Opened f(write_standard());
  const std::string g = "/outputs/probe_a";
  EXPECT_EQ(read_string_attribute(f.id(), g, "kind"), "probe");
  EXPECT_EQ(read_doubles(f.id(), g + "/time"), (std::vector<double>{0, dt, 2 * dt}));
  EXPECT_EQ(read_doubles(f.id(), g + "/Ex"), (std::vector<double>{1.0, 2.0, 3.0}));
  EXPECT_EQ(read_doubles(f.id(), g + "/Hy"), (std::vector<double>{0.1, 0.2, 0.3}));
  EXPECT_EQ(read_string_attribute(f.id(), g + "/Ex", "units"), "V/m");
  EXPECT_EQ(read_string_attribute(f.id(), g + "/Hy", "units"), "A/m");
  EXPECT_EQ(read_double_attribute(f.id(), g + "/Ex", "sample_time_offset"), 0.0);
  EXPECT_EQ(read_double_attribute(f.id(), g + "/Hy", "sample_time_offset"), -0.5 * dt);
  EXPECT_EQ(dataset_shape(f.id(), g + "/sampled_at"), (std::vector<hsize_t>{2, 3}));
  EXPECT_EQ(read_doubles(f.id(), g + "/sampled_at")[5], 0.5e-9);
}

TEST_F(ResultsWriter, FluxStoresPowerPerFrequency) {
  Opened f(write_standard());
  const std::string g = "/outputs/box_a";
  EXPECT_EQ(read_string_attribute(f.id(), g, "kind"), "flux");
  EXPECT_EQ(read_int_attribute(f.id(), g, "closed"), 1);
  EXPECT_EQ(read_doubles(f.id(), g + "/power"), (std::vector<double>{1.5e-20, 2.5e-20}));
  EXPECT_EQ(read_string_attribute(f.id(), g + "/power", "units"), "W s^2");
}

TEST_F(ResultsWriter, StoresSceneTextProgramSummaryAndSources) {
  Opened f(write_standard());
  {
    Closer d{H5Dopen2(f.id(), "/scene/text", H5P_DEFAULT), H5Dclose};
    ASSERT_GE(d.id, 0);
    Closer type{H5Dget_type(d.id), H5Tclose};
    std::string text(H5Tget_size(type.id), '\0');
    H5Dread(d.id, type.id, H5S_ALL, H5S_ALL, H5P_DEFAULT, text.data());
    EXPECT_EQ(text, make_scene().text);
  }
  EXPECT_EQ(read_string_attribute(f.id(), "/scene", "file"), "round_trip.yaml");
  EXPECT_EQ(read_string_attribute(f.id(), "/program", "command_line"), make_info().command_line);
  EXPECT_EQ(read_string_attribute(f.id(), "/program", "start_time"), "2024-05-01T14:03:22+02:00");
  EXPECT_EQ(read_int_attribute(f.id(), "/program", "threads"), 2);
  EXPECT_EQ(read_int_attribute(f.id(), "/summary", "steps"), 1234);
  EXPECT_EQ(read_double_attribute(f.id(), "/summary", "time_step"), dt);
  EXPECT_EQ(read_string_attribute(f.id(), "/summary", "stop_reason"), "energy_below");
  EXPECT_EQ(read_doubles(f.id(), "/sources/spectrum_re"), (std::vector<double>{1.0, 3.0}));
  EXPECT_EQ(read_doubles(f.id(), "/sources/spectrum_im"), (std::vector<double>{2.0, -4.0}));
  EXPECT_EQ(dataset_shape(f.id(), "/sources/spectrum_re"), (std::vector<hsize_t>{1, 2}));
  EXPECT_EQ(read_doubles(f.id(), "/sources/position"), (std::vector<double>{1e-9, 2e-9, 3e-9}));
}

TEST_F(ResultsWriter, BlockedPartialNameThrowsNamingThePathAndKeepsTheOldFile) {
  const fs::path path = write_standard(/*steps=*/10);
  fs::create_directory(path.string() + ".partial");  // the temporary name cannot be created as a file
  try {
    io::write_results(path.string(), make_results(20), make_scene(), make_info());
    FAIL() << "expected a failure";
  } catch (const std::runtime_error& e) {
    EXPECT_NE(std::string(e.what()).find(path.string()), std::string::npos) << e.what();
  }
  EXPECT_TRUE(fs::is_directory(path.string() + ".partial"));  // not ours, so not removed
  Opened f(path);
  EXPECT_EQ(read_int_attribute(f.id(), "/summary", "steps"), 10);
}

TEST_F(ResultsWriter, FailureMidWriteLeavesNoPartialAndKeepsTheOldFile) {
  const fs::path path = write_standard(/*steps=*/10);
  auto bad = make_results(20);
  bad.field_maps[0].values[1][2].pop_back();  // Hy at the second frequency is one value short
  try {
    io::write_results(path.string(), bad, make_scene(), make_info());
    FAIL() << "expected a failure";
  } catch (const std::runtime_error& e) {
    const std::string what = e.what();
    EXPECT_NE(what.find(path.string()), std::string::npos) << what;
    EXPECT_NE(what.find("map_a"), std::string::npos) << what;
  }
  EXPECT_FALSE(fs::exists(path.string() + ".partial"));
  Opened f(path);
  EXPECT_EQ(read_int_attribute(f.id(), "/summary", "steps"), 10);
}

TEST_F(ResultsWriter, UnwritableDirectoryThrowsNamingThePathAndKeepsTheOldFile) {
  const fs::path path = write_standard(/*steps=*/10);
  fs::permissions(dir_, fs::perms::owner_read | fs::perms::owner_exec);
  if (permissions_are_bypassed(dir_)) GTEST_SKIP() << "this user can write into read-only directories (root)";
  try {
    io::write_results(path.string(), make_results(20), make_scene(), make_info());
    FAIL() << "expected a failure";
  } catch (const std::runtime_error& e) {
    EXPECT_NE(std::string(e.what()).find(path.string()), std::string::npos) << e.what();
  }
  EXPECT_THROW(io::check_writable(path.string()), std::runtime_error);
  Opened f(path);
  EXPECT_EQ(read_int_attribute(f.id(), "/summary", "steps"), 10);
}

TEST_F(ResultsWriter, CheckWritableNamesThePathWhenTheDirectoryIsMissing) {
  const std::string path = (dir_ / "no_such_dir" / "run.h5").string();
  try {
    io::check_writable(path);
    FAIL() << "expected a failure";
  } catch (const std::runtime_error& e) {
    const std::string what = e.what();
    EXPECT_NE(what.find(path), std::string::npos) << what;
    EXPECT_NE(what.find("does not exist"), std::string::npos) << what;
  }
}

TEST_F(ResultsWriter, CheckWritableNamesThePathWhenTheParentIsAFile) {
  std::ofstream(dir_ / "plain_file") << "x";
  const std::string path = (dir_ / "plain_file" / "run.h5").string();
  try {
    io::check_writable(path);
    FAIL() << "expected a failure";
  } catch (const std::runtime_error& e) {
    const std::string what = e.what();
    EXPECT_NE(what.find(path), std::string::npos) << what;
    EXPECT_NE(what.find("not a directory"), std::string::npos) << what;
  }
  // And the write itself fails the same way, naming the path.
  try {
    io::write_results(path, make_results(), make_scene(), make_info());
    FAIL() << "expected a failure";
  } catch (const std::runtime_error& e) {
    EXPECT_NE(std::string(e.what()).find(path), std::string::npos) << e.what();
  }
}

TEST_F(ResultsWriter, CheckWritableAcceptsAWritableDirectoryAndLeavesNothingBehind) {
  EXPECT_NO_THROW(io::check_writable((dir_ / "run.h5").string()));
  EXPECT_TRUE(fs::is_empty(dir_));
}

TEST_F(ResultsWriter, CheckWritableRefusesAReadOnlyDirectory) {
  fs::permissions(dir_, fs::perms::owner_read | fs::perms::owner_exec);
  if (permissions_are_bypassed(dir_)) GTEST_SKIP() << "this user can write into read-only directories (root)";
  const std::string path = (dir_ / "run.h5").string();
  try {
    io::check_writable(path);
    FAIL() << "expected a failure";
  } catch (const std::runtime_error& e) {
    EXPECT_NE(std::string(e.what()).find(path), std::string::npos) << e.what();
  }
}

TEST_F(ResultsWriter, EmptyResultsStillMakeAValidFile) {
  const fs::path path = dir_ / "empty.h5";
  io::write_results(path.string(), solver::RunResults{}, solver::Scene{}, io::WriteInfo{});
  Opened f(path);
  EXPECT_EQ(read_string_attribute(f.id(), "/", "format"), "yeegap-results");
  EXPECT_EQ(dataset_shape(f.id(), "/materials/map"), (std::vector<hsize_t>{0, 0, 0}));
  EXPECT_GT(H5Lexists(f.id(), "/outputs", H5P_DEFAULT), 0);
}

TEST_F(ResultsWriter, OrdersListOneEntryPerOrderWithRowSideAndOrderNumbers) {
  const solver::RunResults r = make_results();
  Opened f(write_standard());
  const std::string g = "/outputs/orders_a";
  EXPECT_EQ(read_string_attribute(f.id(), g, "kind"), "orders");
  EXPECT_EQ(read_string_list_attribute(f.id(), g, "lateral_axes"), (std::vector<std::string>{"x", "y"}));
  EXPECT_EQ(read_doubles(f.id(), g + "/efficiency"), r.orders[0].efficiency);
  EXPECT_EQ(read_dataset<std::int32_t>(f.id(), g + "/row", H5T_NATIVE_INT32), (std::vector<std::int32_t>{0, 0, 0, 1}));
  EXPECT_EQ(read_dataset<std::int32_t>(f.id(), g + "/order", H5T_NATIVE_INT32),
            (std::vector<std::int32_t>{-1, 0, 0, 0, 1, 0, 0, 0}));
  const std::vector<double> d = read_doubles(f.id(), g + "/direction");
  ASSERT_EQ(d.size(), 12u);
  EXPECT_EQ(d[3 * 2], 0.7);  // (n, 3), the third order's x
  EXPECT_EQ(read_doubles(f.id(), g + "/reflected_sum"), r.orders[0].reflected_sum);
  EXPECT_DOUBLE_EQ(read_double_attribute(f.id(), g, "transmitted_index"), 1.5);
}

// An output that makes its record directly (as a new output would) is written with no code of its
// own: attributes, each quantity with its shape, units and description, complex values as _re/_im.
TEST_F(ResultsWriter, ARecordIsWrittenWithoutKnowingItsKind) {
  solver::RunResults r = make_results();
  solver::Record rec("made_up", "direct");
  rec.set("count", std::int32_t{3});
  rec.set("label", std::string("abc"));
  rec.add("time", "s", std::vector<double>{0, 1e-15, 2e-15}, "sample times");
  rec.add("amplitude", "V s", std::vector<std::complex<double>>{{1, 2}, {3, 4}, {5, 6}, {7, 8}}).shape = {2, 2};
  rec.add("index", "none", std::vector<std::int32_t>{4, 5, 6}).attributes = {{"offset", 0.5}};
  r.records.push_back(rec);
  const fs::path path = dir_ / "record.h5";
  io::write_results(path.string(), r, make_scene(), make_info());
  Opened f(path);
  const std::string g = "/outputs/direct";
  EXPECT_EQ(read_string_attribute(f.id(), g, "kind"), "made_up");
  EXPECT_EQ(read_int_attribute(f.id(), g, "count"), 3);
  EXPECT_EQ(read_string_attribute(f.id(), g, "label"), "abc");
  EXPECT_EQ(read_doubles(f.id(), g + "/time"), (std::vector<double>{0, 1e-15, 2e-15}));
  EXPECT_EQ(read_string_attribute(f.id(), g + "/time", "units"), "s");
  EXPECT_EQ(read_string_attribute(f.id(), g + "/time", "description"), "sample times");
  EXPECT_EQ(dataset_shape(f.id(), g + "/amplitude_im"), (std::vector<hsize_t>{2, 2}));
  EXPECT_EQ(read_doubles(f.id(), g + "/amplitude_im"), (std::vector<double>{2, 4, 6, 8}));
  EXPECT_EQ(read_string_attribute(f.id(), g + "/amplitude_re", "units"), "V s");
  EXPECT_EQ(read_dataset<std::int32_t>(f.id(), g + "/index", H5T_NATIVE_INT32), (std::vector<std::int32_t>{4, 5, 6}));
  EXPECT_DOUBLE_EQ(read_double_attribute(f.id(), g + "/index", "offset"), 0.5);
}

TEST_F(ResultsWriter, ARecordWhoseValuesDoNotFillItsShapeIsRefusedByName) {
  solver::RunResults r = make_results();
  solver::Record rec("made_up", "short");
  rec.add("grid", "1", std::vector<double>{1, 2, 3}).shape = {2, 2};
  r.records.push_back(rec);
  const fs::path path = dir_ / "bad.h5";
  try {
    io::write_results(path.string(), r, make_scene(), make_info());
    ADD_FAILURE() << "no error";
  } catch (const std::runtime_error& e) {
    EXPECT_NE(std::string(e.what()).find("made_up 'short': quantity 'grid' has 3 values for a shape of 4"),
              std::string::npos)
        << e.what();
  }
  EXPECT_FALSE(fs::exists(path));
  EXPECT_FALSE(fs::exists(path.string() + ".partial"));
}

}  // namespace

