// Optimal-string-alignment distance and the typo suggestion built on it (see suggest.h).
#include "io/suggest.h"

#include <algorithm>
#include <cctype>

#include <fmt/format.h>

namespace yeegap::io {

int edit_distance(std::string_view a, std::string_view b) {
  const auto lower = [](char c) { return static_cast<char>(std::tolower(static_cast<unsigned char>(c))); };
  const std::size_t n = a.size(), m = b.size();
  // d[i][j]: distance between the first i letters of a and the first j letters of b.
  std::vector<std::vector<int>> d(n + 1, std::vector<int>(m + 1, 0));
  for (std::size_t i = 0; i <= n; ++i) d[i][0] = static_cast<int>(i);
  for (std::size_t j = 0; j <= m; ++j) d[0][j] = static_cast<int>(j);
  for (std::size_t i = 1; i <= n; ++i) {
    for (std::size_t j = 1; j <= m; ++j) {
      const int cost = lower(a[i - 1]) == lower(b[j - 1]) ? 0 : 1;
      d[i][j] = std::min({d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost});
      if (i > 1 && j > 1 && lower(a[i - 1]) == lower(b[j - 2]) && lower(a[i - 2]) == lower(b[j - 1]))
        d[i][j] = std::min(d[i][j], d[i - 2][j - 2] + 1);
    }
  }
  return d[n][m];
}

std::optional<std::string> closest_word(std::string_view word, const std::vector<std::string>& candidates) {
  std::optional<std::string> best;
  int best_distance = 0;
  for (const std::string& c : candidates) {
    // How many edits still look like a typo grows with the word; a short word that is 2 edits away
    // from another short word is usually a different word, not a slip.
    const std::size_t len = std::max(c.size(), word.size());
    const int reach = len <= 3 ? 1 : (len <= 6 ? 2 : 3);
    const int dist = edit_distance(word, c);
    if (dist <= reach && (!best || dist < best_distance)) {
      best = c;
      best_distance = dist;
    }
  }
  return best;
}

std::string suggestion(std::string_view word, const std::vector<std::string>& candidates) {
  if (candidates.empty()) return "";
  if (auto best = closest_word(word, candidates)) return fmt::format("; did you mean '{}'?", *best);
  return fmt::format("; expected one of: {}", fmt::join(candidates, ", "));
}

}  // namespace yeegap::io
