// Writes one run's results (solver::RunResults, SI units) to an HDF5 file in the layout that
// docs/results_file.md documents: format "yeegap-results", format_version 1. The file appears atomically:
// it is written as <path>.partial and renamed over <path> only once complete and synced, so a
// failed write never destroys an older results file of the same name.
#pragma once

#include <string>

#include "solver/results.h"
#include "solver/scene.h"

namespace yeegap::io {

inline constexpr const char* results_format = "yeegap-results";
/// Raised when a reader of the previous version would misread the file (docs/results_file.md, "Versions").
inline constexpr int results_format_version = 1;

/// About the program run, stored under /program.
struct WriteInfo {
  std::string program_version;  // e.g. YEEGAP_VERSION
  std::string command_line;     // the arguments as typed, joined by spaces
  std::string start_time;       // when the run started, ISO 8601 with offset (2024-05-01T14:03:22+02:00)
  int threads = 1;              // worker threads used by the run
};

/// Checks, before a run starts, that a results file can be written at `path`: its directory
/// exists, is a directory and accepts a new file (tried for real, since permission bits do not
/// tell the whole story for root or on network file systems). Throws std::runtime_error naming
/// `path` and the reason.
void check_writable(const std::string& path);

/// Writes `results` (with the scene's text and dipoles, and `info`) to `path` via `path + ".partial"`
/// and an atomic rename. Throws std::runtime_error naming `path` if anything fails (inconsistent
/// sizes in `results`, HDF5 or file-system errors); then no .partial file is left behind and an
/// existing file at `path` is untouched.
void write_results(const std::string& path, const solver::RunResults& results, const solver::Scene& scene,
                   const WriteInfo& info);

}  // namespace yeegap::io
