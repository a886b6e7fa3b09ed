// The comparison behind the docs' measured tables (table_agreement.h): a number may move by one
// unit of its last printed digit and no more; text, line and number counts must match.
#include "table_agreement.h"

#include <gtest/gtest.h>

namespace yeegap::test_support {
namespace {

TEST(TableAgreement, ANumberMayMoveByOneUnitOfItsLastDigit) {
  EXPECT_TRUE(table_disagreements({"| 10 | 0.033 % |"}, {"| 10 | 0.034 % |"}).empty());
  EXPECT_TRUE(table_disagreements({"| 10 | 0.033 % |"}, {"| 10 | 0.032 % |"}).empty());
  EXPECT_EQ(table_disagreements({"| 10 | 0.033 % |"}, {"| 10 | 0.035 % |"}).size(), 1u);
  EXPECT_EQ(table_disagreements({"| +1.59 % |"}, {"| +1.52 % |"}).size(), 1u);
  EXPECT_TRUE(table_disagreements({"| 163 |"}, {"| 164 |"}).empty());
  EXPECT_EQ(table_disagreements({"| 163 |"}, {"| 165 |"}).size(), 1u);
  EXPECT_TRUE(table_disagreements({"| 1.5e-3 |"}, {"| 1.6e-3 |"}).empty());
  EXPECT_EQ(table_disagreements({"| 1.5e-3 |"}, {"| 1.8e-3 |"}).size(), 1u);
}

TEST(TableAgreement, TextAndShapeMustMatch) {
  EXPECT_EQ(table_disagreements({"| staircase | 6.15 % |"}, {"| diagonal | 6.15 % |"}).size(), 1u);
  EXPECT_EQ(table_disagreements({"| 6.15 % |"}, {"| 6.15 % | 1 |"}).size(), 1u);
  EXPECT_EQ(table_disagreements({"| a |", "| b |"}, {"| a |"}).size(), 1u);
  EXPECT_EQ(table_disagreements({"| -7.37 + 3.67i |"}, {"| -7.37 - 3.67i |"}).size(), 1u);
}

TEST(TableAgreement, BlocksAreFoundByName) {
  const std::vector<std::string> page{"text", "<!-- measured: peak by tests/x.cpp -->", "| a |", "| b |",
                                      "<!-- end measured -->", "<!-- measured: peaks by tests/y.cpp -->", "| c |",
                                      "<!-- end measured -->"};
  const auto block = find_block(page, "peak");
  ASSERT_TRUE(block.found);
  EXPECT_EQ(block.first, 2u);
  EXPECT_EQ(block.last, 4u);
  const auto other = find_block(page, "peaks");
  ASSERT_TRUE(other.found);
  EXPECT_EQ(other.first, 6u);
  EXPECT_FALSE(find_block(page, "pea").found);
  EXPECT_FALSE(find_block({"<!-- measured: open by tests/z.cpp -->", "| a |"}, "open").found);
}

TEST(TableAgreement, FiguresInsideALineAreFoundByName) {
  const std::vector<std::string> page{"| a | <!-- measured: cpml by tests/x.cpp -->-92 dB<!-- /measured --> |",
                                      "<!-- measured: open by tests/y.cpp -->no end"};
  const auto figure = find_figure(page, "cpml");
  ASSERT_TRUE(figure.found);
  EXPECT_EQ(page[0].substr(figure.begin, figure.end - figure.begin), "-92 dB");
  EXPECT_FALSE(find_figure(page, "open").found);
  EXPECT_FALSE(find_figure(page, "cp").found);
}

}  // namespace
}  // namespace yeegap::test_support
