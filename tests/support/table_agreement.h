// Comparing a Markdown table quoted in a page with the one a run printed: the text around the
// numbers must match, and each number within one unit of the last digit the page prints (a rerun
// on another compiler may move that digit; docs/measurements.md says so).
#pragma once

#include <cmath>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

namespace yeegap::test_support {

struct PageBlock {
  bool found = false;
  std::size_t first = 0, last = 0;  // the table's lines are [first, last)
};

// The lines between "<!-- measured: NAME ..." and the next "<!-- end measured -->".
inline PageBlock find_block(const std::vector<std::string>& lines, const std::string& name) {
  const std::string start = "<!-- measured: " + name + " ";
  for (std::size_t i = 0; i < lines.size(); ++i) {
    if (lines[i].rfind(start, 0) != 0) continue;
    for (std::size_t j = i + 1; j < lines.size(); ++j)
      if (lines[j].rfind("<!-- end measured -->", 0) == 0) return {true, i + 1, j};
    return {};
  }
  return {};
}

// A figure quoted inside a line: "<!-- measured: NAME by FILE -->TEXT<!-- /measured -->". Returns
// the line's index and where TEXT starts and ends in it.
struct PageFigure {
  bool found = false;
  std::size_t line = 0, begin = 0, end = 0;
};

inline PageFigure find_figure(const std::vector<std::string>& lines, const std::string& name) {
  const std::string start = "<!-- measured: " + name + " ", close = "<!-- /measured -->";
  for (std::size_t i = 0; i < lines.size(); ++i) {
    const auto at = lines[i].find(start);
    if (at == std::string::npos) continue;
    const auto text = lines[i].find("-->", at);
    const auto stop = text == std::string::npos ? text : lines[i].find(close, text);
    if (stop == std::string::npos) return {};
    return {true, i, text + 3, stop};
  }
  return {};
}

namespace detail {

inline const std::regex& number_pattern() {
  static const std::regex pattern(R"([+-]?[0-9]+(\.[0-9]+)?([eE][+-]?[0-9]+)?)");
  return pattern;
}

// One unit of the last digit printed in `text` ("0.033" -> 0.001, "1.5e-3" -> 1e-4, "163" -> 1).
inline double last_digit_unit(const std::string& text) {
  const auto e = text.find_first_of("eE");
  const std::string mantissa = text.substr(0, e);
  const auto dot = mantissa.find('.');
  const int decimals = dot == std::string::npos ? 0 : static_cast<int>(mantissa.size() - dot - 1);
  const int exponent = e == std::string::npos ? 0 : std::stoi(text.substr(e + 1));
  return std::pow(10.0, exponent - decimals);
}

inline std::vector<std::string> numbers_in(const std::string& cell, std::string& skeleton) {
  std::vector<std::string> numbers;
  skeleton.clear();
  auto at = cell.cbegin();
  for (std::sregex_iterator it(cell.begin(), cell.end(), number_pattern()), end; it != end; ++it) {
    skeleton.append(at, (*it)[0].first);
    skeleton += '#';
    numbers.push_back(it->str());
    at = (*it)[0].second;
  }
  skeleton.append(at, cell.cend());
  return numbers;
}

}  // namespace detail

// Where the page's table and the run's differ, one line each; empty when they agree.
inline std::vector<std::string> table_disagreements(const std::vector<std::string>& page,
                                                    const std::vector<std::string>& run) {
  std::vector<std::string> problems;
  if (page.size() != run.size()) {
    problems.push_back("the page quotes " + std::to_string(page.size()) + " lines, the run printed " +
                       std::to_string(run.size()));
    return problems;
  }
  for (std::size_t row = 0; row < page.size(); ++row) {
    std::string page_skeleton, run_skeleton;
    const auto quoted = detail::numbers_in(page[row], page_skeleton);
    const auto measured = detail::numbers_in(run[row], run_skeleton);
    const std::string where = "line " + std::to_string(row + 1) + " ('" + page[row] + "' against '" + run[row] + "')";
    if (page_skeleton != run_skeleton || quoted.size() != measured.size()) {
      problems.push_back(where + ": the text differs");
      continue;
    }
    for (std::size_t k = 0; k < quoted.size(); ++k) {
      const double unit = detail::last_digit_unit(quoted[k]);
      if (std::abs(std::stod(quoted[k]) - std::stod(measured[k])) > 1.000001 * unit)
        problems.push_back(where + ": " + quoted[k] + " quoted, " + measured[k] + " measured");
    }
  }
  return problems;
}

}  // namespace yeegap::test_support
