// The YAML view with key paths, positions and read-key tracking (see yaml_node.h). yaml-cpp marks
// are 0-based; Where is 1-based. An empty value ("step:") has the position of the next token, so
// errors about it point at its key instead.
#include "io/yaml_node.h"

#include <algorithm>
#include <map>

#include <fmt/format.h>

#include "base/errors.h"
#include "io/suggest.h"

namespace yeegap::io {

const SceneSource::Override* SceneSource::override_for(std::string_view path) const {
  const Override* hit = nullptr;
  for (const Override& o : overrides) {
    const bool same = path == o.path;
    const bool inside = path.size() > o.path.size() && path.substr(0, o.path.size()) == o.path &&
                        (path[o.path.size()] == '.' || path[o.path.size()] == '[');
    if (same || inside) hit = &o;
  }
  return hit;
}

const SceneSource::Substitution* SceneSource::to_file_column(int line, int& column) const {
  int shift = 0;  // file column - parsed column, from replacements earlier on the line
  for (const Substitution& s : substitutions) {
    if (s.line != line || s.parsed_column > column) continue;
    if (column < s.parsed_column + s.value_length) {
      column = s.column;
      return &s;
    }
    shift = s.column + s.written_length - (s.parsed_column + s.value_length);
  }
  column += shift;
  return nullptr;
}

std::string SceneSource::substitution_note(int line, int parsed_column) const {
  const Substitution* s = to_file_column(line, parsed_column);
  if (!s) return "";
  return fmt::format(" (${{{}}} = '{}' here, {})", s->name, s->value, point_label);
}

Node::Node(YAML::Node node, std::string path, std::shared_ptr<const SceneSource> source, YAML::Mark key_mark)
    : node_(node),
      path_(std::move(path)),
      source_(std::move(source)),
      key_mark_(key_mark),
      read_(std::make_shared<std::set<std::string, std::less<>>>()) {}

Node Node::root(YAML::Node doc, std::shared_ptr<const SceneSource> source) {
  return Node(doc, "", std::move(source), YAML::Mark::null_mark());
}

Node& Node::operator=(const Node& other) {
  node_.reset(other.node_);
  path_ = other.path_;
  source_ = other.source_;
  key_mark_ = other.key_mark_;
  read_ = other.read_;
  return *this;
}

Where Node::where_of(const YAML::Mark& mark, const std::string& path) const {
  if (source_->override_for(path) || mark.is_null()) return Where{source_->file, 0, 0, path};
  int column = mark.column;
  source_->to_file_column(mark.line, column);
  return Where{source_->file, mark.line + 1, column + 1, path};
}

YAML::Mark Node::mark() const { return node_.IsScalar() || key_mark_.is_null() ? node_.Mark() : key_mark_; }

Where Node::where() const { return where_of(mark(), path_); }

std::string Node::text() const {
  if (node_.IsScalar()) return node_.Scalar();
  if (!node_.IsDefined() || node_.IsNull()) return "";
  YAML::Emitter out;
  out.SetMapFormat(YAML::Flow);
  out.SetSeqFormat(YAML::Flow);
  out << node_;
  return out.c_str();
}

std::string Node::found() const {
  if (node_.IsScalar()) return fmt::format("'{}'", node_.Scalar());
  if (node_.IsMap()) return node_.size() == 0 ? "an empty block" : "a block of keys";
  if (node_.IsSequence()) return fmt::format("a list of {} item{}", node_.size(), node_.size() == 1 ? "" : "s");
  return "nothing";
}

std::string Node::child_path(std::string_view key) const {
  return path_.empty() ? std::string(key) : fmt::format("{}.{}", path_, key);
}

std::string Node::block_name() const { return path_.empty() ? "the top level" : path_; }

std::string Node::override_note(const std::string& path) const {
  const SceneSource::Override* o = source_->override_for(path);
  return o ? fmt::format(" (set by --set {})", o->text) : "";
}

void Node::fail_at(const YAML::Mark& mark, const std::string& path, std::string_view message) const {
  const std::string note = mark.is_null() ? "" : source_->substitution_note(mark.line, mark.column);
  throw SceneError(where_of(mark, path), fmt::format("{}{}{}", message, override_note(path), note));
}

void Node::fail(std::string_view message) const {
  const std::string text = path_.empty() ? std::string(message) : fmt::format("{}: {}", path_, message);
  const YAML::Mark m = mark();
  const std::string note = m.is_null() ? "" : source_->substitution_note(m.line, m.column);
  throw SceneError(where(), text + override_note(path_) + note);
}

void Node::fail_key(std::string_view key, std::string_view message) const {
  if (auto kv = find(key)) fail_at(kv->first.Mark(), child_path(key), message);
  throw SceneError(where(), fmt::format("{}{}", message, override_note(child_path(key))));
}

std::optional<std::pair<YAML::Node, YAML::Node>> Node::find(std::string_view key) const {
  if (!node_.IsMap()) return std::nullopt;
  for (auto it = node_.begin(); it != node_.end(); ++it)
    if (it->first.IsScalar() && it->first.Scalar() == key) return std::make_pair(it->first, it->second);
  return std::nullopt;
}

void Node::allow(const std::vector<std::string>& keys, const std::vector<std::string>& planned) const {
  if (!node_.IsDefined() || node_.IsNull()) return;  // an empty block: required keys will be missed
  if (!node_.IsMap())
    fail(fmt::format("must be a block of keys ({}), got {}", fmt::join(keys, ", "), found()));
  std::map<std::string, int, std::less<>> seen;  // key -> 1-based line of its first use
  for (auto it = node_.begin(); it != node_.end(); ++it) {
    const YAML::Node k = it->first;
    if (!k.IsScalar()) fail_at(k.Mark(), path_, fmt::format("a key in {} must be a plain word", block_name()));
    const std::string name = k.Scalar();
    if (auto s = seen.find(name); s != seen.end())
      fail_at(k.Mark(), child_path(name),
              fmt::format("key '{}' appears twice in {} (first on line {})", name, block_name(), s->second));
    seen.emplace(name, k.Mark().line + 1);
    if (std::find(keys.begin(), keys.end(), name) != keys.end()) continue;
    const bool is_planned = std::find(planned.begin(), planned.end(), name) != planned.end();
    if (is_planned)
      fail_at(k.Mark(), child_path(name),
              fmt::format("'{}' in {} is not available in this version; available: {}", name, block_name(),
                          fmt::join(keys, ", ")));
    fail_at(k.Mark(), child_path(name),
            path_.empty() ? fmt::format("unknown top-level key '{}'{}", name, suggestion(name, keys))
                          : fmt::format("unknown key '{}' in {}{}", name, path_, suggestion(name, keys)));
  }
}

bool Node::has(std::string_view key) const { return find(key).has_value(); }

std::optional<Node> Node::get(std::string_view key) const {
  read_->emplace(key);
  auto kv = find(key);
  if (!kv) return std::nullopt;
  return Node(kv->second, child_path(key), source_, kv->first.Mark());
}

Node Node::require(std::string_view key) const {
  if (auto v = get(key)) return *v;
  if (path_.empty()) fail(fmt::format("missing top-level key '{}'", key));
  fail(fmt::format("missing key '{}'", key));
}

std::vector<std::pair<std::string, Node>> Node::entries() const {
  std::vector<std::pair<std::string, Node>> out;
  if (!node_.IsDefined() || node_.IsNull()) return out;
  if (!node_.IsMap()) fail(fmt::format("must be a block of named entries, got {}", found()));
  std::map<std::string, int, std::less<>> seen;
  for (auto it = node_.begin(); it != node_.end(); ++it) {
    const YAML::Node k = it->first;
    if (!k.IsScalar()) fail_at(k.Mark(), path_, fmt::format("a name in {} must be a plain word", block_name()));
    const std::string name = k.Scalar();
    if (auto s = seen.find(name); s != seen.end())
      fail_at(k.Mark(), child_path(name),
              fmt::format("'{}' is defined twice in {} (first on line {})", name, block_name(), s->second));
    seen.emplace(name, k.Mark().line + 1);
    read_->emplace(name);
    out.emplace_back(name, Node(it->second, child_path(name), source_, k.Mark()));
  }
  return out;
}

void Node::done() const {
  if (!node_.IsMap()) return;
  for (auto it = node_.begin(); it != node_.end(); ++it) {
    const std::string name = it->first.Scalar();
    if (read_->find(name) == read_->end())
      fail_at(it->first.Mark(), child_path(name), fmt::format("key '{}' has no effect in {}", name, block_name()));
  }
}

std::vector<Node> Node::items() const {
  std::vector<Node> out;
  if (!node_.IsDefined() || node_.IsNull()) return out;
  if (!node_.IsSequence()) fail(fmt::format("must be a list, got {}", found()));
  for (std::size_t i = 0; i < node_.size(); ++i)
    out.push_back(Node(node_[i], fmt::format("{}[{}]", path_, i), source_, YAML::Mark::null_mark()));
  return out;
}

std::vector<Node> Node::items_or_single() const {
  if (node_.IsMap()) return {*this};
  return items();
}

}  // namespace yeegap::io
