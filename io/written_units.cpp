// Unit tables and number splitting for scene values (see written_units.h). Prefix factors (1e-9 for nano)
// are definitions of the SI prefixes; physical constants come only from base/constants.h.
#include "io/written_units.h"

#include <charconv>
#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/units.h"

namespace yeegap::io {
namespace {

struct UnitEntry {
  const char* name;
  Dimension dimension;
  double factor;  // to SI, for linear kinds
};

// Lengths also serve as wavelengths for spectral values; handled in spectral_to_omega.
constexpr UnitEntry unit_table[] = {
    {"nm", Dimension::length, units::nm},
    {"um", Dimension::length, units::um},
    {"\xC2\xB5m", Dimension::length, units::um},  // micro sign + m, for those who type it
    {"m", Dimension::length, 1.0},
    {"fs", Dimension::time, units::fs},
    {"ps", Dimension::time, 1e-12},
    {"ns", Dimension::time, 1e-9},
    {"s", Dimension::time, 1.0},
    {"eV", Dimension::spectral, 0},
    {"meV", Dimension::spectral, 0},
    {"THz", Dimension::spectral, 0},
    {"GHz", Dimension::spectral, 0},
    {"Hz", Dimension::spectral, 0},
    {"rad/s", Dimension::spectral, 0},
    {"S/m", Dimension::conductivity, 1.0},
    {"C m", Dimension::dipole_moment, 1.0},
    {"e nm", Dimension::dipole_moment, constants::e_charge * units::nm},
};

const UnitEntry* find_unit(std::string_view unit) {
  for (const UnitEntry& u : unit_table)
    if (unit == u.name) return &u;
  return nullptr;
}

std::string normalise_unit(std::string_view raw) {
  std::string out;
  bool pending_space = false;
  for (std::size_t i = 0; i < raw.size(); ++i) {
    const char c = raw[i];
    const bool middle_dot = c == '\xC2' && i + 1 < raw.size() && raw[i + 1] == '\xB7';
    if (c == ' ' || c == '\t' || c == '*' || middle_dot) {
      pending_space = !out.empty();
      if (middle_dot) ++i;
      continue;
    }
    if (pending_space) out += ' ';
    pending_space = false;
    out += c;
  }
  return out;
}

}  // namespace

std::optional<NumberWithUnit> split_number_unit(std::string_view text) {
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  // from_chars takes no leading '+', which people do write ("+20 nm").
  if (!text.empty() && text.front() == '+') text.remove_prefix(1);
  double value = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (ec != std::errc() || !std::isfinite(value)) return std::nullopt;
  const std::string_view rest = text.substr(static_cast<std::size_t>(end - text.data()));
  // "40nm" and "40 nm" are both fine, but "40.5.3 nm" or "4,5 nm" are not numbers with a unit.
  if (!rest.empty() && (rest.front() == '.' || rest.front() == ',')) return std::nullopt;
  return NumberWithUnit{value, normalise_unit(rest)};
}

const char* dimension_name(Dimension d) {
  switch (d) {
    case Dimension::length: return "length";
    case Dimension::time: return "time";
    case Dimension::spectral: return "spectral value";
    case Dimension::conductivity: return "conductivity";
    case Dimension::dipole_moment: return "dipole moment";
  }
  return "value";
}

std::vector<std::string> units_of(Dimension d) {
  std::vector<std::string> out;
  for (const UnitEntry& u : unit_table) {
    if (u.name == std::string_view("\xC2\xB5m")) continue;  // an alias, not listed
    const bool wavelength = d == Dimension::spectral && u.dimension == Dimension::length;
    if (u.dimension == d || wavelength) out.emplace_back(u.name);
  }
  return out;
}

std::optional<Dimension> dimension_of_unit(std::string_view unit) {
  if (const UnitEntry* u = find_unit(unit)) return u->dimension;
  return std::nullopt;
}

std::optional<double> to_si(Dimension d, double value, std::string_view unit) {
  const UnitEntry* u = find_unit(unit);
  if (!u || u->dimension != d || d == Dimension::spectral) return std::nullopt;
  const double si = value * u->factor;
  if (std::isfinite(value) && !std::isfinite(si)) return std::nullopt;  // 1e308 km: overflows
  return si;
}

namespace {

std::optional<double> spectral_to_omega_unchecked(double value, std::string_view unit) {
  const UnitEntry* u = find_unit(unit);
  if (!u) return std::nullopt;
  if (u->dimension == Dimension::length) {
    if (value == 0) return std::nullopt;
    return units::wavelength_to_omega(value * u->factor);
  }
  if (u->dimension != Dimension::spectral) return std::nullopt;
  const double two_pi = 2.0 * constants::pi;
  if (unit == "eV") return units::eV_to_omega(value);
  if (unit == "meV") return units::eV_to_omega(value * 1e-3);
  if (unit == "THz") return two_pi * value * 1e12;
  if (unit == "GHz") return two_pi * value * 1e9;
  if (unit == "Hz") return two_pi * value;
  return value;  // rad/s
}

}  // namespace

std::optional<double> spectral_to_omega(double value, std::string_view unit) {
  const auto omega = spectral_to_omega_unchecked(value, unit);
  if (omega && std::isfinite(value) && !std::isfinite(*omega)) return std::nullopt;  // 91e300 eV: overflows
  return omega;
}

std::string format_length(double metres) { return fmt::format("{:g} nm", metres / units::nm); }

}  // namespace yeegap::io
