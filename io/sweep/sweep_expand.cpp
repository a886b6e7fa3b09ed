// Reading the `sweep` block and writing out one point's scene text (see sweep_expand.h). The block
// is read from the text with each ${name} masked by a same-length plain word ("$_gap_"): the YAML
// then parses even where a '{' would not, and every position stays that of the file.
#include "io/sweep/sweep_expand.h"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "base/errors.h"
#include "io/suggest.h"
#include "io/written_units.h"

namespace yeegap::io {
namespace {

// More points than any sweep one would run by hand: a range with a step typed in the wrong unit
// ("step: 1 pm" over nanometres) is stopped here instead of writing a million results files.
constexpr std::size_t max_points = 100000;

// Relative slack for a step range to reach its end despite rounding ({from: 0, to: 1, step: 0.1}).
constexpr double step_slack = 1e-9;

struct Use {
  std::size_t offset = 0;  // of '$' in the text
  std::size_t length = 0;  // of "${name}"
  std::string name;
  int line = 0, column = 0;  // 0-based
};

bool name_start(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c == '_'; }
bool name_char(char c) { return name_start(c) || (c >= '0' && c <= '9'); }
bool is_name(const std::string& s) { return !s.empty() && name_start(s[0]) && std::all_of(s.begin(), s.end(), name_char); }

Where at(const std::string& label, int line, int column) { return Where{label, line + 1, column + 1, ""}; }

std::vector<Use> find_uses(const std::string& text, const std::string& label) {
  std::vector<Use> uses;
  int line = 0, column = 0;
  for (std::size_t i = 0; i < text.size(); ++i) {
    if (text[i] == '\n') {
      ++line;
      column = 0;
      continue;
    }
    if (text[i] == '$' && i + 1 < text.size() && text[i + 1] == '{') {
      const std::size_t close = text.find_first_of("}\n", i + 2);
      const std::string name = close == std::string::npos ? "" : text.substr(i + 2, close - i - 2);
      if (close == std::string::npos || text[close] != '}' || !is_name(name))
        throw SceneError(at(label, line, column),
                         "'${' starts the use of a sweep parameter and needs its name and a closing '}' on the same "
                         "line, like '${gap}' (names are letters, digits and '_', not starting with a digit)");
      uses.push_back({i, close + 1 - i, name, line, column});
      column += static_cast<int>(close + 1 - i);
      i = close;
      continue;
    }
    ++column;
  }
  return uses;
}

std::string masked(std::string text, const std::vector<Use>& uses) {
  for (const Use& u : uses) {
    text[u.offset + 1] = '_';
    text[u.offset + u.length - 1] = '_';
  }
  return text;
}

std::string placeholder(const std::string& name) { return "$_" + name + "_"; }

SweepValue value_of_text(const std::string& text) {
  SweepValue v{text, std::nullopt, ""};
  if (auto q = split_number_unit(text)) {
    v.number = q->value;
    v.unit = q->unit;
  }
  return v;
}

// A ${...} inside the sweep block itself would make a value depend on the point it defines.
void refuse_uses_inside(const Node& v, const std::vector<Use>& uses) {
  const std::string text = v.text();
  for (const Use& u : uses)
    if (text.find(placeholder(u.name)) != std::string::npos)
      v.fail(fmt::format("a sweep value cannot itself use '${{{}}}'", u.name));
}

std::vector<SweepValue> read_range(const Node& block) {
  block.allow({"from", "to", "count", "step"});
  const Node from = block.require("from"), to = block.require("to");
  const auto number = [](const Node& n) {
    auto q = n.is_scalar() ? split_number_unit(n.text()) : std::nullopt;
    if (!q) n.fail(fmt::format("must be a number, with a unit if it has one ('0.3 nm'), got {}", n.found()));
    return *q;
  };
  const NumberWithUnit a = number(from), b = number(to);
  if (a.unit != b.unit)
    to.fail(fmt::format("must have the same unit as 'from' ('{}'), got '{}'", a.unit.empty() ? "none" : a.unit,
                        b.unit.empty() ? "none" : b.unit));
  const bool by_count = block.has("count"), by_step = block.has("step");
  if (by_count == by_step)
    block.fail("needs either 'count' (how many evenly spaced values, ends included) or 'step' (the spacing), not "
               "both: e.g. {from: 0.3 nm, to: 1 nm, count: 8}");
  std::size_t n = 0;
  double step = 0;
  if (by_count) {
    const Node c = block.require("count");
    const auto q = c.is_scalar() ? split_number_unit(c.text()) : std::nullopt;
    if (!q || !q->unit.empty() || q->value < 1 || q->value != std::floor(q->value) || q->value > double(max_points))
      c.fail(fmt::format("must be a whole number from 1 to {}, got {}", max_points, c.found()));
    n = static_cast<std::size_t>(q->value);
    if (n == 1 && a.value != b.value) c.fail("a count of 1 needs 'from' equal to 'to'; use 2 or more for a range");
    step = n > 1 ? (b.value - a.value) / double(n - 1) : 0;
  } else {
    const Node s = block.require("step");
    const NumberWithUnit q = number(s);
    if (!q.unit.empty() && q.unit != a.unit)
      s.fail(fmt::format("must have the unit of 'from' ('{}'), got '{}'", a.unit.empty() ? "none" : a.unit, q.unit));
    const double span = b.value - a.value;
    if (!(q.value != 0) || (span != 0 && (span > 0) != (q.value > 0)))
      s.fail(fmt::format("must be a non-zero step towards 'to' ({} from {}), got '{}'", span >= 0 ? "up" : "down",
                         format_sweep_number(a.value, a.unit), s.text()));
    const double steps = span / q.value;
    if (!(steps < double(max_points)))
      s.fail(fmt::format("gives more than {} values from {} to {}", max_points, from.text(), to.text()));
    n = static_cast<std::size_t>(std::floor(steps * (1 + step_slack) + step_slack)) + 1;
    step = q.value;
  }
  block.done();
  std::vector<SweepValue> values;
  for (std::size_t k = 0; k < n; ++k) {
    // The last value of a count range is `to` itself, not from + (n-1) step with its rounding.
    const double x = by_count && k + 1 == n ? b.value : a.value + double(k) * step;
    values.push_back({format_sweep_number(x, a.unit), x, a.unit});
  }
  return values;
}

std::vector<SweepValue> read_values(const Node& v, const std::vector<Use>& uses) {
  refuse_uses_inside(v, uses);
  if (v.is_map()) return read_range(v);
  if (v.is_scalar()) {
    if (v.text().find('\n') != std::string::npos) v.fail("must fit on one line");
    return {value_of_text(v.text())};
  }
  if (!v.is_list())
    v.fail("needs values: a list ('[0.3 nm, 0.5 nm]', '[classical, quantum_corrected]') or a range "
           "('{from: 0.3 nm, to: 1 nm, count: 8}' or with 'step')");
  std::vector<SweepValue> values;
  for (const Node& item : v.items()) {
    if (item.is_null()) item.fail("is empty; every value of a sweep parameter needs a value");
    // Values replace ${name} within one line, which keeps every line number of the file valid.
    if (item.text().find('\n') != std::string::npos) item.fail("must fit on one line");
    // A block or list as a value stands in its one-line flow form ("[1 nm, 0, 0]").
    values.push_back(value_of_text(item.text()));
  }
  if (values.empty()) v.fail("has no values; give at least one");
  return values;
}

}  // namespace

bool SweepParameter::numeric() const {
  return std::all_of(values.begin(), values.end(),
                     [&](const SweepValue& v) { return v.number.has_value() && v.unit == values.front().unit; });
}

std::string SweepParameter::unit() const { return values.empty() ? "" : values.front().unit; }

std::size_t SweepPlan::point_count() const {
  if (parameters.empty()) return 0;
  if (combine == Combine::zip) return parameters.front().values.size();
  std::size_t n = 1;
  for (const SweepParameter& p : parameters) n *= p.values.size();
  return n;
}

std::vector<std::size_t> SweepPlan::value_indices(std::size_t point) const {
  std::vector<std::size_t> idx(parameters.size(), point);
  if (combine == Combine::zip) return idx;
  for (std::size_t p = parameters.size(); p-- > 0;) {
    idx[p] = point % parameters[p].values.size();
    point /= parameters[p].values.size();
  }
  return idx;
}

std::string SweepPlan::describe(std::size_t point) const {
  const std::vector<std::size_t> idx = value_indices(point);
  std::vector<std::string> parts;
  for (std::size_t p = 0; p < parameters.size(); ++p)
    parts.push_back(fmt::format("{} = {}", parameters[p].name, parameters[p].values[idx[p]].text));
  return fmt::format("{}", fmt::join(parts, ", "));
}

std::string format_sweep_number(double value, const std::string& unit) {
  if (value == 0) value = 0;  // no "-0"
  const std::string number = fmt::format("{:.12g}", value);
  return unit.empty() ? number : number + " " + unit;
}

SweepPlan read_sweep_plan(const std::string& text, const std::string& file_label) {
  SweepPlan plan;
  plan.where = Where{file_label, 0, 0, ""};
  const std::vector<Use> uses = find_uses(text, file_label);
  YAML::Node doc;
  try {
    doc = YAML::Load(masked(text, uses));
  } catch (const YAML::ParserException& e) {
    throw SceneError(Where{file_label, e.mark.line + 1, e.mark.column + 1, ""}, fmt::format("YAML syntax error: {}", e.msg));
  }
  if (!doc.IsMap()) return plan;  // the scene reader says what a scene must be
  auto source = std::make_shared<SceneSource>();
  source->file = file_label;
  const Node root = Node::root(doc, source);
  const auto sweep = root.get("sweep");
  if (!sweep) return plan;
  plan.where = sweep->where();
  for (const auto& [name, value] : sweep->entries()) {
    if (name == "combine") {
      refuse_uses_inside(value, uses);
      const std::string word = value.is_scalar() ? value.text() : "";
      if (word == "grid") plan.combine = Combine::grid;
      else if (word == "zip") plan.combine = Combine::zip;
      else value.fail(fmt::format("must be 'grid' (every combination, the default) or 'zip' (the i-th values "
                                  "together), got {}{}", value.found(), suggestion(word, {"grid", "zip"})));
      continue;
    }
    if (!is_name(name))
      sweep->fail_key(name, fmt::format("'{}' cannot name a sweep parameter: use letters, digits and '_', not "
                                        "starting with a digit, so it can be written '${{{}}}'", name, name));
    plan.parameters.push_back({name, value.where(), read_values(value, uses)});
    plan.parameters.back().where.key_path = value.path();
  }
  if (plan.parameters.empty())
    sweep->fail("needs at least one parameter, e.g. 'gap: [0.3 nm, 0.5 nm, 1 nm]', used in the scene as '${gap}'");
  for (const SweepParameter& p : plan.parameters) {
    const bool used = std::any_of(uses.begin(), uses.end(), [&](const Use& u) { return u.name == p.name; });
    if (!used)
      sweep->fail_key(p.name, fmt::format("sweep parameter '{}' is not used: write '${{{}}}' where its value goes",
                                          p.name, p.name));
  }
  if (plan.combine == Combine::zip)
    for (const SweepParameter& p : plan.parameters)
      if (p.values.size() != plan.parameters.front().values.size())
        sweep->fail_key(p.name, fmt::format("with 'combine: zip' every parameter needs the same number of values: "
                                            "'{}' has {}, '{}' has {}", plan.parameters.front().name,
                                            plan.parameters.front().values.size(), p.name, p.values.size()));
  double product = 1;
  for (const SweepParameter& p : plan.parameters) product *= double(p.values.size());
  if (plan.combine == Combine::grid && product > double(max_points))
    sweep->fail(fmt::format("makes {:.0f} points, more than {}; split the sweep", product, max_points));
  return plan;
}

PointText substitute_point(const std::string& text, const std::string& file_label, const SweepPlan& plan,
                           std::size_t point) {
  const std::vector<Use> uses = find_uses(text, file_label);
  std::vector<std::string> names;
  for (const SweepParameter& p : plan.parameters) names.push_back(p.name);
  const std::vector<std::size_t> idx = plan.empty() ? std::vector<std::size_t>{} : plan.value_indices(point);
  PointText out;
  std::size_t done = 0;  // text copied up to here
  int line = -1, shift = 0;  // parsed column - file column on the current line
  for (const Use& u : uses) {
    const auto p = std::find(names.begin(), names.end(), u.name);
    if (p == names.end()) {
      if (plan.empty())
        throw SceneError(at(file_label, u.line, u.column),
                         fmt::format("'${{{}}}' takes a value from a sweep, but the scene has no 'sweep' block; add "
                                     "one, e.g. 'sweep: {{{}: [1, 2, 3]}}' (docs/scene.md, 'sweep')", u.name, u.name));
      throw SceneError(at(file_label, u.line, u.column),
                       fmt::format("unknown sweep parameter '{}'{}", u.name, suggestion(u.name, names)));
    }
    const std::string& value = plan.parameters[p - names.begin()].values[idx[p - names.begin()]].text;
    if (u.line != line) {
      line = u.line;
      shift = 0;
    }
    out.text.append(text, done, u.offset - done);
    out.text += value;
    done = u.offset + u.length;
    out.substitutions.push_back({u.line, u.column, u.column + shift, static_cast<int>(u.length),
                                 static_cast<int>(value.size()), u.name, value});
    shift += static_cast<int>(value.size()) - static_cast<int>(u.length);
  }
  out.text.append(text, done, std::string::npos);
  return out;
}

}  // namespace yeegap::io
