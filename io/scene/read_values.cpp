// Typed readers for scene values (see read_values.h). Range checks are written `!(x > 0)` so that a
// NaN fails them too.
#include "io/scene/read_values.h"

#include <algorithm>
#include <charconv>
#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "io/suggest.h"

namespace yeegap::io {
namespace {

// A range of more points than this is almost surely a typo, and each point costs a DFT per cell.
constexpr long max_frequency_count = 100000;

/// A plain value's text, or an error saying that `expected` was wanted.
std::string scalar_text(const Node& v, const std::string& expected) {
  if (!v.is_scalar()) v.fail(fmt::format("must be {}, got {}", expected, v.found()));
  return v.text();
}

std::string example_of(Dimension d) {
  switch (d) {
    case Dimension::length: return "'40 nm'";
    case Dimension::time: return "'20 fs'";
    case Dimension::spectral: return "'600 nm', '2 eV' or '500 THz'";
    case Dimension::conductivity: return "'1e4 S/m'";
    case Dimension::dipole_moment: return "'1e-30 C m'";
  }
  return "";
}

}  // namespace

double read_number(const Node& v) {
  const std::string expected = "a plain number";
  const std::string text = scalar_text(v, expected);
  const auto q = split_number_unit(text);
  if (!q) v.fail(fmt::format("must be {}, got '{}'", expected, text));
  if (!q->unit.empty()) v.fail(fmt::format("must be {} without a unit, got '{}'", expected, text));
  return q->value;
}

double read_positive_number(const Node& v) {
  const double x = read_number(v);
  if (!(x > 0)) v.fail(fmt::format("must be a positive number, got '{}'", v.text()));
  return x;
}

long read_whole_number(const Node& v, long min) {
  const std::string expected = fmt::format("a whole number of at least {}", min);
  const std::string text = scalar_text(v, expected);
  long n = 0;
  const char* first = text.data();
  const char* last = text.data() + text.size();
  if (first != last && *first == '+') ++first;
  const auto [end, ec] = std::from_chars(first, last, n);
  if (ec != std::errc() || end != last) v.fail(fmt::format("must be {}, got '{}'", expected, text));
  if (n < min) v.fail(fmt::format("must be {}, got '{}'", expected, text));
  return n;
}

bool read_flag(const Node& v) {
  const std::string text = scalar_text(v, "true or false");
  if (text == "true") return true;
  if (text == "false") return false;
  v.fail(fmt::format("must be true or false, got '{}'", text));
}

std::string read_text(const Node& v) { return scalar_text(v, "a plain value"); }

std::string read_word(const Node& v, const std::vector<std::string>& choices, const std::vector<std::string>& planned) {
  const std::string expected = fmt::format("one of: {}", fmt::join(choices, ", "));
  const std::string word = scalar_text(v, expected);
  if (std::find(choices.begin(), choices.end(), word) != choices.end()) return word;
  if (std::find(planned.begin(), planned.end(), word) != planned.end())
    v.fail(fmt::format("'{}' is not available in this version; available: {}", word, fmt::join(choices, ", ")));
  v.fail(fmt::format("unknown word '{}'{}", word, suggestion(word, choices)));
}

double read_quantity(const Node& v, Dimension d, const std::string& expected) {
  const std::string text = scalar_text(v, expected);
  const auto q = split_number_unit(text);
  if (!q) v.fail(fmt::format("must be {}, got '{}'", expected, text));
  const std::vector<std::string> units = units_of(d);
  if (q->unit.empty()) {
    if (d == Dimension::length) return q->value * *to_si(d, 1.0, "nm");  // the documented default
    if (d == Dimension::spectral)
      v.fail(fmt::format("a bare number is ambiguous for a spectral value: write a wavelength ('600 nm'), "
                         "a photon energy ('2 eV') or a frequency ('500 THz'), got '{}'", text));
    v.fail(fmt::format("needs a unit ({}), got '{}'", fmt::join(units, ", "), text));
  }
  const bool accepted = d == Dimension::spectral ? spectral_to_omega(1.0, q->unit).has_value()
                                                 : to_si(d, 1.0, q->unit).has_value();
  if (!accepted) {
    if (auto other = dimension_of_unit(q->unit))
      v.fail(fmt::format("'{}' is a {} unit, but this must be {} (units: {}), got '{}'", q->unit,
                         dimension_name(*other), expected, fmt::join(units, ", "), text));
    v.fail(fmt::format("unknown unit '{}' in '{}'{}", q->unit, text, suggestion(q->unit, units)));
  }
  if (d == Dimension::spectral) {
    if (!(q->value > 0) && !(q->value == 0 && dimension_of_unit(q->unit) == Dimension::spectral))
      v.fail(fmt::format("must be {}, got '{}'", expected, text));
    // 1e300 THz or a wavelength of 1e-308 m overflow to an infinite frequency (found by fuzzing).
    const auto omega = spectral_to_omega(q->value, q->unit);
    if (!omega || !std::isfinite(*omega)) v.fail(fmt::format("is beyond any frequency a run can hold, got '{}'", text));
    return *omega;
  }
  const auto si = to_si(d, q->value, q->unit);
  if (!si || !std::isfinite(*si)) v.fail(fmt::format("overflows once converted to SI units, got '{}'", text));
  return *si;
}

double read_length(const Node& v) {
  return read_quantity(v, Dimension::length, fmt::format("a length like {}", example_of(Dimension::length)));
}

double read_positive_length(const Node& v) {
  const double x = read_length(v);
  if (!(x > 0)) v.fail(fmt::format("must be a positive length, got '{}'", v.text()));
  return x;
}

double read_positive_time(const Node& v) {
  const double t = read_quantity(v, Dimension::time, fmt::format("a time like {}", example_of(Dimension::time)));
  if (!(t > 0)) v.fail(fmt::format("must be a positive time, got '{}'", v.text()));
  return t;
}

double read_omega(const Node& v, bool allow_zero) {
  const std::string expected =
      fmt::format("a {}spectral value like {}", allow_zero ? "" : "positive ", example_of(Dimension::spectral));
  const double omega = read_quantity(v, Dimension::spectral, expected);
  if (!(omega > 0) && !(allow_zero && omega == 0)) v.fail(fmt::format("must be {}, got '{}'", expected, v.text()));
  return omega;
}

double read_energy(const Node& v) {
  const std::string expected = "a positive energy like '5.1 eV'";
  const std::string text = scalar_text(v, expected);
  const auto q = split_number_unit(text);
  if (!q || (q->unit != "eV" && q->unit != "meV") || !(q->value > 0))
    v.fail(fmt::format("must be {} (units: eV, meV), got '{}'", expected, text));
  return q->value * (q->unit == "eV" ? 1.0 : 1e-3) * constants::eV;
}

double read_conductivity(const Node& v) {
  const double s = read_quantity(v, Dimension::conductivity,
                                 fmt::format("a conductivity like {}", example_of(Dimension::conductivity)));
  if (!(s >= 0)) v.fail(fmt::format("must be a conductivity of at least 0 S/m, got '{}'", v.text()));
  return s;
}

double read_dipole_moment(const Node& v) {
  const double p = read_quantity(v, Dimension::dipole_moment,
                                 fmt::format("a dipole moment like {}", example_of(Dimension::dipole_moment)));
  if (!(p > 0)) v.fail(fmt::format("must be a positive dipole moment, got '{}'", v.text()));
  return p;
}

double read_angle(const Node& v, const std::string& expected) {
  if (!v.is_scalar()) v.fail(fmt::format("must be {}, got {}", expected, v.found()));
  const auto q = split_number_unit(v.text());
  if (!q || !std::isfinite(q->value)) v.fail(fmt::format("must be {}, got '{}'", expected, v.text()));
  if (q->unit == "deg" || q->unit == "\xC2\xB0") return q->value * constants::pi / 180.0;
  if (q->unit == "rad") return q->value;
  if (q->unit.empty()) v.fail(fmt::format("must be {} (the unit says which), got '{}'", expected, v.text()));
  v.fail(fmt::format("'{}' is not an angle unit{}", q->unit, suggestion(q->unit, {"deg", "rad"})));
}

Vec3 read_position(const Node& v) {
  if (!v.is_list() || v.items().size() != 3)
    v.fail(fmt::format("must be a point [x, y, z] of three lengths, got {}", v.found()));
  const auto items = v.items();
  return {read_length(items[0]), read_length(items[1]), read_length(items[2])};
}

Vec3 read_extent(const Node& v) {
  if (v.is_scalar()) {
    const double s = read_positive_length(v);
    return {s, s, s};
  }
  if (!v.is_list() || v.items().size() != 3)
    v.fail(fmt::format("must be one positive length or a list [x, y, z] of three, got {}", v.found()));
  const auto items = v.items();
  return {read_positive_length(items[0]), read_positive_length(items[1]), read_positive_length(items[2])};
}

int read_axis(const Node& v) {
  const std::string w = read_word(v, {"x", "y", "z"});
  return static_cast<int>(w[0] - 'x');
}

Vec3 read_direction(const Node& v) {
  if (v.is_scalar()) {
    const std::string w = read_word(v, {"x", "y", "z", "-x", "-y", "-z", "+x", "+y", "+z"});
    Vec3 d;
    d[static_cast<int>(w.back() - 'x')] = w.front() == '-' ? -1.0 : 1.0;
    return d;
  }
  if (!v.is_list() || v.items().size() != 3)
    v.fail(fmt::format("must be x, y, z or a vector [a, b, c] of three numbers, got {}", v.found()));
  const auto items = v.items();
  const Vec3 d{read_number(items[0]), read_number(items[1]), read_number(items[2])};
  const double length = norm(d);
  if (!(length > 0)) v.fail(fmt::format("must not be the zero vector, got {}", v.text()));
  return (1.0 / length) * d;
}

std::pair<double, double> read_band(const Node& v) {
  v.allow({"from", "to"});
  if (!v.is_map()) v.fail("must be a block {from: ..., to: ...} of two spectral values");
  const double a = read_omega(v.require("from"));
  const Node to = v.require("to");
  const double b = read_omega(to);
  if (a == b) to.fail(fmt::format("must differ from 'from' to make a band, got '{}'", to.text()));
  return {std::min(a, b), std::max(a, b)};
}

std::vector<double> read_frequencies(const Node& v) {
  if (v.is_scalar()) return {read_omega(v)};
  if (v.is_list()) {
    std::vector<double> out;
    for (const Node& item : v.items()) out.push_back(read_omega(item));
    if (out.empty()) v.fail("must hold at least one spectral value");
    return out;
  }
  if (!v.is_map())
    v.fail(fmt::format("must be a list of spectral values or {{from, to, count}}, got {}", v.found()));
  v.allow({"from", "to", "count"});
  const double a = read_omega(v.require("from"));
  const Node to = v.require("to");
  const double b = read_omega(to);
  // One frequency is a list of one; a range of one point would hide which end was meant.
  const Node count_node = v.require("count");
  const long count = read_whole_number(count_node, 2);
  if (count > max_frequency_count)
    count_node.fail(fmt::format("must be at most {}, got '{}'", max_frequency_count, count_node.text()));
  if (a == b) to.fail(fmt::format("must differ from 'from' for a range, got '{}'", to.text()));
  std::vector<double> out(static_cast<std::size_t>(count));
  for (long i = 0; i < count; ++i) out[static_cast<std::size_t>(i)] = a + (b - a) * static_cast<double>(i) / static_cast<double>(count - 1);
  return out;
}

}  // namespace yeegap::io
