// io/xdmf_writer: the sidecar of a uniform and of a graded results file is parsed lightly (regular
// expressions over the XML) and every heavy-data reference is checked against the HDF5 file read
// back with the plain C API: the dataset exists, its extents match the declared Dimensions, a
// field map's slab picks the frequency its grid is named after, and the mesh is the file's own
// node coordinates. Whether ParaView itself reads the sidecar is tests/cli/viewer_check.py.
#include "io/results/xdmf_writer.h"

#include <gtest/gtest.h>
#include <hdf5.h>
#include <unistd.h>

#include <cmath>
#include <complex>
#include <filesystem>
#include <fstream>
#include <optional>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include "base/units.h"
#include "io/results/results_writer.h"

namespace fs = std::filesystem;
using namespace yeegap;
using solver::Component;

namespace {

using Dims = std::vector<hsize_t>;

// ---- the HDF5 file, read with the C API ----

struct Closer {
  hid_t id;
  herr_t (*close)(hid_t);
  ~Closer() {
    if (id >= 0) close(id);
  }
};

/// Extents of a dataset, or nothing if it does not exist.
std::optional<Dims> dataset_dims(const fs::path& file, const std::string& path) {
  H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
  Closer f{H5Fopen(file.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), H5Fclose};
  if (f.id < 0 || H5Lexists(f.id, path.c_str(), H5P_DEFAULT) <= 0) return std::nullopt;
  Closer d{H5Dopen2(f.id, path.c_str(), H5P_DEFAULT), H5Dclose};
  if (d.id < 0) return std::nullopt;
  Closer space{H5Dget_space(d.id), H5Sclose};
  Dims dims(static_cast<std::size_t>(H5Sget_simple_extent_ndims(space.id)));
  H5Sget_simple_extent_dims(space.id, dims.data(), nullptr);
  return dims;
}

/// The doubles of a whole dataset, or of the slab [index, ...] along its first axis.
std::vector<double> read_doubles(const fs::path& file, const std::string& path, std::optional<hsize_t> slab = {}) {
  Closer f{H5Fopen(file.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT), H5Fclose};
  Closer d{H5Dopen2(f.id, path.c_str(), H5P_DEFAULT), H5Dclose};
  Closer space{H5Dget_space(d.id), H5Sclose};
  Dims dims(static_cast<std::size_t>(H5Sget_simple_extent_ndims(space.id)));
  H5Sget_simple_extent_dims(space.id, dims.data(), nullptr);
  Dims start(dims.size(), 0), count = dims;
  if (slab) {
    start[0] = *slab;
    count[0] = 1;
  }
  H5Sselect_hyperslab(space.id, H5S_SELECT_SET, start.data(), nullptr, count.data(), nullptr);
  hsize_t n = 1;
  for (hsize_t c : count) n *= c;
  Closer memory{H5Screate_simple(1, &n, nullptr), H5Sclose};
  std::vector<double> values(n);
  H5Dread(d.id, H5T_NATIVE_DOUBLE, memory.id, space.id, H5P_DEFAULT, values.data());
  return values;
}

// ---- the XML, parsed lightly ----

Dims parse_dims(const std::string& text) {
  Dims dims;
  std::istringstream in(text);
  for (hsize_t v; in >> v;) dims.push_back(v);
  return dims;
}

/// One `<DataItem ... Format="HDF">file:/path[|start:stride:count:dims]</DataItem>`.
struct HeavyItem {
  Dims dims;              // the Dimensions attribute
  std::string file, path;
  bool slab = false;
  Dims start, stride, count, space;
};

HeavyItem parse_item(const std::string& dims, const std::string& content) {
  HeavyItem item;
  item.dims = parse_dims(dims);
  const auto colon = content.find(':');
  item.file = content.substr(0, colon);
  std::string rest = content.substr(colon + 1);
  const auto bar = rest.find('|');
  item.path = rest.substr(0, bar);
  if (bar != std::string::npos) {
    item.slab = true;
    std::vector<std::string> parts;
    std::stringstream in(rest.substr(bar + 1));
    for (std::string part; std::getline(in, part, ':');) parts.push_back(part);
    if (parts.size() == 4) {
      item.start = parse_dims(parts[0]);
      item.stride = parse_dims(parts[1]);
      item.count = parse_dims(parts[2]);
      item.space = parse_dims(parts[3]);
    }
  }
  return item;
}

const std::regex item_pattern(R"re(<DataItem Dimensions="([0-9 ]+)"[^>]*Format="HDF">([^<]*)</DataItem>)re");

std::vector<HeavyItem> items_in(const std::string& xml) {
  std::vector<HeavyItem> items;
  for (std::sregex_iterator it(xml.begin(), xml.end(), item_pattern), end; it != end; ++it)
    items.push_back(parse_item((*it)[1], (*it)[2]));
  return items;
}

struct Attribute {
  std::string name, center;
  HeavyItem item;
};

struct GridText {
  std::string name;
  Dims topology;
  std::vector<HeavyItem> geometry;  // x, y, z
  std::vector<Attribute> attributes;
};

std::vector<GridText> grids_in(const std::string& xml) {
  std::vector<GridText> grids;
  const std::regex grid(R"re(<Grid Name="([^"]*)" GridType="Uniform">([\s\S]*?)</Grid>)re");
  const std::regex topology(R"re(<Topology TopologyType="3DRectMesh" Dimensions="([0-9 ]+)"/>)re");
  const std::regex geometry(R"re(<Geometry GeometryType="VXVYVZ">([\s\S]*?)</Geometry>)re");
  const std::regex attribute(R"re(<Attribute Name="([^"]*)" AttributeType="Scalar" Center="(\w+)">([\s\S]*?)</Attribute>)re");
  for (std::sregex_iterator it(xml.begin(), xml.end(), grid), end; it != end; ++it) {
    GridText g;
    g.name = (*it)[1];
    const std::string body = (*it)[2];
    std::smatch m;
    if (std::regex_search(body, m, topology)) g.topology = parse_dims(m[1]);
    if (std::regex_search(body, m, geometry)) g.geometry = items_in(m[1]);
    for (std::sregex_iterator a(body.begin(), body.end(), attribute); a != end; ++a) {
      const std::vector<HeavyItem> items = items_in((*a)[3]);
      g.attributes.push_back({(*a)[1], (*a)[2], items.empty() ? HeavyItem{} : items[0]});
    }
    grids.push_back(g);
  }
  return grids;
}

// ---- results to describe (invented numbers: only how they are referenced matters) ----

const double omega_500nm = units::wavelength_to_omega(500e-9);
const double omega_633nm = units::wavelength_to_omega(632.8e-9);

/// A field map value that tells frequency, component and node apart.
double map_value(std::size_t f, std::size_t c, std::size_t i) { return 1000.0 * double(f) + 100.0 * double(c) + double(i); }

solver::RunResults make_results(bool graded) {
  solver::RunResults r;
  r.summary.time_step = 1e-17;
  r.summary.stop_reason = "time";
  r.grid_x = {0, 1e-9, 2e-9, 3e-9, 4e-9};
  r.grid_y = graded ? std::vector<double>{0, 0.5e-9, 0.75e-9, 1.5e-9} : std::vector<double>{0, 1e-9, 2e-9, 3e-9};
  r.grid_z = {0, 1e-9, 2e-9};
  r.material_names = {"vacuum", "gold"};
  for (int i = 0; i < 4 * 3 * 2; ++i) r.material_map.push_back(static_cast<std::uint8_t>(i % 4 == 1 ? 1 : 0));
  r.source_omegas = {omega_500nm, omega_633nm};

  solver::FieldMapResult m;  // the plane z = 1 nm, on all x and y nodes
  m.name = "xy_plane";
  m.x = r.grid_x;
  m.y = r.grid_y;
  m.z = {1e-9};
  m.omegas = {omega_500nm, omega_633nm};
  m.components = {Component::Ex, Component::Ez};
  const std::size_t nodes = m.x.size() * m.y.size();
  m.values.assign(2, std::vector<std::vector<std::complex<double>>>(2, std::vector<std::complex<double>>(nodes)));
  for (std::size_t f = 0; f < 2; ++f)
    for (std::size_t c = 0; c < 2; ++c)
      for (std::size_t i = 0; i < nodes; ++i) m.values[f][c][i] = {map_value(f, c, i), -map_value(f, c, i)};
  r.field_maps.push_back(m);

  solver::FieldMapResult h = m;  // H only: no E_squared
  h.name = "h_only";
  h.components = {Component::Hy};
  h.omegas = {omega_500nm};
  h.values = {{m.values[0][0]}};
  r.field_maps.push_back(h);
  return r;
}

class XdmfWriter : public ::testing::TestWithParam<bool> {
 protected:
  void SetUp() override {
    const auto* info = ::testing::UnitTest::GetInstance()->current_test_info();
    std::string name = info->name();
    for (char& c : name)
      if (c == '/') c = '_';
    dir_ = fs::temp_directory_path() / ("yeegap_xdmf_" + std::to_string(::getpid()) + "_" + name);
    fs::remove_all(dir_);
    fs::create_directories(dir_);
  }
  void TearDown() override { fs::remove_all(dir_); }

  fs::path write(const solver::RunResults& r) {
    const fs::path path = dir_ / "run.h5";
    solver::Scene scene;
    scene.text = "scene: {version: 1}\n";
    io::write_results(path.string(), r, scene, {"test", "yeegap run", "2024-01-01T00:00:00+00:00", 1});
    return path;
  }
  fs::path write(bool graded) { return write(make_results(graded)); }

  static std::string read_text(const fs::path& p) {
    std::ifstream in(p);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
  }

  fs::path dir_;
};

const GridText* find_grid(const std::vector<GridText>& grids, const std::string& name) {
  for (const auto& g : grids)
    if (g.name == name) return &g;
  return nullptr;
}

TEST_P(XdmfWriter, EveryReferenceNamesAnExistingDatasetOfTheDeclaredExtents) {
  const fs::path h5 = write(GetParam());
  const std::string xml = read_text(io::write_xdmf(h5.string()));
  const std::vector<HeavyItem> items = items_in(xml);
  // materials: 3 coordinates + map; xy_plane: 2 frequencies x (3 coordinates + 5 arrays); h_only: 3 + 2.
  ASSERT_EQ(items.size(), 4u + 2 * 8 + 5) << xml;
  for (const HeavyItem& item : items) {
    EXPECT_EQ(item.file, "run.h5") << item.path;  // relative to the sidecar, which sits beside it
    const std::optional<Dims> dims = dataset_dims(h5, item.path);
    ASSERT_TRUE(dims.has_value()) << item.path << " does not exist";
    if (!item.slab) {
      EXPECT_EQ(*dims, item.dims) << item.path;
      continue;
    }
    EXPECT_EQ(item.space, *dims) << item.path;  // the slab notation states the whole dataset's extents
    ASSERT_EQ(item.count.size(), 4u) << item.path;
    EXPECT_EQ(item.count[0], 1u) << item.path;
    EXPECT_EQ(Dims(item.count.begin() + 1, item.count.end()), item.dims) << item.path;
    EXPECT_EQ(item.stride, Dims(4, 1)) << item.path;
    EXPECT_LT(item.start[0], (*dims)[0]) << item.path;
  }
}

TEST_P(XdmfWriter, MeshesAreTheFilesNodeCoordinatesWithCellAndNodeDataOfMatchingSize) {
  const fs::path h5 = write(GetParam());
  const std::vector<GridText> grids = grids_in(read_text(io::write_xdmf(h5.string())));
  ASSERT_EQ(grids.size(), 4u);  // materials, xy_plane at 2 wavelengths, h_only at 1
  for (const GridText& g : grids) {
    ASSERT_EQ(g.geometry.size(), 3u) << g.name;
    ASSERT_EQ(g.topology.size(), 3u) << g.name;
    // Topology is (nz, ny, nx); the geometry lists x, y, z.
    for (int axis = 0; axis < 3; ++axis) {
      EXPECT_EQ(g.geometry[axis].dims, Dims{g.topology[2 - axis]}) << g.name << " axis " << axis;
      EXPECT_EQ(g.geometry[axis].path.back(), "xyz"[axis]) << g.name;
    }
    for (const Attribute& a : g.attributes) {
      Dims want = g.topology;
      if (a.center == "Cell")
        for (hsize_t& d : want) d -= 1;
      else
        EXPECT_EQ(a.center, "Node") << g.name << " " << a.name;
      EXPECT_EQ(a.item.dims, want) << g.name << " " << a.name;
    }
  }
  const GridText* materials = find_grid(grids, "materials");
  ASSERT_NE(materials, nullptr);
  EXPECT_EQ(materials->geometry[1].path, "/grid/y");
  // The mesh is whatever the file holds, graded or not.
  const std::vector<double> y = read_doubles(h5, materials->geometry[1].path);
  EXPECT_EQ(y, make_results(GetParam()).grid_y);
  ASSERT_EQ(materials->attributes.size(), 1u);
  EXPECT_EQ(materials->attributes[0].name, "material");
  EXPECT_EQ(materials->attributes[0].center, "Cell");
  EXPECT_EQ(materials->attributes[0].item.path, "/materials/map");
}

TEST_P(XdmfWriter, EachFieldMapGridIsNamedWithItsWavelengthAndHoldsThatFrequency) {
  const fs::path h5 = write(GetParam());
  const std::vector<GridText> grids = grids_in(read_text(io::write_xdmf(h5.string())));
  const struct {
    const char* name;
    hsize_t frequency;
  } expected[] = {{"xy_plane 500 nm", 0}, {"xy_plane 632.8 nm", 1}};
  for (const auto& e : expected) {
    const GridText* g = find_grid(grids, e.name);
    ASSERT_NE(g, nullptr) << e.name;
    std::vector<std::string> names;
    for (const Attribute& a : g->attributes) {
      names.push_back(a.name);
      EXPECT_EQ(a.center, "Node");
      EXPECT_EQ(a.item.start, (Dims{e.frequency, 0, 0, 0})) << e.name << " " << a.name;
    }
    EXPECT_EQ(names, (std::vector<std::string>{"Ex_re", "Ex_im", "Ez_re", "Ez_im", "E_squared"}));
    // The slab it names holds the values of its own frequency: Ez_re = map_value(f, 1, i).
    const std::vector<double> ez = read_doubles(h5, g->attributes[2].item.path, g->attributes[2].item.start[0]);
    ASSERT_EQ(ez.size(), 5u * 4u);
    for (std::size_t i = 0; i < ez.size(); ++i) ASSERT_EQ(ez[i], map_value(e.frequency, 1, i)) << e.name << " node " << i;
  }
  const GridText* h = find_grid(grids, "h_only 500 nm");
  ASSERT_NE(h, nullptr);
  ASSERT_EQ(h->attributes.size(), 2u);  // Hy_re, Hy_im; no E_squared without an E component
  EXPECT_EQ(h->attributes[0].name, "Hy_re");
}

INSTANTIATE_TEST_SUITE_P(UniformAndGraded, XdmfWriter, ::testing::Values(false, true),
                         [](const auto& p) { return p.param ? "graded" : "uniform"; });

TEST_F(XdmfWriter, SidecarSitsBesideTheResultsWithNoPartialFileLeft) {
  const fs::path h5 = write(false);
  EXPECT_EQ(io::xdmf_path(h5.string()), (dir_ / "run.xmf").string());
  const std::string path = io::write_xdmf(h5.string());
  EXPECT_EQ(path, (dir_ / "run.xmf").string());
  EXPECT_FALSE(fs::exists(path + ".partial"));
  EXPECT_EQ(read_text(path), io::xdmf_text(h5.string(), "run.h5"));
}

TEST_F(XdmfWriter, RefusesAFileThatIsNotAResultsFileAndNamesIt) {
  const fs::path other = dir_ / "other.h5";
  {
    Closer f{H5Fcreate(other.c_str(), H5F_ACC_TRUNC, H5P_DEFAULT, H5P_DEFAULT), H5Fclose};
    ASSERT_GE(f.id, 0);
  }
  try {
    io::write_xdmf(other.string());
    FAIL() << "no exception";
  } catch (const std::runtime_error& e) {
    EXPECT_NE(std::string(e.what()).find("other.h5"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("yeegap-results"), std::string::npos) << e.what();
  }
  EXPECT_FALSE(fs::exists(dir_ / "other.xmf"));
}

TEST_F(XdmfWriter, RefusesAnOutputNameThatAnXdmfReferenceCannotHold) {
  solver::RunResults r = make_results(false);
  r.field_maps[0].name = "a:b";  // XDMF splits a reference at ':'
  const fs::path h5 = write(r);
  EXPECT_THROW(io::write_xdmf(h5.string()), std::runtime_error);
  EXPECT_FALSE(fs::exists(dir_ / "run.xmf"));
}

}  // namespace
