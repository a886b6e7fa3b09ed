// The XDMF 3 sidecar of a results file (io/results/xdmf_writer.h). It is written from the results file
// itself, not from the run's memory, so `yeegap view` can (re)make it for any results file. A field
// map's frequency f is the slab [f, :, :, :] of its (nfreq, nz, ny, nx) datasets, described with
// XDMF 3's slab notation "file:/dataset|start:stride:count:dims", which ParaView's Xdmf3 readers
// read (its HyperSlab data items are not read by them: checked with ParaView 5.11).
#include "io/results/xdmf_writer.h"

#include <fcntl.h>
#include <fmt/format.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <stdexcept>
#include <vector>

#include "io/h5.h"
#include "io/results/results_writer.h"

namespace yeegap::io {

namespace fs = std::filesystem;

namespace {

// ---------------------------------------------------------------------------------------------
// Reading the few things the sidecar needs (through io/h5): extents, string attributes, one axis.

/// A results file the sidecar cannot describe; other failures of reading are wrapped into one.
struct Unreadable : std::runtime_error {
  using std::runtime_error::runtime_error;
};

[[noreturn]] void unreadable(const std::string& file, const std::string& what) {
  throw Unreadable(fmt::format("cannot describe results file '{}' for viewing: {}", file, what));
}

/// Extents of a dataset, slowest axis first.
h5::Shape extents(const h5::File& f, const std::string& path) {
  if (!f.exists(path)) unreadable(f.file_name(), fmt::format("dataset '/{}' is missing", path));
  return f.open_dataset(path).shape();
}

/// The length of a 1-d dataset (a coordinate axis).
hsize_t length_of(const h5::File& f, const std::string& path) {
  const h5::Shape shape = extents(f, path);
  if (shape.size() != 1 || shape[0] == 0)
    unreadable(f.file_name(), fmt::format("'/{}' is not a 1-d array of coordinates", path));
  return shape[0];
}

/// A string or string-array attribute of the group at `path` ("" for the root); empty if absent.
std::vector<std::string> string_attribute(const h5::File& f, const std::string& path, const std::string& name) {
  if (path.empty()) return f.has_attribute(name) ? f.string_attributes(name) : std::vector<std::string>{};
  const h5::Group g = f.open_group(path);
  return g.has_attribute(name) ? g.string_attributes(name) : std::vector<std::string>{};
}

// ---------------------------------------------------------------------------------------------
// Writing the XML.

std::string xml_escape(const std::string& text) {
  std::string out;
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&apos;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string dims_text(const h5::Shape& shape) {
  std::string s;
  for (std::size_t i = 0; i < shape.size(); ++i) {
    if (i > 0) s += ' ';
    s += std::to_string(shape[i]);
  }
  return s;
}

/// Writes one XDMF file; `h5` is the heavy-data file name as the sidecar refers to it.
class XdmfBuilder {
 public:
  explicit XdmfBuilder(std::string h5) : h5_(xml_escape(std::move(h5))) {}

  void line(int indent, const std::string& text) { out_ += std::string(2 * indent, ' ') + text + "\n"; }

  /// A whole dataset of doubles (or of `number_type`/`precision`).
  void data_item(int indent, const h5::Shape& dims, const std::string& path, const char* number_type = "Float",
                 int precision = 8) {
    line(indent, fmt::format(R"(<DataItem Dimensions="{}" NumberType="{}" Precision="{}" Format="HDF">{}:{}</DataItem>)",
                             dims_text(dims), number_type, precision, h5_, xml_escape(path)));
  }

  /// The slab [index, :, :, :] of a (n, nz, ny, nx) dataset of doubles, in XDMF 3's notation.
  void slab_item(int indent, const h5::Shape& full, hsize_t index, const std::string& path) {
    const h5::Shape count{1, full[1], full[2], full[3]};
    line(indent, fmt::format(R"(<DataItem Dimensions="{}" NumberType="Float" Precision="8" Format="HDF">{}:{}|{} 0 0 0:1 1 1 1:{}:{}</DataItem>)",
                             dims_text({full[1], full[2], full[3]}), h5_, xml_escape(path), index,
                             dims_text(count), dims_text(full)));
  }

  /// Topology and geometry of a rectilinear grid whose node coordinates are the 1-d datasets
  /// `<group>/x`, `<group>/y`, `<group>/z` of lengths nodes = (nz, ny, nx).
  void rect_mesh(int indent, const h5::Shape& nodes, const std::string& group) {
    line(indent, fmt::format(R"(<Topology TopologyType="3DRectMesh" Dimensions="{}"/>)", dims_text(nodes)));
    line(indent, R"(<Geometry GeometryType="VXVYVZ">)");
    data_item(indent + 1, {nodes[2]}, group + "/x");
    data_item(indent + 1, {nodes[1]}, group + "/y");
    data_item(indent + 1, {nodes[0]}, group + "/z");
    line(indent, "</Geometry>");
  }

  std::string& text() { return out_; }

 private:
  std::string h5_;
  std::string out_;
};

/// XDMF splits a heavy-data reference at the first ':' and at every '|', so names with those
/// characters cannot be referred to.
void check_referable(const std::string& file, const std::string& name, const char* what) {
  if (name.find_first_of(":|") != std::string::npos)
    unreadable(file, fmt::format("the {} '{}' contains ':' or '|', which an XDMF reference cannot hold; rename it",
                                 what, name));
}

void describe_materials(XdmfBuilder& x, const h5::File& f, const h5::Shape& nodes) {
  const std::string& file = f.file_name();
  const h5::Shape cells = extents(f, "materials/map");
  if (cells.size() != 3 || cells[0] + 1 != nodes[0] || cells[1] + 1 != nodes[1] || cells[2] + 1 != nodes[2])
    unreadable(file, fmt::format("/materials/map is {} for a grid of {} nodes", dims_text(cells), dims_text(nodes)));
  const std::vector<std::string> names = f.open_dataset("materials/names").read_strings();
  x.line(2, R"(<Grid Name="materials" GridType="Uniform">)");
  std::string legend;
  for (std::size_t i = 0; i < names.size(); ++i) legend += fmt::format("{}{} = {}", i ? ", " : "", i, names[i]);
  x.line(3, fmt::format(R"(<Information Name="material" Value="{}"/>)", xml_escape(legend)));
  x.rect_mesh(3, nodes, "/grid");
  x.line(3, R"(<Attribute Name="material" AttributeType="Scalar" Center="Cell">)");
  x.data_item(4, cells, "/materials/map", "UChar", 1);
  x.line(3, "</Attribute>");
  x.line(2, "</Grid>");
}

void describe_field_map(XdmfBuilder& x, const h5::File& f, const std::string& name) {
  const std::string& file = f.file_name();
  const std::string group = "outputs/" + name;
  check_referable(file, name, "output");
  const h5::Shape nodes{length_of(f, group + "/z"), length_of(f, group + "/y"), length_of(f, group + "/x")};
  const std::vector<double> wavelength_nm = f.open_dataset(group + "/wavelength_nm").read_vector<double>();
  const h5::Shape full{wavelength_nm.size(), nodes[0], nodes[1], nodes[2]};

  std::vector<std::string> arrays;  // dataset names inside the group, each (nfreq, nz, ny, nx)
  for (const std::string& c : string_attribute(f, group, "components"))
    for (const char* part : {"_re", "_im"}) arrays.push_back(c + part);
  for (const char* derived : {"E_squared", "E_enhancement"})
    if (f.exists(group + "/" + derived)) arrays.emplace_back(derived);
  for (const std::string& a : arrays)
    if (extents(f, group + "/" + a) != full)
      unreadable(file, fmt::format("/{}/{} is not {} (frequencies, z, y, x nodes)", group, a, dims_text(full)));

  for (hsize_t q = 0; q < full[0]; ++q) {
    x.line(2, fmt::format(R"(<Grid Name="{} {:.5g} nm" GridType="Uniform">)", xml_escape(name), wavelength_nm[q]));
    x.line(3, fmt::format(R"(<Information Name="wavelength_nm" Value="{:.9g}"/>)", wavelength_nm[q]));
    x.rect_mesh(3, nodes, "/" + group);
    for (const std::string& a : arrays) {
      x.line(3, fmt::format(R"(<Attribute Name="{}" AttributeType="Scalar" Center="Node">)", xml_escape(a)));
      x.slab_item(4, full, q, "/" + group + "/" + a);
      x.line(3, "</Attribute>");
    }
    x.line(2, "</Grid>");
  }
}

}  // namespace

std::string xdmf_path(const std::string& results_path) {
  return fs::path(results_path).replace_extension(".xmf").string();
}

namespace {

std::string describe(const h5::File& file, const std::string& heavy_data_name) {
  const std::string& results_path = file.file_name();
  const std::vector<std::string> format = string_attribute(file, "", "format");
  if (format.size() != 1 || format[0] != results_format)
    unreadable(results_path, fmt::format("it is not a {} file (no matching 'format' attribute)", results_format));
  const std::int64_t version = file.has_attribute("format_version") ? file.int_attribute("format_version") : -1;
  if (version < 1 || version > results_format_version)
    unreadable(results_path, fmt::format("format_version {} is not one this program reads (1 to {})", version,
                                         results_format_version));

  const h5::Shape nodes{length_of(file, "grid/z"), length_of(file, "grid/y"), length_of(file, "grid/x")};
  XdmfBuilder x(heavy_data_name);
  x.line(0, R"(<?xml version="1.0" ?>)");
  x.line(0, R"(<!DOCTYPE Xdmf SYSTEM "Xdmf.dtd" []>)");
  x.line(0, "<!-- Viewer description of a yeegap results file (docs/results_file.md); open it in ParaView with the "
            "Xdmf3ReaderT reader. Field maps: one grid per wavelength. -->");
  x.line(0, R"(<Xdmf Version="3.0">)");
  x.line(1, "<Domain>");
  describe_materials(x, file, nodes);
  const std::vector<std::string> outputs =
      file.exists("outputs") ? file.open_group("outputs").members() : std::vector<std::string>{};
  for (const std::string& name : outputs) {
    const std::vector<std::string> kind = string_attribute(file, "outputs/" + name, "kind");
    if (kind.size() == 1 && kind[0] == "field_map") describe_field_map(x, file, name);
  }
  x.line(1, "</Domain>");
  x.line(0, "</Xdmf>");
  return std::move(x.text());
}

}  // namespace

std::string xdmf_text(const std::string& results_path, const std::string& heavy_data_name) {
  check_referable(results_path, heavy_data_name, "results file name");
  const h5::File file = h5::File::open(results_path);
  try {
    return describe(file, heavy_data_name);
  } catch (const Unreadable&) {
    throw;
  } catch (const std::exception& e) {  // io/h5's own message names the file and the object
    unreadable(results_path, e.what());
  }
}

std::string write_xdmf(const std::string& results_path) {
  const std::string path = xdmf_path(results_path);
  const std::string text = xdmf_text(results_path, fs::path(results_path).filename().string());
  const std::string partial = path + ".partial";
  const auto fail = [&](const std::string& why) {
    std::error_code ec;
    fs::remove(partial, ec);
    throw std::runtime_error(fmt::format("cannot write viewer file '{}': {}", path, why));
  };
  const int fd = ::open(partial.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
  if (fd < 0) fail(std::strerror(errno));
  std::size_t written = 0;
  while (written < text.size()) {
    const ssize_t n = ::write(fd, text.data() + written, text.size() - written);
    if (n < 0 && errno == EINTR) continue;
    if (n <= 0) {
      const int err = errno;
      ::close(fd);
      fail(std::strerror(err));
    }
    written += static_cast<std::size_t>(n);
  }
  const bool synced = ::fsync(fd) == 0;
  const int sync_err = errno;
  if (::close(fd) != 0 || !synced) fail(std::strerror(synced ? errno : sync_err));
  std::error_code ec;
  fs::rename(partial, path, ec);
  if (ec) fail(ec.message());
  return path;
}

}  // namespace yeegap::io
