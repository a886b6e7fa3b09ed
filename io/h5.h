// A thin RAII layer over the HDF5 1.10 C API (the C++ API does not exist for parallel HDF5): files,
// groups, N-d datasets (optional chunking, deflate), complex arrays as <name>_re/<name>_im, strings as
// fixed-length ASCII (docs/results_file.md says why). Reads back only what we write. Every failure
// throws std::runtime_error naming file, object and HDF5's innermost message; its own printing is off.
#pragma once

#include <hdf5.h>

#include <complex>
#include <cstdint>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace yeegap::io::h5 {

/// Dataset extents, slowest axis first (C order): a field (nz, ny, nx) has x fastest.
using Shape = std::vector<hsize_t>;

/// How a dataset is laid out on disk. Deflate needs chunks: with deflate_level > 0 and no chunk
/// given, chunk_for() picks one. Datasets with a zero extent are always stored contiguous.
/// If the HDF5 library lacks the deflate filter, data is stored uncompressed (compression is
/// only a size optimisation, never needed to read the file).
struct Storage {
  Shape chunk;             // empty = contiguous (unless deflate asks for chunks)
  int deflate_level = 0;   // 0 = none, 1..9 = zlib level
  bool shuffle = false;    // byte shuffle before deflate: helps floating-point data compress
  bool checksum = false;   // Fletcher32 per chunk (needs chunks, picked as for deflate): a damaged
                           // chunk fails to read instead of giving wrong numbers
};

/// A chunk shape for `shape` of at most about `target_bytes`: the slowest axes are halved first,
/// so a chunk is a run of whole x-rows (x fastest) and reading one frequency or one z-slice
/// touches few chunks. 1 MiB matches HDF5's default chunk cache.
Shape chunk_for(const Shape& shape, std::size_t element_size, std::size_t target_bytes = std::size_t{1} << 20);

namespace detail {
template <class T>
struct Native;  // memory type (this machine) and file type (fixed little-endian) of T
template <>
struct Native<double> {
  static hid_t memory() { return H5T_NATIVE_DOUBLE; }
  static hid_t file() { return H5T_IEEE_F64LE; }
};
template <>
struct Native<float> {
  static hid_t memory() { return H5T_NATIVE_FLOAT; }
  static hid_t file() { return H5T_IEEE_F32LE; }
};
template <>
struct Native<std::int32_t> {
  static hid_t memory() { return H5T_NATIVE_INT32; }
  static hid_t file() { return H5T_STD_I32LE; }
};
template <>
struct Native<std::int64_t> {
  static hid_t memory() { return H5T_NATIVE_INT64; }
  static hid_t file() { return H5T_STD_I64LE; }
};
template <>
struct Native<std::uint8_t> {
  static hid_t memory() { return H5T_NATIVE_UINT8; }
  static hid_t file() { return H5T_STD_U8LE; }
};
}  // namespace detail

/// Owns one HDF5 identifier and closes it with the matching H5?close. Move-only.
class Handle {
 public:
  using Closer = herr_t (*)(hid_t);
  Handle() = default;
  Handle(hid_t id, Closer closer) : id_(id), close_(closer) {}
  ~Handle() { reset(); }
  Handle(Handle&& o) noexcept : id_(o.id_), close_(o.close_) { o.id_ = H5I_INVALID_HID; }
  Handle& operator=(Handle&& o) noexcept;
  Handle(const Handle&) = delete;
  Handle& operator=(const Handle&) = delete;

  hid_t get() const { return id_; }
  bool valid() const { return id_ >= 0; }
  /// Closes now and returns HDF5's status (negative = failed); the handle is empty afterwards.
  herr_t close();
  /// Closes, ignoring failures: for destructors and unwinding, where nothing can be reported.
  void reset() noexcept;

 private:
  hid_t id_ = H5I_INVALID_HID;
  Closer close_ = nullptr;
};

/// A file, group or dataset: something attributes hang on. Knows its file name and its path
/// inside the file, which every error message names.
class Object {
 public:
  const std::string& file_name() const { return file_; }
  const std::string& path() const { return path_; }
  hid_t id() const { return handle_.get(); }

  // Attributes; an existing attribute of the same name is replaced.
  void set_attribute(std::string_view name, std::string_view value) const;  // fixed-length ASCII
  void set_attribute(std::string_view name, const char* value) const { set_attribute(name, std::string_view(value)); }
  void set_attribute(std::string_view name, const std::vector<std::string>& values) const;
  void set_attribute(std::string_view name, double value) const;
  void set_attribute(std::string_view name, std::int32_t value) const;
  void set_attribute(std::string_view name, std::int64_t value) const;
  void set_attribute(std::string_view name, const std::vector<double>& values) const;

  // Reading attributes back; a missing attribute or one of another kind throws, naming both.
  bool has_attribute(std::string_view name) const;
  std::string string_attribute(std::string_view name) const;
  /// A string attribute that is scalar (a list of one) or 1-d (as written from a vector of strings).
  std::vector<std::string> string_attributes(std::string_view name) const;
  std::int64_t int_attribute(std::string_view name) const;   // any integer attribute, scalar
  double double_attribute(std::string_view name) const;      // a floating-point attribute, scalar

 protected:
  Object(Handle handle, std::string file, std::string path)
      : handle_(std::move(handle)), file_(std::move(file)), path_(std::move(path)) {}
  std::string child_path(std::string_view name) const;
  void write_attribute(std::string_view name, hid_t memory_type, hid_t file_type, const void* data,
                       const Shape& shape) const;

  Handle handle_;
  std::string file_;
  std::string path_;
};

class Dataset : public Object {
 public:
  const Shape& shape() const { return shape_; }
  std::size_t size() const;  // number of elements

  /// Writes the whole dataset; data.size() must equal the product of the shape.
  template <class T>
  void write(std::span<const T> data) const {
    write_selection(detail::Native<T>::memory(), data.data(), data.size(), std::nullopt);
  }
  /// Writes the slab [index, ...] along the slowest axis: data.size() = product of the other extents.
  template <class T>
  void write_slab(hsize_t index, std::span<const T> data) const {
    write_selection(detail::Native<T>::memory(), data.data(), data.size(), index);
  }

  /// Whether the stored elements are exactly T's file type, so reading converts nothing.
  template <class T>
  bool stores() const {
    return stores_type(detail::Native<T>::file());
  }
  /// Reads the whole dataset; data.size() must equal size(). HDF5 converts to T if needed.
  template <class T>
  void read(std::span<T> data) const {
    read_all(detail::Native<T>::memory(), data.data(), data.size());
  }
  /// The whole dataset as a vector (C order, any shape); HDF5 converts to T if needed.
  template <class T>
  std::vector<T> read_vector() const {
    std::vector<T> values(size());
    read(std::span<T>(values));
    return values;
  }
  /// The text of a scalar string dataset (as written by Group::write_string).
  std::string read_string() const;
  /// A 1-d dataset of fixed-length strings (Group::write_strings), or a scalar one as a list of
  /// one; the NUL padding removed.
  std::vector<std::string> read_strings() const;

 private:
  friend class Group;
  bool stores_type(hid_t file_type) const;
  void read_all(hid_t memory_type, void* data, std::size_t count) const;
  Dataset(Handle handle, std::string file, std::string path, Shape shape)
      : Object(std::move(handle), std::move(file), std::move(path)), shape_(std::move(shape)) {}
  void write_selection(hid_t memory_type, const void* data, std::size_t count, std::optional<hsize_t> slab) const;
  Shape shape_;
};

/// A complex array stored as two real datasets of the same shape, `<name>_re` and `<name>_im`.
/// Chosen over a trailing axis of length 2 so each part is an ordinary (…, nz, ny, nx) array that
/// a viewer description can point at directly, and h5py reads it as re + 1j*im.
struct ComplexDataset {
  Dataset re, im;
  void write(std::span<const std::complex<double>> data) const;
  void write_slab(hsize_t index, std::span<const std::complex<double>> data) const;
};

class Group : public Object {
 public:
  Group create_group(const std::string& name) const;
  Group open_group(const std::string& name) const;
  /// Opens an existing dataset (its shape is read from the file).
  Dataset open_dataset(const std::string& name) const;
  bool contains(const std::string& name) const;
  /// Names of the links in this group, in name order.
  std::vector<std::string> members() const;
  /// Whether `path` ("a/b/c", below this group) names an object; each link on the way is checked,
  /// since HDF5 fails rather than answers when a middle one is missing.
  bool exists(const std::string& path) const;

  /// Creates a dataset of element type T, to be filled with Dataset::write or write_slab.
  template <class T>
  Dataset create_dataset(const std::string& name, const Shape& shape, const Storage& storage = {}) const {
    return create(name, detail::Native<T>::file(), sizeof(T), shape, storage);
  }
  /// Creates and writes in one go.
  template <class T>
  Dataset write(const std::string& name, std::span<const T> data, const Shape& shape,
                const Storage& storage = {}) const {
    Dataset d = create_dataset<T>(name, shape, storage);
    d.write(data);
    return d;
  }
  template <class T>
  Dataset write(const std::string& name, const std::vector<T>& data, const Shape& shape,
                const Storage& storage = {}) const {
    return write(name, std::span<const T>(data), shape, storage);
  }
  /// A 1-d dataset of the whole vector.
  template <class T>
  Dataset write(const std::string& name, const std::vector<T>& data, const Storage& storage = {}) const {
    return write(name, std::span<const T>(data), Shape{data.size()}, storage);
  }

  ComplexDataset create_complex(const std::string& name, const Shape& shape, const Storage& storage = {}) const;
  ComplexDataset write_complex(const std::string& name, std::span<const std::complex<double>> data,
                               const Shape& shape, const Storage& storage = {}) const;

  /// A scalar fixed-length ASCII string dataset (for text too long for an attribute).
  Dataset write_string(const std::string& name, std::string_view text) const;
  /// A 1-d dataset of fixed-length ASCII strings, padded with NULs to the longest.
  Dataset write_strings(const std::string& name, const std::vector<std::string>& texts) const;

 protected:
  Group(Handle handle, std::string file, std::string path)
      : Object(std::move(handle), std::move(file), std::move(path)) {}

 private:
  Dataset create(const std::string& name, hid_t file_type, std::size_t element_size, const Shape& shape,
                 const Storage& storage) const;
  Dataset write_text(const std::string& name, const std::vector<std::string>& texts, bool scalar) const;
};

/// An HDF5 file; as a Group it is the root "/". Closing fails (throws) while groups or datasets
/// of the file are still open, so an early close cannot silently leave the file unfinished.
class File : public Group {
 public:
  /// Creates `path`, replacing an existing file of that name.
  static File create(const std::string& path);
  /// Opens an existing file, read-only unless `writable`.
  static File open(const std::string& path, bool writable = false);
  /// Flushes and closes; throws if HDF5 reports a failure. The destructor closes quietly.
  void close();

 private:
  File(Handle handle, std::string file) : Group(std::move(handle), std::move(file), "/") {}
};

}  // namespace yeegap::io::h5
