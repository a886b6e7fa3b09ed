// Where a value came from in a user's file: file, 1-based line and column, and the key path
// ("bodies[1].radius"). Carried by every user error so the message can point at the text.
#pragma once

#include <string>

namespace yeegap {

struct Where {
  std::string file;      // as the user named it
  int line = 0;          // 1-based; 0 when unknown
  int column = 0;        // 1-based; 0 when unknown
  std::string key_path;  // dotted path with [i] for list items; empty for the whole file

  /// "scene.yaml:14:13" (or "scene.yaml" when the position is unknown).
  std::string location() const {
    std::string s = file;
    if (line > 0) {
      // Appended piecewise: GCC 12 warns falsely (-Wrestrict) on chained operator+ here.
      s += ':';
      s += std::to_string(line);
      s += ':';
      s += std::to_string(column);
    }
    return s;
  }
};

}  // namespace yeegap
