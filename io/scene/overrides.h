// The --set options of `yeegap run`: "key.path=value" edits applied to a scene's YAML tree before it
// is validated, so an overridden value is checked exactly like one written in the file.
#pragma once

#include <string>
#include <vector>

#include <yaml-cpp/yaml.h>

#include "io/yaml_node.h"

namespace yeegap::io {

/// Applies each "path=value" in order: the path is keys joined by '.', with [i] for list items
/// ("bodies[0].radius"); the value is YAML ("2 nm", "[1, 2, 3]", "{x: periodic}"). A missing last
/// key is added, as are missing blocks on the way; a list index must exist. Each override is
/// recorded in `source` so later errors about its value name it. Bad syntax or a path that does
/// not fit the tree (a key inside a plain value, an index past a list's end) is a SceneError
/// naming the override.
void apply_overrides(YAML::Node root, const std::vector<std::string>& overrides, SceneSource& source);

}  // namespace yeegap::io
