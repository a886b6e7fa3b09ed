// Stopping a run cleanly and checkpointing it on a timer. A signal handler may do almost nothing
// safely, so SIGINT and SIGTERM only set a flag; the time loop looks at it between steps, where a
// checkpoint and the partial results can be written (run_command.cpp). The handler is one-shot
// (SA_RESETHAND): a second Ctrl-C ends the program at once, without a checkpoint.
#pragma once

#include <optional>
#include <string>

namespace yeegap::cli {

/// Seconds in a duration such as "30min", "90 s", "1.5h"; 0 for "off" or "0"; nullopt when the
/// text is not a duration (a unit s, min or h is required, so "10" is not taken as seconds).
std::optional<double> parse_duration(const std::string& text);

/// Catches SIGINT and SIGTERM while it exists; the previous handlers come back on destruction.
class StopSignals {
 public:
  StopSignals();
  ~StopSignals();
  StopSignals(const StopSignals&) = delete;
  StopSignals& operator=(const StopSignals&) = delete;
  /// The signal received (SIGINT or SIGTERM), or 0.
  int received() const;
};

}  // namespace yeegap::cli
