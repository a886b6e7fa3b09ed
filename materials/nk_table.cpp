// CSV reader for (wavelength, n, k) tables. Every user mistake is reported with file, line, column
// and column name (base/errors.h SceneError); see nk_table.h for the accepted layout.
#include "materials/nk_table.h"

#include <charconv>
#include <cmath>
#include <fstream>
#include <sstream>

#include <fmt/format.h>

#include "base/data_file.h"
#include "base/errors.h"
#include "base/units.h"

namespace yeegap::materials {

namespace {

struct Cell {
  std::string text;  // trimmed
  int column = 0;    // 1-based column of the cell's first character in its line
};

std::vector<Cell> split_cells(std::string_view line) {
  std::vector<Cell> cells;
  size_t start = 0;
  while (true) {
    const size_t comma = line.find(',', start);
    const size_t end = comma == std::string_view::npos ? line.size() : comma;
    size_t a = start, b = end;
    while (a < b && (line[a] == ' ' || line[a] == '\t')) ++a;
    while (b > a && (line[b - 1] == ' ' || line[b - 1] == '\t')) --b;
    cells.push_back({std::string(line.substr(a, b - a)), static_cast<int>(a) + 1});
    if (comma == std::string_view::npos) break;
    start = comma + 1;
  }
  return cells;
}

struct ColumnLayout {
  int wavelength = -1, n = -1, k = -1;  // cell index of each column
  double wavelength_unit = 0;           // metres per unit of the wavelength column
  std::vector<std::string> names;
};

// The range a table may cover: 1 pm to 1 m in wavelength, indices up to 1e4 (metals in the far
// infrared reach about 1e2; common practice, not a physical bound).
constexpr double table_shortest_wavelength = 1e-12, table_longest_wavelength = 1.0, table_largest_index = 1e4;
constexpr const char* expected_columns = "expected wavelength_nm (or wavelength_um, wavelength_m), n, k";

ColumnLayout read_header(const std::vector<Cell>& cells, const std::string& file, int line_number) {
  ColumnLayout layout;
  for (size_t c = 0; c < cells.size(); ++c) {
    const std::string& name = cells[c].text;
    const Where at{file, line_number, cells[c].column, name};
    int* slot = nullptr;
    if (name == "wavelength_nm" || name == "wavelength_um" || name == "wavelength_m") {
      slot = &layout.wavelength;
      layout.wavelength_unit = name == "wavelength_nm" ? units::nm : (name == "wavelength_um" ? units::um : 1.0);
    } else if (name == "n") {
      slot = &layout.n;
    } else if (name == "k") {
      slot = &layout.k;
    } else if (name == "wavelength") {
      throw SceneError(at, "the wavelength column needs its unit in the header: wavelength_nm, wavelength_um or wavelength_m");
    } else {
      throw SceneError(at, fmt::format("unknown column '{}' in the header ({})", name, expected_columns));
    }
    if (*slot >= 0) throw SceneError(at, fmt::format("column '{}' appears twice in the header", name));
    *slot = static_cast<int>(c);
    layout.names.push_back(name);
  }
  const Where header{file, line_number, 1, ""};
  if (layout.wavelength < 0) throw SceneError(header, fmt::format("missing wavelength column ({})", expected_columns));
  if (layout.n < 0) throw SceneError(header, fmt::format("missing column 'n' ({})", expected_columns));
  if (layout.k < 0) throw SceneError(header, fmt::format("missing column 'k' ({})", expected_columns));
  return layout;
}

double parse_number(const Cell& cell, const Where& at) {
  double value = 0;
  const char* first = cell.text.data();
  const char* last = first + cell.text.size();
  if (!cell.text.empty() && *first == '+') ++first;  // from_chars refuses a leading '+'
  const auto [end, error] = std::from_chars(first, last, value);
  if (cell.text.empty() || error != std::errc() || end != last || !std::isfinite(value))
    throw SceneError(at, fmt::format("'{}' is not a number", cell.text));
  return value;
}

}  // namespace

double NkTable::omega(size_t i) const { return units::wavelength_to_omega(wavelength[i]); }

std::complex<double> NkTable::permittivity(size_t i) const {
  const std::complex<double> index(n[i], k[i]);
  return index * index;
}

NkTable parse_nk_table(std::string_view text, const std::string& file, size_t min_rows) {
  NkTable table;
  table.file = file;
  ColumnLayout layout;
  bool have_header = false;
  int header_line = 0;
  int line_number = 0;
  size_t pos = 0;
  while (pos <= text.size()) {
    const size_t newline = text.find('\n', pos);
    std::string_view line = text.substr(pos, newline == std::string_view::npos ? std::string_view::npos : newline - pos);
    pos = newline == std::string_view::npos ? text.size() + 1 : newline + 1;
    ++line_number;
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    const size_t first = line.find_first_not_of(" \t");
    if (first == std::string_view::npos || line[first] == '#') continue;

    const std::vector<Cell> cells = split_cells(line);
    if (!have_header) {
      layout = read_header(cells, file, line_number);
      have_header = true;
      header_line = line_number;
      continue;
    }
    if (cells.size() != layout.names.size())
      throw SceneError(Where{file, line_number, 1, ""},
                       fmt::format("row has {} cells but the header (line {}) names {} columns", cells.size(),
                                   header_line, layout.names.size()));
    const auto value = [&](int c) {
      return parse_number(cells[c], Where{file, line_number, cells[c].column, layout.names[c]});
    };
    const Cell& wl_cell = cells[layout.wavelength];
    const Where wl_at{file, line_number, wl_cell.column, layout.names[layout.wavelength]};
    const double wavelength = value(layout.wavelength) * layout.wavelength_unit;
    const double n = value(layout.n);
    const double k = value(layout.k);
    if (!(wavelength > 0)) throw SceneError(wl_at, fmt::format("wavelength must be positive, got '{}'", wl_cell.text));
    // Bounds far outside optics but inside what the pole fit can represent: a wavelength of 1e-310 m
    // gave an infinite frequency, k = 1e87 a permittivity that overflows (both found by fuzzing).
    if (!(wavelength >= table_shortest_wavelength && wavelength <= table_longest_wavelength))
      throw SceneError(wl_at, fmt::format("wavelength {} m is outside what a table can hold ({:g} m to {:g} m)", wavelength,
                                          table_shortest_wavelength, table_longest_wavelength));
    if (!(n <= table_largest_index))
      throw SceneError(Where{file, line_number, cells[layout.n].column, "n"},
                       fmt::format("n must be at most {:g}, got '{}'", table_largest_index, cells[layout.n].text));
    if (!(k <= table_largest_index))
      throw SceneError(Where{file, line_number, cells[layout.k].column, "k"},
                       fmt::format("k must be at most {:g}, got '{}'", table_largest_index, cells[layout.k].text));
    if (n < 0)
      throw SceneError(Where{file, line_number, cells[layout.n].column, "n"},
                       fmt::format("n must be non-negative, got '{}'", cells[layout.n].text));
    if (k < 0)
      throw SceneError(Where{file, line_number, cells[layout.k].column, "k"},
                       fmt::format("k must be non-negative (exp(-i omega t): k < 0 would be gain), got '{}'",
                                   cells[layout.k].text));
    const size_t rows = table.wavelength.size();
    if (rows >= 1) {
      const double previous = table.wavelength[rows - 1];
      if (wavelength == previous)
        throw SceneError(wl_at, fmt::format("wavelength {} repeats line {}", wl_cell.text, table.line[rows - 1]));
      if (rows >= 2) {
        const bool rising = table.wavelength[1] > table.wavelength[0];
        if ((wavelength > previous) != rising)
          throw SceneError(wl_at, fmt::format("wavelengths must be monotonic: {} follows {} on line {}, but the "
                                              "table started {}",
                                              wl_cell.text, previous / layout.wavelength_unit, table.line[rows - 1],
                                              rising ? "increasing" : "decreasing"));
      }
    }
    table.wavelength.push_back(wavelength);
    table.n.push_back(n);
    table.k.push_back(k);
    table.line.push_back(line_number);
  }
  if (!have_header)
    throw SceneError(Where{file, 0, 0, ""}, fmt::format("no header line ({})", expected_columns));
  if (table.size() < min_rows)
    throw SceneError(Where{file, table.line.empty() ? header_line : table.line.back(), 1, ""},
                     fmt::format("the table has {} data rows; at least {} are needed", table.size(), min_rows));
  return table;
}

NkTable read_nk_table(const std::string& path, size_t min_rows) {
  // 64 MiB: a million rows, far more than any measured n, k table.
  const std::string text = read_data_file(path, "table file", std::uintmax_t{1} << 26, Where{path, 0, 0, ""});
  return parse_nk_table(text, path, min_rows);
}

}  // namespace yeegap::materials
