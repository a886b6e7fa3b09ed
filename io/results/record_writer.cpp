// The generic half of the results file (record_writer.h): one group per record.
#include "io/results/record_writer.h"

#include <fmt/format.h>

#include <stdexcept>

namespace yeegap::io {

namespace {

void set(const h5::Object& o, const solver::Attribute& a) {
  std::visit([&](const auto& v) { o.set_attribute(a.name, v); }, a.value);
}

// Big arrays (field maps) are chunked and compressed; the shuffle filter groups the bytes of
// doubles by significance, which is what lets smooth fields compress at all.
h5::Storage storage_of(const solver::Quantity& q) {
  if (!q.compressed) return {};
  return {.chunk = {}, .deflate_level = 1, .shuffle = true};
}

void describe(const h5::Dataset& d, const solver::Quantity& q) {
  d.set_attribute("units", q.units);
  if (!q.description.empty()) d.set_attribute("description", q.description);
  for (const auto& a : q.attributes) set(d, a);
}

void require_count(const solver::Record& r, const solver::Quantity& q, std::size_t have, hsize_t want) {
  if (have != want)
    throw std::invalid_argument(fmt::format("{} '{}': quantity '{}' has {} values for a shape of {}", r.kind, r.name,
                                            q.name, have, want));
}

h5::Shape shape_of(const solver::Quantity& q, std::size_t count) {
  h5::Shape shape(q.shape.begin(), q.shape.end());
  if (shape.empty()) shape = {count};
  return shape;
}

hsize_t product(const h5::Shape& shape, std::size_t from = 0) {
  hsize_t n = 1;
  for (std::size_t a = from; a < shape.size(); ++a) n *= shape[a];
  return n;
}

template <class T>
void write_values(const h5::Group& g, const solver::Record& r, const solver::Quantity& q, const std::vector<T>& values) {
  const h5::Shape shape = shape_of(q, values.size());
  require_count(r, q, values.size(), product(shape));
  if constexpr (std::is_same_v<T, std::complex<double>>) {
    const h5::ComplexDataset d = g.write_complex(q.name, values, shape, storage_of(q));
    describe(d.re, q);
    describe(d.im, q);
  } else {
    describe(g.write(q.name, values, shape, storage_of(q)), q);
  }
}

// Written one slab at a time, so memory beyond the results themselves stays at one slab.
void write_values(const h5::Group& g, const solver::Record& r, const solver::Quantity& q,
                  const solver::ComplexSlabs& slabs) {
  const h5::Shape shape = shape_of(q, slabs.size());
  require_count(r, q, slabs.size(), shape[0]);
  const h5::ComplexDataset d = g.create_complex(q.name, shape, storage_of(q));
  describe(d.re, q);
  describe(d.im, q);
  for (std::size_t i = 0; i < slabs.size(); ++i) {
    require_count(r, q, slabs[i].size(), product(shape, 1));
    d.write_slab(i, slabs[i]);
  }
}

}  // namespace

void check_output_name(const h5::Group& outputs, const std::string& name) {
  if (name.empty() || name.find('/') != std::string::npos || name == "." || name == "..")
    throw std::invalid_argument(
        fmt::format("output name '{}' cannot be a group name (empty, '.', '..' or containing '/')", name));
  if (outputs.contains(name)) throw std::invalid_argument(fmt::format("two outputs are named '{}'", name));
}

void write_record(const h5::Group& outputs, const solver::Record& r) {
  check_output_name(outputs, r.name);
  const h5::Group g = outputs.create_group(r.name);
  g.set_attribute("kind", r.kind);
  for (const auto& a : r.attributes) set(g, a);
  for (const auto& q : r.quantities) std::visit([&](const auto& v) { write_values(g, r, q, v); }, q.values);
}

}  // namespace yeegap::io
