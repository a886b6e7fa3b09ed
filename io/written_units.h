// Numbers with units as people write them in a scene ("40 nm", "1e4 S/m", "2.5 eV"), turned into
// SI. One rule for the whole file: the unit decides what a value means; a bare number is a length
// in nm or a plain number, and is refused where it would be ambiguous (times, spectral values).
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace yeegap::io {

/// A number and the unit text after it: "40 nm" -> {40, "nm"}, "1e-30 C*m" -> {1e-30, "C m"}.
/// The unit is trimmed, inner spaces collapse to one, and '*' or a middle dot count as a space.
struct NumberWithUnit {
  double value = 0;
  std::string unit;  // empty for a bare number
};

/// Splits `text`; nullopt when it does not start with a finite decimal number.
std::optional<NumberWithUnit> split_number_unit(std::string_view text);

/// The physical kinds of value a scene holds, each with its own units.
enum class Dimension { length, time, spectral, conductivity, dipole_moment };

/// Name of the kind for messages: "length", "time", "spectral value", ...
const char* dimension_name(Dimension d);
/// The units accepted for a kind, in the order the docs list them.
std::vector<std::string> units_of(Dimension d);
/// Which kind a unit belongs to (a length unit is also a spectral unit: a wavelength); nullopt if
/// the unit is not one we know. Used to say "'fs' is a time unit" rather than "unknown unit".
std::optional<Dimension> dimension_of_unit(std::string_view unit);

/// value in `unit` -> SI for kinds that scale linearly: length (m), time (s), conductivity (S/m),
/// dipole moment (C m). nullopt when the unit does not belong to the kind, or when a finite value
/// overflows once converted.
std::optional<double> to_si(Dimension d, double value, std::string_view unit);

/// A spectral value -> angular frequency (rad/s). A length unit means a vacuum wavelength
/// (omega = 2 pi c / lambda), eV/meV a photon energy (omega = E / hbar), THz/GHz/Hz a frequency
/// (omega = 2 pi f), rad/s itself. nullopt for an unknown unit, a wavelength of zero, or a finite
/// value whose frequency overflows (1e300 THz, 1e-308 m).
std::optional<double> spectral_to_omega(double value, std::string_view unit);

/// "400 nm", "-2.5 nm", "1.2e+03 nm": a length in metres written back in nm for messages.
std::string format_length(double metres);

}  // namespace yeegap::io
