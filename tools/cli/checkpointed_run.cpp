// Checkpoints around a run (see checkpointed_run.h).
#include "checkpointed_run.h"

#include <chrono>
#include <csignal>
#include <cstdio>
#include <filesystem>

#include "run_control.h"

namespace yeegap::cli {

void resume_or_start(solver::Checkpointable& state, const solver::Scene& scene, const CheckpointSettings& c,
                     bool resume) {
  std::error_code ec;
  if (resume) {
    io::read_checkpoint(c.path, state, scene, c.info);
    std::fprintf(stderr, "yeegap: resuming from %s at %s\n", c.path.c_str(), c.where(state.state_counters().step).c_str());
  } else if (std::filesystem::exists(c.path, ec)) {
    std::fprintf(stderr, "yeegap: note: %s is from an earlier run that did not finish; this run starts over and "
                 "replaces it (--resume continues it instead)\n", c.path.c_str());
  }
}

CheckpointedResults run_with_checkpoints(solver::Checkpointable& state, const RunFunction& run,
                                         const solver::Scene& scene, const CheckpointSettings& c,
                                         ProgressLine& progress) {
  using clock = std::chrono::steady_clock;
  CheckpointedResults out;
  StopSignals signals;
  auto last_checkpoint = clock::now();
  // Between two steps: stop on a signal, or write the periodic checkpoint. A checkpoint that
  // cannot be written (full disk) is reported and the run goes on: its results may still fit.
  const auto between_steps = [&] {
    if (signals.received() != 0) return true;
    if (c.every_seconds > 0 && std::chrono::duration<double>(clock::now() - last_checkpoint).count() >= c.every_seconds) {
      try {
        const auto begin = clock::now();
        io::write_checkpoint(c.path, state, scene, c.info);
        progress.break_line();
        std::error_code ec;
        std::fprintf(stderr, "yeegap: checkpoint at %s in %s (%.3g MB, %.1f s)\n", c.where(state.state_counters().step).c_str(),
                     c.path.c_str(), std::filesystem::file_size(c.path, ec) / 1e6,
                     std::chrono::duration<double>(clock::now() - begin).count());
      } catch (const std::exception& e) {
        progress.break_line();
        std::fprintf(stderr, "yeegap: warning: %s; the run goes on\n", e.what());
      }
      last_checkpoint = clock::now();
    }
    return false;
  };
  out.results = run([&](const solver::Progress& p) { progress.update(p); }, between_steps);
  out.interrupted = out.results.summary.stop_reason == "interrupted";
  if (out.interrupted) {
    progress.break_line();
    std::fprintf(stderr, "yeegap: stopped by %s at %s\n", signals.received() == SIGINT ? "SIGINT" : "SIGTERM",
                 c.where(state.state_counters().step).c_str());
    try {  // first: it is what lets the run finish later
      io::write_checkpoint(c.path, state, scene, c.info);
      std::fprintf(stderr, "yeegap: checkpoint in %s\n", c.path.c_str());
    } catch (const std::exception& e) {
      out.checkpoint_failed = true;  // the partial results are still worth writing
      std::fprintf(stderr, "yeegap: %s\n", e.what());
    }
  }
  return out;
}

}  // namespace yeegap::cli
