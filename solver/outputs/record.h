// An output's result in the one shape every reader of results understands: named arrays with units,
// attributes, headline figures (a sweep's columns) and the rows `yeegap run` prints. The results
// writer, the run's summary and --json, and the sweep read records only, so a new output adds no
// code there. Plain data, no file format inside.
#pragma once

#include <complex>
#include <cstdint>
#include <span>
#include <string>
#include <variant>
#include <vector>

namespace yeegap::solver {

using AttributeValue =
    std::variant<std::string, double, std::int32_t, std::int64_t, std::vector<double>, std::vector<std::string>>;

struct Attribute {
  std::string name;
  AttributeValue value;
};

/// A large complex array the record does not copy: one view per index of its leading axis, into
/// the typed result it was made from (field maps), which must outlive the record.
using ComplexSlabs = std::vector<std::span<const std::complex<double>>>;

using ArrayValues = std::variant<std::vector<double>, std::vector<std::complex<double>>, std::vector<std::int32_t>,
                                 std::vector<std::int64_t>, ComplexSlabs>;

/// One named array. Units follow the results file's rule: "1" dimensionless, "none" for labels and
/// indices; SI otherwise, or the unit the name ends in (wavelength_nm).
struct Quantity {
  std::string name;
  std::string units;
  std::string description;            // one line; empty: none written
  ArrayValues values;
  std::vector<std::size_t> shape;     // C order; empty: one axis holding every value
  std::vector<Attribute> attributes;  // beyond units and description
  bool compressed = false;            // large smooth arrays: stored chunked and compressed
};

/// A scalar the output stands for (a spectrum's peak and where it is): the sweep's column
/// "<output>.<name>".
struct Headline {
  std::string name;
  std::string units;
  std::string description;
  double value = 0;
};

/// One cell of a printed row: on the terminal `before`, the value (times `scale`, formatted by
/// `spec`; a number that is not finite shows as "undefined") and `after`; in --json `key: value`,
/// unscaled. Without a key the cell is terminal only; without a spec, JSON only.
struct Cell {
  Cell(std::string key_, std::variant<double, std::string> value_, std::string spec_ = "{:.5g}", double scale_ = 1,
       std::string before_ = "  ", std::string after_ = "")
      : key(std::move(key_)), value(std::move(value_)), spec(std::move(spec_)), scale(scale_),
        before(std::move(before_)), after(std::move(after_)) {}
  std::string key;
  std::variant<double, std::string> value;
  std::string spec;
  double scale;
  std::string before, after;
};

/// A JSON-only cell.
inline Cell json_cell(std::string key, std::variant<double, std::string> value) {
  return Cell(std::move(key), std::move(value), "");
}

struct SummaryRow {
  SummaryRow(std::vector<Cell> cells_, bool on_terminal_ = true, bool in_json_ = true)
      : cells(std::move(cells_)), on_terminal(on_terminal_), in_json(in_json_) {}
  std::vector<Cell> cells;
  bool on_terminal;
  bool in_json;
};

/// What `yeegap run` prints for the output: a heading line, then the rows; --json gets the rows as
/// an array of objects under the output's name, or with `json_object` the cells of every row as
/// one object.
struct Summary {
  std::string heading;  // empty: no heading line
  std::vector<SummaryRow> rows;
  bool json_object = false;
};

struct Record {
  Record(std::string kind_, std::string name_) : kind(std::move(kind_)), name(std::move(name_)) {}
  std::string kind;  // the scene's word for the output: "flux", "cross_sections", ...
  std::string name;
  std::vector<Attribute> attributes;
  std::vector<Quantity> quantities;
  std::vector<Headline> headlines;
  Summary summary;

  Quantity& add(std::string quantity_name, std::string units, ArrayValues values, std::string description = {});
  const Quantity* find(const std::string& quantity_name) const;
  template <class T>
  void set(std::string attribute_name, T value) {
    attributes.push_back({std::move(attribute_name), AttributeValue(std::move(value))});
  }
};

/// omega (rad/s), wavelength_nm (vacuum) and photon_energy_eV, so a spectrum plots either way.
void add_frequency_axes(Record& r, const std::vector<double>& omegas);

/// The maximum of a sampled spectrum: the largest sample, refined by the parabola through it and
/// its two neighbours in frequency (when it is not at the band's edge), so a peak between two
/// samples moves smoothly across a sweep instead of jumping from sample to sample.
struct Peak {
  double omega = 0;  // rad/s
  double value = 0;
};
/// `omegas` in any order (sorted here), values aligned with them; both non-empty, equal sizes.
Peak spectrum_peak(const std::vector<double>& omegas, const std::vector<double>& values);

/// Headlines "<what>_peak" (in `units`) and "<what>_peak_wavelength_nm"; none for an empty spectrum.
void add_peak_headlines(Record& r, const std::string& what, const std::vector<double>& omegas,
                        const std::vector<double>& values, const std::string& units);

/// Throws (our bug, named by the output) unless every array has `n` entries.
void require_rows(const Record& r, std::size_t n, std::initializer_list<std::size_t> sizes, const char* what);

}  // namespace yeegap::solver
