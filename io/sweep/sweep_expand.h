// The scene's `sweep` block: named parameters, each a list of values or a range, combined as a
// full grid or zipped; each point of the sweep is the scene text with every ${name} replaced by
// that point's value. Replacing happens in the text (so a value may stand anywhere, even inside a
// flow list, where '{' would end a plain YAML word) and records where each replacement went, so
// errors about a substituted value point at its ${name} in the file (SceneSource::Substitution).
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "base/where.h"
#include "io/yaml_node.h"

namespace yeegap::io {

/// One value of a parameter: the text that replaces ${name}, and its number and unit when the
/// text is a number ("0.3 nm" -> 0.3, "nm"; "classical" -> no number).
struct SweepValue {
  std::string text;
  std::optional<double> number;
  std::string unit;
};

struct SweepParameter {
  std::string name;
  Where where;  // the parameter's key in the sweep block
  std::vector<SweepValue> values;
  /// Every value is a number with the same unit (or all bare): the merged table stores numbers.
  bool numeric() const;
  /// The shared unit of a numeric parameter ("" for bare numbers).
  std::string unit() const;
};

enum class Combine { grid, zip };

struct SweepPlan {
  std::vector<SweepParameter> parameters;  // in file order
  Combine combine = Combine::grid;
  Where where;  // the `sweep` key; file label only when the scene has no sweep block

  bool empty() const { return parameters.empty(); }
  /// Points of the sweep: the product of the value counts (grid) or the common count (zip); 0 when empty.
  std::size_t point_count() const;
  /// For each parameter, the index of its value at `point`. In a grid the last parameter varies
  /// fastest, as nested loops written in the block's order.
  std::vector<std::size_t> value_indices(std::size_t point) const;
  /// "gap = 0.3 nm, model = classical"
  std::string describe(std::size_t point) const;
};

/// Reads the `sweep` block of scene `text` (an empty plan when there is none). Checks the block
/// (names, values, ranges, zip lengths), that each parameter is used somewhere as ${name}, and that
/// every ${...} in the text is well formed. SceneError at the key, value or use that is wrong.
SweepPlan read_sweep_plan(const std::string& text, const std::string& file_label);

/// Scene text of one point: every ${name} replaced by its value, and where each replacement went.
struct PointText {
  std::string text;
  std::vector<SceneSource::Substitution> substitutions;
};

/// Replaces the ${name} uses of `text` with the values of `point` of `plan`. A use of a name the
/// plan does not define is a SceneError at the use, with the nearest parameter name; a scene
/// without a sweep block that uses ${...} gets a message saying that it needs one.
PointText substitute_point(const std::string& text, const std::string& file_label, const SweepPlan& plan,
                           std::size_t point);

/// Formats a range value the way it is substituted: 12 significant digits, then the unit
/// ("0.45 nm"); so 0.1 + 0.2 steps print as 0.3, not 0.30000000000000004.
std::string format_sweep_number(double value, const std::string& unit);

}  // namespace yeegap::io
