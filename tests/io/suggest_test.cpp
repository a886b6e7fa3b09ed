// The "did you mean" helper: distances count single edits and swaps, ignore case, and a suggestion
// is offered only for plausible typos.
#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "io/suggest.h"

namespace {

using yeegap::io::closest_word;
using yeegap::io::edit_distance;
using yeegap::io::suggestion;

TEST(Suggest, CountsOneEditForEachInsertDeleteSubstituteOrSwap) {
  EXPECT_EQ(edit_distance("size", "size"), 0);
  EXPECT_EQ(edit_distance("sise", "size"), 1);      // substitute
  EXPECT_EQ(edit_distance("sze", "size"), 1);       // insert
  EXPECT_EQ(edit_distance("sizze", "size"), 1);     // delete
  EXPECT_EQ(edit_distance("domian", "domain"), 1);  // swap of neighbours
  EXPECT_EQ(edit_distance("", "abc"), 3);
  EXPECT_EQ(edit_distance("kitten", "sitting"), 3);
}

TEST(Suggest, IgnoresCase) { EXPECT_EQ(edit_distance("ez", "Ez"), 0); }

TEST(Suggest, PicksTheNearestCandidateWithinTypoReach) {
  const std::vector<std::string> keys = {"size", "center", "step", "edges", "absorber", "background"};
  EXPECT_EQ(closest_word("bakground", keys), "background");
  EXPECT_EQ(closest_word("stpe", keys), "step");
  EXPECT_FALSE(closest_word("colour", keys).has_value());
  // Short words must be closer: 'ab' is two edits from 'xy', too far for a two-letter word.
  EXPECT_FALSE(closest_word("ab", {"xy"}).has_value());
}

TEST(Suggest, ListsTheChoicesWhenNothingIsClose) {
  EXPECT_EQ(suggestion("sise", {"size", "step"}), "; did you mean 'size'?");
  EXPECT_EQ(suggestion("colour", {"size", "step"}), "; expected one of: size, step");
  EXPECT_EQ(suggestion("x", {}), "");
}

}  // namespace
