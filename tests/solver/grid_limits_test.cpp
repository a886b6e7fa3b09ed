// Grid sizes that cannot be held are refused before anything is allocated (solver/engine/grid.h):
// cell counts are formed in double, so a slip of units neither wraps an int (a 42.95 m domain at
// 10 nm used to become 100 cells of 0.43 m) nor the 64-bit array size (4,194,302 nm at 1 nm wrote
// out of bounds). Both the uniform and the graded route are checked.
#include <gtest/gtest.h>

#include <string>

#include "base/errors.h"
#include "solver/engine/mesh_plan.h"
#include "solver/engine/simulation.h"
#include "test_scenes.h"

namespace yeegap::solver {
namespace {

std::string refusal(const Scene& s) {
  try {
    Simulation sim(s);
  } catch (const RunError& e) {
    return e.what();
  }
  return "";
}

TEST(GridLimits, AnAxisBeyondAnIntIsRefusedNotWrapped) {
  Scene s = testing::vacuum_box({10, 10, 10}, 10e-9, testing::all_edges(EdgeKind::periodic));
  s.domain.size = {42.95, 100e-9, 100e-9};  // 4.3e9 cells along x
  const std::string why = refusal(s);
  EXPECT_NE(why.find("cells along x"), std::string::npos) << why;
  EXPECT_NE(why.find("check the units"), std::string::npos) << why;
}

TEST(GridLimits, AGridBeyondTheTotalIsRefusedBeforeAllocating) {
  Scene s = testing::vacuum_box({10, 10, 10}, 1e-9, testing::all_edges(EdgeKind::cpml));
  s.domain.size = {4194302e-9, 4194302e-9, 4194302e-9};  // 7.4e19 cells: past 2^63 bytes
  const std::string why = refusal(s);
  EXPECT_NE(why.find("cells, more than"), std::string::npos) << why;
  // The graded route (gap refinement on) refuses it too, before building any node list.
  s.domain.gap_cells = 4;
  try {
    plan_mesh(s);
    FAIL() << "the graded plan must refuse the grid";
  } catch (const RunError& e) {
    EXPECT_NE(std::string(e.what()).find("cells, more than"), std::string::npos) << e.what();
  }
}

TEST(GridLimits, AnOrdinaryGridPasses) {
  Scene s = testing::vacuum_box({20, 20, 20}, 10e-9, testing::all_edges(EdgeKind::periodic));
  EXPECT_EQ(refusal(s), "");
}

}  // namespace
}  // namespace yeegap::solver
