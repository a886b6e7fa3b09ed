// A tiny JSON writer for the one-object summaries of `--json` (no dependency for ~40 lines).
#pragma once

#include <cmath>
#include <string>
#include <vector>

#include <fmt/format.h>

namespace yeegap::cli {

inline std::string json_string(const std::string& s) {
  std::string out = "\"";
  for (char c : s) {
    switch (c) {
      case '"': out += "\\\""; break;
      case '\\': out += "\\\\"; break;
      case '\n': out += "\\n"; break;
      case '\t': out += "\\t"; break;
      default:
        if (static_cast<unsigned char>(c) < 0x20) out += fmt::format("\\u{:04x}", c);
        else out += c;
    }
  }
  return out + "\"";
}

/// A number as JSON (NaN and infinities, which JSON lacks, become null).
inline std::string json_number(double v) { return std::isfinite(v) ? fmt::format("{:.10g}", v) : "null"; }

/// Builds {"k": v, ...} from already-encoded values, in insertion order.
class JsonObject {
 public:
  JsonObject& add(const std::string& key, const std::string& encoded) {
    parts_.push_back(json_string(key) + ": " + encoded);
    return *this;
  }
  JsonObject& number(const std::string& key, double v) { return add(key, json_number(v)); }
  JsonObject& text(const std::string& key, const std::string& v) { return add(key, json_string(v)); }
  std::string str() const {
    std::string s = "{";
    for (std::size_t i = 0; i < parts_.size(); ++i) s += (i ? ", " : "") + parts_[i];
    return s + "}";
  }

 private:
  std::vector<std::string> parts_;
};

inline std::string json_array(const std::vector<std::string>& encoded) {
  std::string s = "[";
  for (std::size_t i = 0; i < encoded.size(); ++i) s += (i ? ", " : "") + encoded[i];
  return s + "]";
}

}  // namespace yeegap::cli
