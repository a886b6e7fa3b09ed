// Typed readers for single scene values: plain numbers, words, lengths, times, spectral values,
// vectors and frequency lists. Each converts to SI once (units.h) and refuses a wrong type, unit,
// sign or range with a message that says what was expected and what was found, at the value.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include "base/vec3.h"
#include "io/written_units.h"
#include "io/yaml_node.h"

namespace yeegap::io {

/// A number without a unit ("0.99", "1e-8").
double read_number(const Node& v);
/// A number > 0 without a unit.
double read_positive_number(const Node& v);
/// A whole number >= `min` ("12"; "12.5" and "12 nm" are refused).
long read_whole_number(const Node& v, long min);
/// true or false.
bool read_flag(const Node& v);
/// Any plain value as text (names, titles); a block or list is refused.
std::string read_text(const Node& v);
/// One of `choices`, with "did you mean" for a near miss; `planned` words get "not available yet".
std::string read_word(const Node& v, const std::vector<std::string>& choices,
                      const std::vector<std::string>& planned = {});

/// A value of kind `d` in SI (m, s, S/m, C m); a bare number is nm for a length and refused for
/// the other kinds. `expected` describes the value for messages: "a positive length like '40 nm'".
double read_quantity(const Node& v, Dimension d, const std::string& expected);
/// A length of any sign (a coordinate), m.
double read_length(const Node& v);
/// A length > 0, m.
double read_positive_length(const Node& v);
/// A time > 0, s.
double read_positive_time(const Node& v);
/// A spectral value -> angular frequency, rad/s (> 0, or >= 0 with `allow_zero`, for dampings).
double read_omega(const Node& v, bool allow_zero = false);
/// An electron energy > 0 in eV or meV ("5.1 eV"), J.
double read_energy(const Node& v);
/// A conductivity >= 0, S/m.
double read_conductivity(const Node& v);
/// A dipole moment > 0, C m.
double read_dipole_moment(const Node& v);
/// An angle with its unit, '30 deg' (or '30°') or '0.5 rad' -> rad. A bare number is refused: 30
/// could be either; a misspelt unit gets the nearest one. `expected` is what messages call it.
double read_angle(const Node& v, const std::string& expected = "an angle like '30 deg' or '0.5 rad'");

/// [x, y, z] lengths, m: a point.
Vec3 read_position(const Node& v);
/// [x, y, z] positive lengths, or one positive length for all three axes, m: sizes and steps.
Vec3 read_extent(const Node& v);
/// x, y or z -> 0, 1, 2.
int read_axis(const Node& v);
/// A unit vector: x, y, z (optionally with a sign, "-z") or [a, b, c] plain numbers, not all zero.
Vec3 read_direction(const Node& v);

/// A band {from, to} of spectral values -> (omega_min, omega_max), rad/s, whichever order written.
std::pair<double, double> read_band(const Node& v);
/// A list of spectral values, a single one, or {from, to, count} evenly spaced in frequency from
/// `from` to `to`; rad/s in the order written.
std::vector<double> read_frequencies(const Node& v);

}  // namespace yeegap::io
