// "Did you mean ...?" for misspelt scene words: the closest candidate by optimal-string-alignment
// distance (Levenshtein plus adjacent transpositions, so 'domian' is one edit from 'domain'),
// compared without regard to case, and only when it is close enough to be a plausible typo.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace yeegap::io {

/// Edits (insert, delete, substitute, swap two neighbours) that turn a into b, ignoring case.
int edit_distance(std::string_view a, std::string_view b);

/// The candidate nearest to `word`, if one is within a typo's reach of it (1 edit for words of up
/// to 3 letters, 2 up to 6, 3 beyond); ties go to the earlier candidate.
std::optional<std::string> closest_word(std::string_view word, const std::vector<std::string>& candidates);

/// "; did you mean 'size'?" when a candidate is close, else "; expected one of: a, b, c"
/// (or "" when there are no candidates). Meant to be appended to an error message.
std::string suggestion(std::string_view word, const std::vector<std::string>& candidates);

}  // namespace yeegap::io
