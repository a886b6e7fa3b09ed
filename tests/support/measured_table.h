// Measured figures that a test prints and a page quotes: a table between the lines
// "<!-- measured: NAME by tests/...cpp -->" and "<!-- end measured -->", or a figure inside a line,
// "<!-- measured: NAME by tests/...cpp -->TEXT<!-- /measured -->". The test fails where page and run
// disagree beyond a figure's last printed digit; YEEGAP_WRITE_MEASURED=1 writes the run's instead.
#pragma once

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "table_agreement.h"

namespace yeegap::test_support {

// x with `digits` significant digits, plain notation ("0.0330", "6.15", "163"); `sign` adds '+'.
inline std::string significant(double x, int digits, bool sign = false) {
  if (x == 0) return "0";
  const int exponent = static_cast<int>(std::floor(std::log10(std::abs(x))));
  const int decimals = std::max(0, digits - 1 - exponent);
  char text[64];
  std::snprintf(text, sizeof text, sign ? "%+.*f" : "%.*f", decimals, x);
  return text;
}

// x with a fixed number of decimals ("3.567", "+0.137").
inline std::string fixed(double x, int decimals, bool sign = false) {
  char text[64];
  std::snprintf(text, sizeof text, sign ? "%+.*f" : "%.*f", decimals, x);
  return text;
}

namespace detail {

inline std::vector<std::string> read_lines(const std::string& path) {
  std::ifstream in(path);
  std::vector<std::string> lines;
  for (std::string line; std::getline(in, line);) lines.push_back(line);
  return lines;
}

inline void write_lines(const std::string& path, const std::vector<std::string>& lines) {
  std::ofstream out(path);
  for (const auto& line : lines) out << line << '\n';
}

inline bool writing_pages() {
  const char* write = std::getenv("YEEGAP_WRITE_MEASURED");
  return write && *write && std::string(write) != "0";
}

inline std::string page_path(const std::string& page) { return std::string(YEEGAP_SOURCE_DIR) + "/" + page; }

inline void report(const std::string& page, const std::string& name, const std::vector<std::string>& problems) {
  for (const auto& problem : problems)
    ADD_FAILURE() << page << ", figure '" << name << "': " << problem
                  << " (tools/docs/measured_tables.sh write writes the measured figures into the pages)";
}

}  // namespace detail

// A table quoted whole. page: a path from the repository's root ("docs/measurements.md").
// x in powers of ten with `decimals` after the point, the exponent unpadded ("3.4e-7", "2.1e-4").
inline std::string scientific(double x, int decimals) {
  char text[64];
  std::snprintf(text, sizeof text, "%.*e", decimals, x);
  std::string s = text;
  const auto e = s.find('e');
  const int exponent = std::stoi(s.substr(e + 1));
  return s.substr(0, e) + "e" + std::to_string(exponent);
}

class MeasuredTable {
 public:
  MeasuredTable(std::string page, std::string name, std::vector<std::string> header)
      : page_(std::move(page)), name_(std::move(name)), header_(std::move(header)) {}

  void add_row(std::vector<std::string> cells) { rows_.push_back(std::move(cells)); }

  std::vector<std::string> lines() const {
    std::string rule = "|";
    for (std::size_t i = 0; i < header_.size(); ++i) rule += "---|";
    std::vector<std::string> out{row_line(header_), rule};
    for (const auto& row : rows_) out.push_back(row_line(row));
    return out;
  }

  // Prints the table, then compares it with the page (a gtest failure per disagreement) or, with
  // YEEGAP_WRITE_MEASURED set, writes it there.
  void check_against_page() const {
    const auto table = lines();
    std::printf("\n%s (%s):\n", name_.c_str(), page_.c_str());
    for (const auto& line : table) std::printf("%s\n", line.c_str());
    std::vector<std::string> page_lines = detail::read_lines(detail::page_path(page_));
    const PageBlock block = find_block(page_lines, name_);
    ASSERT_TRUE(block.found) << page_ << " has no block '<!-- measured: " << name_ << " by ... -->' ... "
                             << "'<!-- end measured -->'";
    if (detail::writing_pages()) {
      page_lines.erase(page_lines.begin() + block.first, page_lines.begin() + block.last);
      page_lines.insert(page_lines.begin() + block.first, table.begin(), table.end());
      detail::write_lines(detail::page_path(page_), page_lines);
      std::printf("wrote table '%s' into %s\n", name_.c_str(), page_.c_str());
      return;
    }
    const std::vector<std::string> quoted(page_lines.begin() + block.first, page_lines.begin() + block.last);
    detail::report(page_, name_, table_disagreements(quoted, table));
  }

 private:
  static std::string row_line(const std::vector<std::string>& cells) {
    std::string line = "|";
    for (const auto& cell : cells) line += cell.empty() ? " |" : " " + cell + " |";
    return line;
  }

  std::string page_, name_;
  std::vector<std::string> header_;
  std::vector<std::vector<std::string>> rows_;
};

// A figure quoted inside a line of a page (a table cell, a sentence): the same comparison as a
// table's, on the text between the markers.
inline void check_figure_against_page(const std::string& page, const std::string& name, const std::string& text) {
  std::printf("\n%s (%s): %s\n", name.c_str(), page.c_str(), text.c_str());
  std::vector<std::string> page_lines = detail::read_lines(detail::page_path(page));
  const PageFigure figure = find_figure(page_lines, name);
  ASSERT_TRUE(figure.found) << page << " has no figure '<!-- measured: " << name << " by ... -->...<!-- /measured -->'";
  std::string& line = page_lines[figure.line];
  if (detail::writing_pages()) {
    line.replace(figure.begin, figure.end - figure.begin, text);
    detail::write_lines(detail::page_path(page), page_lines);
    std::printf("wrote figure '%s' into %s\n", name.c_str(), page.c_str());
    return;
  }
  detail::report(page, name, table_disagreements({line.substr(figure.begin, figure.end - figure.begin)}, {text}));
}

}  // namespace yeegap::test_support
