// Applying "key.path=value" overrides to a YAML tree (see overrides.h). yaml-cpp trap: assigning
// one Node handle to another overwrites the data it refers to, so walking the tree rebinds handles
// with reset() and only the final step assigns.
#include "io/scene/overrides.h"

#include <cctype>

#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::io {
namespace {

struct Step {
  bool is_index = false;
  std::string key;        // for a key step
  std::size_t index = 0;  // for an index step
};

std::string trim(const std::string& s) {
  const auto first = s.find_first_not_of(" \t");
  if (first == std::string::npos) return "";
  return s.substr(first, s.find_last_not_of(" \t") - first + 1);
}

[[noreturn]] void refuse(const SceneSource& source, const std::string& text, const std::string& path,
                         const std::string& why) {
  throw SceneError(Where{source.file, 0, 0, path}, fmt::format("--set {}: {}", text, why));
}

/// "bodies[0].radius" -> key bodies, index 0, key radius; nullopt-like empty result on bad syntax.
bool parse_path(const std::string& path, std::vector<Step>& steps) {
  std::size_t i = 0;
  const auto word_char = [](char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_'; };
  while (i < path.size()) {
    std::size_t start = i;
    while (i < path.size() && word_char(path[i])) ++i;
    if (i == start) return false;
    steps.push_back({false, path.substr(start, i - start), 0});
    while (i < path.size() && path[i] == '[') {
      const std::size_t close = path.find(']', i);
      if (close == std::string::npos || close == i + 1) return false;
      std::size_t index = 0;
      for (std::size_t k = i + 1; k < close; ++k) {
        if (!std::isdigit(static_cast<unsigned char>(path[k]))) return false;
        index = index * 10 + static_cast<std::size_t>(path[k] - '0');
        if (index > 1'000'000) return false;
      }
      steps.push_back({true, "", index});
      i = close + 1;
    }
    if (i < path.size()) {
      if (path[i] != '.') return false;
      ++i;
      if (i == path.size()) return false;
    }
  }
  return !steps.empty();
}

std::string render(const std::vector<Step>& steps, std::size_t count) {
  std::string out;
  for (std::size_t i = 0; i < count; ++i) {
    if (steps[i].is_index) out += fmt::format("[{}]", steps[i].index);
    else out += (out.empty() ? "" : ".") + steps[i].key;
  }
  return out;
}

void apply_one(YAML::Node root, const std::string& text, SceneSource& source) {
  const std::size_t eq = text.find('=');
  if (eq == std::string::npos) refuse(source, text, "", "expected key.path=value, e.g. 'domain.step=2 nm'");
  const std::string path = trim(text.substr(0, eq));
  const std::string value_text = trim(text.substr(eq + 1));
  std::vector<Step> steps;
  if (!parse_path(path, steps))
    refuse(source, text, path, fmt::format("'{}' is not a key path; write keys joined by '.', with [i] for list "
                                           "items, e.g. 'bodies[0].radius'", path));
  if (value_text.empty()) refuse(source, text, path, "no value after '='");
  YAML::Node value;
  try {
    value = YAML::Load(value_text);
  } catch (const YAML::Exception& e) {
    refuse(source, text, path, fmt::format("the value is not valid YAML: {}", e.msg));
  }

  YAML::Node cur;
  cur.reset(root);
  for (std::size_t i = 0; i < steps.size(); ++i) {
    const Step& s = steps[i];
    const bool last = i + 1 == steps.size();
    const std::string here = render(steps, i);  // the part of the path already walked
    const std::string what = here.empty() ? "the top level" : fmt::format("'{}'", here);
    if (s.is_index) {
      if (!cur.IsSequence())
        refuse(source, text, path,
               fmt::format("{} is {}, so it has no item [{}]", what,
                           cur.IsMap() ? "a single block, not a list" : "not a list", s.index));
      if (s.index >= cur.size())
        refuse(source, text, path,
               fmt::format("{} has {} item{}, so there is no item [{}]", what, cur.size(), cur.size() == 1 ? "" : "s",
                           s.index));
      if (last) {
        cur[s.index] = value;
        break;
      }
      YAML::Node next = cur[s.index];
      cur.reset(next);
      continue;
    }
    if (cur.IsNull()) cur = YAML::Node(YAML::NodeType::Map);  // an empty block ("stop:") takes keys
    if (!cur.IsMap())
      refuse(source, text, path,
             fmt::format("{} is {}, so it has no key '{}'", what, cur.IsSequence() ? "a list" : "a plain value", s.key));
    if (last) {
      cur[s.key] = value;
      break;
    }
    if (!cur[s.key]) cur[s.key] = YAML::Node(YAML::NodeType::Map);
    YAML::Node next = cur[s.key];
    cur.reset(next);
  }
  source.overrides.push_back({render(steps, steps.size()), text});
}

}  // namespace

void apply_overrides(YAML::Node root, const std::vector<std::string>& overrides, SceneSource& source) {
  for (const std::string& o : overrides) apply_one(root, o, source);
}

}  // namespace yeegap::io
