// Progress of a long run on a terminal: percent, steps/s, Mcells/s and time left, redrawn in place
// on stderr. Silent when stderr is not a terminal (logs, batch jobs, pipes).
#pragma once

#include "solver/engine/simulation.h"

namespace yeegap::cli {

class ProgressLine {
 public:
  ProgressLine();
  ~ProgressLine();
  void update(const solver::Progress& p);
  /// Ends the drawn line (if any), so a message can follow on a line of its own.
  void break_line();

 private:
  bool enabled_;
  bool drawn_ = false;
};

}  // namespace yeegap::cli
