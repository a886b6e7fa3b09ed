// The benchmark's bare fused kernel (tools/benchmark/bare_kernel.h) is a yardstick only if it does
// the whole Yee step: its fused pass must give the bits of the plain two-sweep step (H everywhere,
// then E; Taflove & Hagness 2005, ch. 3), on one thread and on two whose slabs are of unequal size.
// More threads than the machine's cores are not asked for: clang's OpenMP runtime then leaks the
// extra threads' records at exit, which the sanitizer run reports as a leak of this test.
#include <gtest/gtest.h>

#include <omp.h>

#include "tools/benchmark/bare_kernel.h"

namespace yeegap::benchmark {
namespace {

constexpr int cells = 23;  // 23 planes over 2 threads: uneven slabs (11 and 12)
constexpr int steps = 7;

TEST(BareKernel, FusedStepGivesTheBitsOfTheTwoSweepStepOnOneAndTwoThreads) {
  omp_set_num_threads(1);
  BareVacuumBox reference(cells);
  const std::uint64_t start = reference.field_hash();
  for (int s = 0; s < steps; ++s) reference.step_split();
  ASSERT_NE(reference.field_hash(), start) << "the steps changed nothing";
  for (int threads : {1, 2}) {
    omp_set_num_threads(threads);
    BareVacuumBox fused(cells);
    for (int s = 0; s < steps; ++s) fused.step_fused();
    EXPECT_EQ(fused.field_hash(), reference.field_hash()) << threads << " threads";
  }
}

}  // namespace
}  // namespace yeegap::benchmark
