// The resume check of the averaging tests: a run copied, state array by state array, into a fresh
// run halfway (as a checkpoint file would carry it) must finish bit for bit like one never stopped.
#pragma once

#include <gtest/gtest.h>

#include <cstring>
#include <string>
#include <vector>

#include "solver/engine/simulation.h"
#include "solver/engine/simulation_state.h"

namespace yeegap::solver::testing {

/// Runs `s` 2 x `half` steps whole and with a copy at `half`; `carried` must be part of some state
/// array's name (the state under test is in the checkpoint).
inline void expect_resumed_run_matches(const Scene& s, int half, const std::string& carried) {
  Simulation whole(s), first(s), resumed(s);
  for (int n = 0; n < half; ++n) whole.step(), first.step();
  const std::vector<StateArray> from = first.state_arrays().list(), to = resumed.state_arrays().list();
  ASSERT_EQ(from.size(), to.size());
  bool found = false;
  for (std::size_t a = 0; a < from.size(); ++a) {
    ASSERT_EQ(from[a].name, to[a].name);
    ASSERT_EQ(from[a].bytes(), to[a].bytes());
    if (from[a].bytes() > 0) std::memcpy(to[a].data, from[a].data, from[a].bytes());  // empty arrays: null data
    found = found || from[a].name.find(carried) != std::string::npos;
  }
  EXPECT_TRUE(found) << "no state array named with " << carried;
  resumed.restore_counters(first.state_counters());
  for (int n = 0; n < half; ++n) whole.step(), resumed.step();
  for (int c = 0; c < 6; ++c)
    EXPECT_EQ(std::memcmp(whole.fields().c[c].data(), resumed.fields().c[c].data(), whole.fields().c[c].size() * sizeof(real)), 0)
        << component_names[c];
}

}  // namespace yeegap::solver::testing
