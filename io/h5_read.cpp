// Small dataset readers (see h5_read.h), on the HDF5 1.10 C API.
#include "io/h5_read.h"

#include <stdexcept>

#include <fmt/format.h>

namespace yeegap::io::h5 {
namespace {

[[noreturn]] void fail(const File& file, const std::string& path, const std::string& what) {
  throw std::runtime_error(fmt::format("{}: cannot read {}: {}", file.file_name(), path, what));
}

Handle open_dataset(const File& file, const std::string& path) {
  if (!exists(file, path)) fail(file, path, "no such dataset");
  const hid_t id = H5Dopen2(file.id(), path.c_str(), H5P_DEFAULT);
  if (id < 0) fail(file, path, "not a dataset");
  return Handle(id, H5Dclose);
}

std::size_t element_count(const File& file, const std::string& path, hid_t dataset) {
  Handle space(H5Dget_space(dataset), H5Sclose);
  const hssize_t n = space.valid() ? H5Sget_simple_extent_npoints(space.get()) : -1;
  if (n < 0) fail(file, path, "no dataspace");
  return static_cast<std::size_t>(n);
}

template <class T>
std::vector<T> read_numbers(const File& file, const std::string& path, hid_t memory_type) {
  Handle d = open_dataset(file, path);
  std::vector<T> out(element_count(file, path, d.get()));
  if (!out.empty() && H5Dread(d.get(), memory_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, out.data()) < 0)
    fail(file, path, "read failed (wrong type?)");
  return out;
}

}  // namespace

bool exists(const File& file, const std::string& path) {
  std::string prefix;
  std::size_t start = 1;
  while (start <= path.size()) {
    const std::size_t end = std::min(path.find('/', start), path.size());
    prefix = path.substr(0, end);
    if (H5Lexists(file.id(), prefix.c_str(), H5P_DEFAULT) <= 0) return false;
    start = end + 1;
  }
  return !prefix.empty();
}

std::vector<double> read_doubles(const File& file, const std::string& path) {
  return read_numbers<double>(file, path, H5T_NATIVE_DOUBLE);
}

std::vector<std::int64_t> read_int64s(const File& file, const std::string& path) {
  return read_numbers<std::int64_t>(file, path, H5T_NATIVE_INT64);
}

std::vector<std::string> read_strings(const File& file, const std::string& path) {
  Handle d = open_dataset(file, path);
  Handle type(H5Dget_type(d.get()), H5Tclose);
  if (!type.valid() || H5Tget_class(type.get()) != H5T_STRING || H5Tis_variable_str(type.get()) != 0)
    fail(file, path, "not a fixed-length string dataset");
  const std::size_t width = H5Tget_size(type.get());
  const std::size_t n = element_count(file, path, d.get());
  std::vector<char> buffer(n * width + 1, '\0');
  Handle memory(H5Tcopy(H5T_C_S1), H5Tclose);
  H5Tset_size(memory.get(), width);
  H5Tset_strpad(memory.get(), H5T_STR_NULLPAD);
  if (n > 0 && H5Dread(d.get(), memory.get(), H5S_ALL, H5S_ALL, H5P_DEFAULT, buffer.data()) < 0)
    fail(file, path, "read failed");
  std::vector<std::string> out;
  for (std::size_t i = 0; i < n; ++i) {
    const char* s = buffer.data() + i * width;
    std::size_t len = 0;
    while (len < width && s[len] != '\0') ++len;
    out.emplace_back(s, len);
  }
  return out;
}

std::string read_string(const File& file, const std::string& path) {
  const std::vector<std::string> all = read_strings(file, path);
  if (all.size() != 1) fail(file, path, fmt::format("expected one string, found {}", all.size()));
  return all.front();
}

}  // namespace yeegap::io::h5
