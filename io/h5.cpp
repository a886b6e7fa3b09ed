// The HDF5 C API behind io/h5.h. Each call's status is checked; a failure reads HDF5's error
// stack (innermost message, e.g. "unable to open file ... errno = 2") into the exception text and
// clears it. Automatic stack printing is turned off whenever a file is created or opened.
#include "io/h5.h"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cstring>
#include <functional>
#include <numeric>
#include <stdexcept>

namespace yeegap::io::h5 {

namespace {

herr_t collect_message(unsigned /*n*/, const H5E_error2_t* error, void* out) {
  if (error->desc != nullptr && error->desc[0] != '\0')
    static_cast<std::vector<std::string>*>(out)->emplace_back(error->desc);
  return 0;
}

/// HDF5's innermost error message (the most specific one), then clears the stack.
std::string hdf5_message() {
  std::vector<std::string> messages;
  H5Ewalk2(H5E_DEFAULT, H5E_WALK_DOWNWARD, collect_message, &messages);
  H5Eclear2(H5E_DEFAULT);
  return messages.empty() ? std::string("no further detail from HDF5") : messages.back();
}

[[noreturn]] void fail(std::string_view action, std::string_view object, std::string_view file) {
  if (object.empty())  // a file-level operation
    throw std::runtime_error(fmt::format("HDF5 could not {} file '{}': {}", action, file, hdf5_message()));
  throw std::runtime_error(
      fmt::format("HDF5 could not {} '{}' in file '{}': {}", action, object, file, hdf5_message()));
}

hid_t check_id(hid_t id, std::string_view action, std::string_view object, std::string_view file) {
  if (id < 0) fail(action, object, file);
  return id;
}

void check_status(herr_t status, std::string_view action, std::string_view object, std::string_view file) {
  if (status < 0) fail(action, object, file);
}

/// The library prints every error stack to stderr by default; our exceptions carry the message.
/// Its clean-up at exit is switched off too: HDF5 1.10 keeps a file whose close failed (a full
/// disk) half-closed in its tables and that clean-up then crashes (exit code 139 instead of the
/// program's own). Every file here is closed explicitly, so nothing is lost by skipping it.
/// H5dont_atexit works only before the library starts, so the first file opened calls it.
void silence_hdf5() {
  static const bool once = [] {
    H5dont_atexit();
    return true;
  }();
  (void)once;
  H5Eset_auto2(H5E_DEFAULT, nullptr, nullptr);
}

hsize_t product(const Shape& shape) {
  return std::accumulate(shape.begin(), shape.end(), hsize_t{1}, std::multiplies<>());
}

Handle simple_space(const Shape& shape, std::string_view object, std::string_view file) {
  if (shape.empty()) return Handle(check_id(H5Screate(H5S_SCALAR), "create a dataspace for", object, file), H5Sclose);
  return Handle(check_id(H5Screate_simple(static_cast<int>(shape.size()), shape.data(), nullptr),
                         "create a dataspace for", object, file),
                H5Sclose);
}

/// A fixed-length ASCII string type of `size` bytes padded with NULs (size >= 1: HDF5 refuses 0).
Handle string_type(std::size_t size, std::string_view object, std::string_view file) {
  Handle type(check_id(H5Tcopy(H5T_C_S1), "make a string type for", object, file), H5Tclose);
  check_status(H5Tset_size(type.get(), std::max<std::size_t>(size, 1)), "size the string type of", object, file);
  check_status(H5Tset_strpad(type.get(), H5T_STR_NULLPAD), "pad the string type of", object, file);
  check_status(H5Tset_cset(type.get(), H5T_CSET_ASCII), "set the character set of", object, file);
  return type;
}

/// Strings packed into one buffer of `width` bytes each, NUL padded.
std::vector<char> pack_strings(const std::vector<std::string>& texts, std::size_t width) {
  std::vector<char> buffer(texts.size() * width, '\0');
  for (std::size_t i = 0; i < texts.size(); ++i) std::copy(texts[i].begin(), texts[i].end(), buffer.begin() + i * width);
  return buffer;
}

std::size_t longest(const std::vector<std::string>& texts) {
  std::size_t n = 1;
  for (const auto& t : texts) n = std::max(n, t.size());
  return n;
}

}  // namespace

Shape chunk_for(const Shape& shape, std::size_t element_size, std::size_t target_bytes) {
  Shape chunk = shape;
  if (shape.empty() || std::find(shape.begin(), shape.end(), hsize_t{0}) != shape.end()) return {};
  const hsize_t target = std::max<hsize_t>(1, target_bytes / std::max<std::size_t>(element_size, 1));
  for (std::size_t axis = 0; axis < chunk.size(); ++axis)
    while (product(chunk) > target && chunk[axis] > 1) chunk[axis] = (chunk[axis] + 1) / 2;
  return chunk;
}

// ---- Handle ----

Handle& Handle::operator=(Handle&& o) noexcept {
  if (this != &o) {
    reset();
    id_ = o.id_;
    close_ = o.close_;
    o.id_ = H5I_INVALID_HID;
  }
  return *this;
}

herr_t Handle::close() {
  if (!valid()) return 0;
  const herr_t status = close_(id_);
  id_ = H5I_INVALID_HID;
  return status;
}

void Handle::reset() noexcept {
  if (close() < 0) H5Eclear2(H5E_DEFAULT);
}

// ---- Object: attributes ----

std::string Object::child_path(std::string_view name) const {
  return path_ == "/" ? fmt::format("/{}", name) : fmt::format("{}/{}", path_, name);
}

void Object::write_attribute(std::string_view name, hid_t memory_type, hid_t file_type, const void* data,
                             const Shape& shape) const {
  const std::string where = fmt::format("{}@{}", path_, name);
  const std::string key(name);
  const htri_t exists = H5Aexists(id(), key.c_str());
  check_status(exists < 0 ? -1 : 0, "look up attribute", where, file_);
  if (exists > 0) check_status(H5Adelete(id(), key.c_str()), "replace attribute", where, file_);
  Handle space = simple_space(shape, where, file_);
  Handle attribute(check_id(H5Acreate2(id(), key.c_str(), file_type, space.get(), H5P_DEFAULT, H5P_DEFAULT),
                            "create attribute", where, file_),
                   H5Aclose);
  check_status(H5Awrite(attribute.get(), memory_type, data), "write attribute", where, file_);
  check_status(attribute.close(), "close attribute", where, file_);
}

void Object::set_attribute(std::string_view name, std::string_view value) const {
  Handle type = string_type(value.size(), path_, file_);
  std::string buffer(std::max<std::size_t>(value.size(), 1), '\0');
  std::copy(value.begin(), value.end(), buffer.begin());
  write_attribute(name, type.get(), type.get(), buffer.data(), {});
}

void Object::set_attribute(std::string_view name, const std::vector<std::string>& values) const {
  const std::size_t width = longest(values);
  Handle type = string_type(width, path_, file_);
  const std::vector<char> buffer = pack_strings(values, width);
  write_attribute(name, type.get(), type.get(), buffer.data(), Shape{values.size()});
}

void Object::set_attribute(std::string_view name, double value) const {
  write_attribute(name, H5T_NATIVE_DOUBLE, H5T_IEEE_F64LE, &value, {});
}

void Object::set_attribute(std::string_view name, std::int32_t value) const {
  write_attribute(name, H5T_NATIVE_INT32, H5T_STD_I32LE, &value, {});
}

void Object::set_attribute(std::string_view name, std::int64_t value) const {
  write_attribute(name, H5T_NATIVE_INT64, H5T_STD_I64LE, &value, {});
}

void Object::set_attribute(std::string_view name, const std::vector<double>& values) const {
  write_attribute(name, H5T_NATIVE_DOUBLE, H5T_IEEE_F64LE, values.data(), Shape{values.size()});
}

// ---- Object: reading attributes ----

bool Object::has_attribute(std::string_view name) const {
  const std::string key(name);
  const htri_t exists = H5Aexists(id(), key.c_str());
  check_status(exists < 0 ? -1 : 0, "look up attribute", fmt::format("{}@{}", path_, name), file_);
  return exists > 0;
}

namespace {
/// Opens a scalar attribute of the given type class, or throws naming what was found instead.
Handle open_scalar_attribute(hid_t object, std::string_view name, H5T_class_t wanted, const char* what,
                             const std::string& path, const std::string& file) {
  const std::string where = fmt::format("{}@{}", path, name);
  const std::string key(name);
  const htri_t exists = H5Aexists(object, key.c_str());
  check_status(exists < 0 ? -1 : 0, "look up attribute", where, file);
  if (exists == 0) throw std::runtime_error(fmt::format("file '{}' has no attribute '{}'", file, where));
  Handle attribute(check_id(H5Aopen(object, key.c_str(), H5P_DEFAULT), "open attribute", where, file), H5Aclose);
  Handle type(check_id(H5Aget_type(attribute.get()), "get the type of attribute", where, file), H5Tclose);
  Handle space(check_id(H5Aget_space(attribute.get()), "get the dataspace of attribute", where, file), H5Sclose);
  if (H5Tget_class(type.get()) != wanted || H5Sget_simple_extent_npoints(space.get()) != 1)
    throw std::runtime_error(fmt::format("attribute '{}' in file '{}' is not a single {}", where, file, what));
  return attribute;
}
}  // namespace

std::string Object::string_attribute(std::string_view name) const {
  const std::string where = fmt::format("{}@{}", path_, name);
  Handle attribute = open_scalar_attribute(id(), name, H5T_STRING, "string", path_, file_);
  Handle type(check_id(H5Aget_type(attribute.get()), "get the type of attribute", where, file_), H5Tclose);
  if (H5Tis_variable_str(type.get()) > 0)
    throw std::runtime_error(fmt::format("attribute '{}' in file '{}' is a variable-length string; this program "
                                         "writes and reads fixed-length ones", where, file_));
  std::string buffer(H5Tget_size(type.get()), '\0');
  check_status(H5Aread(attribute.get(), type.get(), buffer.data()), "read attribute", where, file_);
  return buffer.substr(0, buffer.find('\0'));
}

std::vector<std::string> Object::string_attributes(std::string_view name) const {
  const std::string where = fmt::format("{}@{}", path_, name);
  const std::string key(name);
  if (!has_attribute(name)) throw std::runtime_error(fmt::format("file '{}' has no attribute '{}'", file_, where));
  Handle attribute(check_id(H5Aopen(id(), key.c_str(), H5P_DEFAULT), "open attribute", where, file_), H5Aclose);
  Handle type(check_id(H5Aget_type(attribute.get()), "get the type of attribute", where, file_), H5Tclose);
  Handle space(check_id(H5Aget_space(attribute.get()), "get the dataspace of attribute", where, file_), H5Sclose);
  if (H5Tget_class(type.get()) != H5T_STRING || H5Tis_variable_str(type.get()) > 0 ||
      H5Sget_simple_extent_ndims(space.get()) > 1)
    throw std::runtime_error(fmt::format("attribute '{}' in file '{}' is not a list of fixed-length strings", where, file_));
  const std::size_t width = H5Tget_size(type.get());
  const hssize_t n = H5Sget_simple_extent_npoints(space.get());
  std::vector<char> buffer(static_cast<std::size_t>(std::max<hssize_t>(n, 0)) * width + 1, '\0');
  if (n > 0) check_status(H5Aread(attribute.get(), type.get(), buffer.data()), "read attribute", where, file_);
  std::vector<std::string> out;
  for (hssize_t i = 0; i < n; ++i) {
    const char* text = buffer.data() + i * width;
    out.emplace_back(text, strnlen(text, width));
  }
  return out;
}

std::int64_t Object::int_attribute(std::string_view name) const {
  Handle attribute = open_scalar_attribute(id(), name, H5T_INTEGER, "integer", path_, file_);
  std::int64_t value = 0;
  check_status(H5Aread(attribute.get(), H5T_NATIVE_INT64, &value), "read attribute", fmt::format("{}@{}", path_, name),
               file_);
  return value;
}

double Object::double_attribute(std::string_view name) const {
  Handle attribute = open_scalar_attribute(id(), name, H5T_FLOAT, "floating-point number", path_, file_);
  double value = 0;
  check_status(H5Aread(attribute.get(), H5T_NATIVE_DOUBLE, &value), "read attribute", fmt::format("{}@{}", path_, name),
               file_);
  return value;
}

// ---- Dataset ----

bool Dataset::stores_type(hid_t file_type) const {
  Handle type(check_id(H5Dget_type(id()), "get the type of", path_, file_), H5Tclose);
  const htri_t same = H5Tequal(type.get(), file_type);
  check_status(same < 0 ? -1 : 0, "compare the type of", path_, file_);
  return same > 0;
}

void Dataset::read_all(hid_t memory_type, void* data, std::size_t count) const {
  if (count != size())
    throw std::invalid_argument(fmt::format("dataset '{}' in file '{}' holds {} values, the reader expected {}", path_,
                                            file_, size(), count));
  if (count == 0) return;
  check_status(H5Dread(id(), memory_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, data), "read dataset", path_, file_);
}

std::string Dataset::read_string() const {
  Handle type(check_id(H5Dget_type(id()), "get the type of", path_, file_), H5Tclose);
  if (H5Tget_class(type.get()) != H5T_STRING || H5Tis_variable_str(type.get()) > 0 || !shape_.empty())
    throw std::runtime_error(fmt::format("dataset '{}' in file '{}' is not a fixed-length string", path_, file_));
  std::string buffer(H5Tget_size(type.get()), '\0');
  check_status(H5Dread(id(), type.get(), H5S_ALL, H5S_ALL, H5P_DEFAULT, buffer.data()), "read dataset", path_, file_);
  return buffer.substr(0, buffer.find('\0'));
}

std::vector<std::string> Dataset::read_strings() const {
  Handle type(check_id(H5Dget_type(id()), "get the type of", path_, file_), H5Tclose);
  if (H5Tget_class(type.get()) != H5T_STRING || H5Tis_variable_str(type.get()) > 0 || shape_.size() > 1)
    throw std::runtime_error(fmt::format("dataset '{}' in file '{}' is not a list of fixed-length strings", path_, file_));
  const std::size_t width = H5Tget_size(type.get()), n = size();
  std::vector<char> buffer(n * width + 1, '\0');
  if (n > 0)
    check_status(H5Dread(id(), type.get(), H5S_ALL, H5S_ALL, H5P_DEFAULT, buffer.data()), "read dataset", path_, file_);
  std::vector<std::string> out;
  for (std::size_t i = 0; i < n; ++i) {
    const char* text = buffer.data() + i * width;
    out.emplace_back(text, strnlen(text, width));
  }
  return out;
}

std::size_t Dataset::size() const { return static_cast<std::size_t>(product(shape_)); }

void Dataset::write_selection(hid_t memory_type, const void* data, std::size_t count,
                              std::optional<hsize_t> slab) const {
  if (shape_.empty()) {  // scalar
    if (count != 1 || slab)
      throw std::invalid_argument(fmt::format("dataset '{}' in file '{}' is a scalar, got {} values{}", path_, file_,
                                              count, slab ? " for a slab" : ""));
    check_status(H5Dwrite(id(), memory_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, data), "write dataset", path_, file_);
    return;
  }
  const hsize_t expected = slab ? product(Shape(shape_.begin() + 1, shape_.end())) : product(shape_);
  if (count != expected)
    throw std::invalid_argument(fmt::format("dataset '{}' in file '{}' has shape [{}]: a {} needs {} values, got {}",
                                            path_, file_, fmt::join(shape_, ", "), slab ? "slab" : "full write",
                                            expected, count));
  if (slab && *slab >= shape_[0])
    throw std::invalid_argument(fmt::format("dataset '{}' in file '{}': slab {} is outside [0, {})", path_, file_,
                                            *slab, shape_[0]));
  if (count == 0) return;
  if (!slab) {
    check_status(H5Dwrite(id(), memory_type, H5S_ALL, H5S_ALL, H5P_DEFAULT, data), "write dataset", path_, file_);
    return;
  }
  Handle file_space(check_id(H5Dget_space(id()), "get the dataspace of", path_, file_), H5Sclose);
  Shape start(shape_.size(), 0), extent = shape_;
  start[0] = *slab;
  extent[0] = 1;
  check_status(H5Sselect_hyperslab(file_space.get(), H5S_SELECT_SET, start.data(), nullptr, extent.data(), nullptr),
               "select a slab of", path_, file_);
  Handle memory_space = simple_space(Shape{count}, path_, file_);
  check_status(H5Dwrite(id(), memory_type, memory_space.get(), file_space.get(), H5P_DEFAULT, data),
               "write a slab of", path_, file_);
}

// ---- ComplexDataset ----

namespace {
void split(std::span<const std::complex<double>> data, std::vector<double>& re, std::vector<double>& im) {
  re.resize(data.size());
  im.resize(data.size());
  for (std::size_t i = 0; i < data.size(); ++i) {
    re[i] = data[i].real();
    im[i] = data[i].imag();
  }
}
}  // namespace

void ComplexDataset::write(std::span<const std::complex<double>> data) const {
  std::vector<double> r, i;
  split(data, r, i);
  re.write(std::span<const double>(r));
  im.write(std::span<const double>(i));
}

void ComplexDataset::write_slab(hsize_t index, std::span<const std::complex<double>> data) const {
  std::vector<double> r, i;
  split(data, r, i);
  re.write_slab(index, std::span<const double>(r));
  im.write_slab(index, std::span<const double>(i));
}

// ---- Group ----

Group Group::create_group(const std::string& name) const {
  const std::string path = child_path(name);
  return Group(Handle(check_id(H5Gcreate2(id(), name.c_str(), H5P_DEFAULT, H5P_DEFAULT, H5P_DEFAULT),
                               "create group", path, file_),
                      H5Gclose),
               file_, path);
}

Group Group::open_group(const std::string& name) const {
  const std::string path = child_path(name);
  return Group(Handle(check_id(H5Gopen2(id(), name.c_str(), H5P_DEFAULT), "open group", path, file_), H5Gclose),
               file_, path);
}

Dataset Group::open_dataset(const std::string& name) const {
  const std::string path = child_path(name);
  Handle dataset(check_id(H5Dopen2(id(), name.c_str(), H5P_DEFAULT), "open dataset", path, file_), H5Dclose);
  Handle space(check_id(H5Dget_space(dataset.get()), "get the dataspace of", path, file_), H5Sclose);
  const int rank = H5Sget_simple_extent_ndims(space.get());
  check_status(rank < 0 ? -1 : 0, "get the rank of", path, file_);
  Shape shape(static_cast<std::size_t>(rank));
  if (rank > 0) check_status(H5Sget_simple_extent_dims(space.get(), shape.data(), nullptr), "get the extent of", path, file_);
  return Dataset(std::move(dataset), file_, path, std::move(shape));
}

bool Group::contains(const std::string& name) const {
  const htri_t exists = H5Lexists(id(), name.c_str(), H5P_DEFAULT);
  check_status(exists < 0 ? -1 : 0, "look up", child_path(name), file_);
  return exists > 0;
}

std::vector<std::string> Group::members() const {
  std::vector<std::string> names;
  const auto add = [](hid_t, const char* name, const H5L_info_t*, void* out) -> herr_t {
    static_cast<std::vector<std::string>*>(out)->emplace_back(name);
    return 0;
  };
  hsize_t index = 0;
  check_status(H5Literate(id(), H5_INDEX_NAME, H5_ITER_INC, &index, add, &names), "list the members of", path_, file_);
  return names;
}

bool Group::exists(const std::string& path) const {
  for (std::size_t slash = path.find('/', 1); slash != std::string::npos; slash = path.find('/', slash + 1))
    if (!contains(path.substr(0, slash))) return false;
  return contains(path);
}

Dataset Group::create(const std::string& name, hid_t file_type, std::size_t element_size, const Shape& shape,
                      const Storage& storage) const {
  const std::string path = child_path(name);
  Handle space = simple_space(shape, path, file_);
  Handle properties(check_id(H5Pcreate(H5P_DATASET_CREATE), "make creation properties for", path, file_), H5Pclose);

  const bool has_zero = std::find(shape.begin(), shape.end(), hsize_t{0}) != shape.end();
  Shape chunk = storage.chunk;
  if (chunk.empty() && (storage.deflate_level > 0 || storage.checksum)) chunk = chunk_for(shape, element_size);
  if (!chunk.empty() && !shape.empty() && !has_zero) {
    if (chunk.size() != shape.size())
      throw std::invalid_argument(fmt::format("dataset '{}' in file '{}': chunk has {} axes, the shape {}", path,
                                              file_, chunk.size(), shape.size()));
    for (std::size_t a = 0; a < shape.size(); ++a) chunk[a] = std::clamp<hsize_t>(chunk[a], 1, shape[a]);
    check_status(H5Pset_chunk(properties.get(), static_cast<int>(chunk.size()), chunk.data()), "chunk dataset", path,
                 file_);
    if (storage.deflate_level > 0 && H5Zfilter_avail(H5Z_FILTER_DEFLATE) > 0) {
      if (storage.shuffle) check_status(H5Pset_shuffle(properties.get()), "set shuffle on dataset", path, file_);
      check_status(H5Pset_deflate(properties.get(), static_cast<unsigned>(std::min(storage.deflate_level, 9))),
                   "set deflate on dataset", path, file_);
    }
    if (storage.checksum) check_status(H5Pset_fletcher32(properties.get()), "set a checksum on dataset", path, file_);
  }
  Handle dataset(check_id(H5Dcreate2(id(), name.c_str(), file_type, space.get(), H5P_DEFAULT, properties.get(),
                                     H5P_DEFAULT),
                          "create dataset", path, file_),
                 H5Dclose);
  return Dataset(std::move(dataset), file_, path, shape);
}

ComplexDataset Group::create_complex(const std::string& name, const Shape& shape, const Storage& storage) const {
  return {create_dataset<double>(name + "_re", shape, storage), create_dataset<double>(name + "_im", shape, storage)};
}

ComplexDataset Group::write_complex(const std::string& name, std::span<const std::complex<double>> data,
                                    const Shape& shape, const Storage& storage) const {
  ComplexDataset d = create_complex(name, shape, storage);
  d.write(data);
  return d;
}

Dataset Group::write_text(const std::string& name, const std::vector<std::string>& texts, bool scalar) const {
  const std::string path = child_path(name);
  const std::size_t width = longest(texts);
  Handle type = string_type(width, path, file_);
  const Shape shape = scalar ? Shape{} : Shape{texts.size()};
  Handle space = simple_space(shape, path, file_);
  Handle dataset(check_id(H5Dcreate2(id(), name.c_str(), type.get(), space.get(), H5P_DEFAULT, H5P_DEFAULT,
                                     H5P_DEFAULT),
                          "create dataset", path, file_),
                 H5Dclose);
  const std::vector<char> buffer = pack_strings(texts, width);
  if (!texts.empty())
    check_status(H5Dwrite(dataset.get(), type.get(), H5S_ALL, H5S_ALL, H5P_DEFAULT, buffer.data()), "write dataset",
                 path, file_);
  return Dataset(std::move(dataset), file_, path, shape);
}

Dataset Group::write_string(const std::string& name, std::string_view text) const {
  return write_text(name, {std::string(text)}, /*scalar=*/true);
}

Dataset Group::write_strings(const std::string& name, const std::vector<std::string>& texts) const {
  return write_text(name, texts, /*scalar=*/false);
}

// ---- File ----

File File::create(const std::string& path) {
  silence_hdf5();
  // SEMI: closing fails while objects are open, instead of silently keeping the file open.
  Handle access(check_id(H5Pcreate(H5P_FILE_ACCESS), "make access properties for", "", path), H5Pclose);
  check_status(H5Pset_fclose_degree(access.get(), H5F_CLOSE_SEMI), "set the close degree of", "", path);
  return File(Handle(check_id(H5Fcreate(path.c_str(), H5F_ACC_TRUNC, H5P_DEFAULT, access.get()), "create", "", path),
                     H5Fclose),
              path);
}

File File::open(const std::string& path, bool writable) {
  silence_hdf5();
  Handle access(check_id(H5Pcreate(H5P_FILE_ACCESS), "make access properties for", "", path), H5Pclose);
  check_status(H5Pset_fclose_degree(access.get(), H5F_CLOSE_SEMI), "set the close degree of", "", path);
  return File(Handle(check_id(H5Fopen(path.c_str(), writable ? H5F_ACC_RDWR : H5F_ACC_RDONLY, access.get()), "open",
                              "", path),
                     H5Fclose),
              path);
}

void File::close() { check_status(handle_.close(), "close", "", file_); }

}  // namespace yeegap::io::h5
