// A read-only view of one node of a scene's YAML tree that knows its key path ("bodies[1].radius")
// and its place in the file, and records which keys of a block were read, so a key the reader never
// asked for is reported with its own line and column and the nearest valid key. yaml-cpp stays
// behind this type: only io/ sees it. Trap: a key missing from yaml-cpp's tree has no position,
// so errors about missing keys point at the block that should have held them.
#pragma once

#include <memory>
#include <optional>
#include <set>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include <yaml-cpp/yaml.h>

#include "base/where.h"

namespace yeegap::io {

/// Shared by every Node of one scene: the file label for messages, the --set overrides applied
/// to the tree, whose values have no place in the file and are reported by the override instead,
/// and the ${name} uses of a sweep point (io/sweep/sweep_expand.h) replaced in the text before parsing.
struct SceneSource {
  struct Override {
    std::string path;  // canonical key path it sets, "bodies[0].radius"
    std::string text;  // as the user gave it, "bodies[0].radius=40 nm"
  };
  /// One ${name} replaced by its value. Values are single lines, so lines are the same in the
  /// file and in the parsed text; only columns after a replacement on its line move.
  struct Substitution {
    int line = 0;            // 0-based line
    int column = 0;          // 0-based column of '${' in the file
    int parsed_column = 0;   // 0-based column where the value starts in the parsed text
    int written_length = 0;  // characters of "${name}"
    int value_length = 0;    // characters of the value
    std::string name, value;
  };
  std::string file;
  std::vector<Override> overrides;
  std::vector<Substitution> substitutions;  // in text order
  std::string point_label;                  // "sweep point 2", for messages about a substituted value

  /// The override that wrote the value at `path` or at one of its parents; the last one wins.
  const Override* override_for(std::string_view path) const;
  /// Turns a 0-based column of the parsed text on `line` into the file's column (a place inside a
  /// substituted value maps to its '${'); returns the substitution it fell in, if any.
  const Substitution* to_file_column(int line, int& column) const;
  /// " (${gap} = '0.3 nm' here, sweep point 2)" for a place inside a substituted value, else "".
  std::string substitution_note(int line, int parsed_column) const;
};

class Node {
 public:
  /// The whole document (yaml-cpp nodes are shared handles, so views keep the tree alive).
  static Node root(YAML::Node doc, std::shared_ptr<const SceneSource> source);

  Node(const Node& other) = default;
  /// Rebinds this view. (yaml-cpp's own assignment would overwrite the tree's data instead.)
  Node& operator=(const Node& other);

  const std::string& path() const { return path_; }
  /// Where the value is: its own position for a plain value, the line of its key for a block or
  /// list (so "missing key" points at "domain:"), or the --set option that wrote it.
  Where where() const;
  /// The value as written, for messages: a plain value's text, or the flow form of a block/list.
  std::string text() const;
  bool is_map() const { return node_.IsMap(); }
  bool is_list() const { return node_.IsSequence(); }
  bool is_scalar() const { return node_.IsScalar(); }
  bool is_null() const { return node_.IsNull(); }
  /// What was found, for messages: "a block of keys", "a list", "the value 'x'", "nothing".
  std::string found() const;

  // ---- blocks of keys ----
  /// Declares the keys this block may hold. Refuses a non-block, a repeated key, and any key not in
  /// `keys`, at that key's own position with the closest allowed key as a suggestion. `planned`
  /// words are valid scene words that this version does not read yet; they get their own message.
  void allow(const std::vector<std::string>& keys, const std::vector<std::string>& planned = {}) const;
  /// Is the key present (with any value, even empty)? Does not count as reading it.
  bool has(std::string_view key) const;
  /// The value of `key` if present; counts as reading it.
  std::optional<Node> get(std::string_view key) const;
  /// The value of `key`; a missing key is an error that names it and points at this block.
  Node require(std::string_view key) const;
  /// All (key, value) pairs of a block whose keys the user names (materials), in file order.
  std::vector<std::pair<std::string, Node>> entries() const;
  /// Refuses a key that is present but was never read: it would silently have no effect.
  void done() const;

  // ---- lists ----
  /// The items of a list (an empty value counts as an empty list); anything else is an error.
  std::vector<Node> items() const;
  /// Like items(), but a single block stands for a list of one.
  std::vector<Node> items_or_single() const;

  // ---- errors ----
  /// Throws SceneError at this value: "path: message" (+ which --set wrote it).
  [[noreturn]] void fail(std::string_view message) const;
  /// Throws SceneError at a key of this block, at the key's own position.
  [[noreturn]] void fail_key(std::string_view key, std::string_view message) const;

 private:
  Node(YAML::Node node, std::string path, std::shared_ptr<const SceneSource> source, YAML::Mark key_mark);
  std::string child_path(std::string_view key) const;
  std::string block_name() const;  // "domain", or "the top level" for the root
  std::optional<std::pair<YAML::Node, YAML::Node>> find(std::string_view key) const;  // key, value
  Where where_of(const YAML::Mark& mark, const std::string& path) const;
  YAML::Mark mark() const;  // the position where() reports
  std::string override_note(const std::string& path) const;
  [[noreturn]] void fail_at(const YAML::Mark& mark, const std::string& path, std::string_view message) const;

  YAML::Node node_;
  std::string path_;
  std::shared_ptr<const SceneSource> source_;
  YAML::Mark key_mark_;  // position of the key that names this value; null for roots and list items
  std::shared_ptr<std::set<std::string, std::less<>>> read_;  // keys asked for, present or not
};

}  // namespace yeegap::io
