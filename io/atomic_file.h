// Making a finished file appear under its final name in one step: the file is written under a
// temporary name, flushed to disk, then renamed over the final name (POSIX rename is atomic within
// one file system), so a reader or a crash never sees half a file and an older file survives any
// failure. Used for results and checkpoints.
#pragma once

#include <string>

namespace yeegap::io {

/// The temporary name a file is written under before commit_file: `path` + ".partial".
std::string partial_path(const std::string& path);

/// Flushes `partial` to disk, renames it over `path` and makes the rename durable (best effort
/// for the directory). Throws std::runtime_error naming the file on failure; `partial` is then
/// still there for the caller to remove.
void commit_file(const std::string& partial, const std::string& path);

}  // namespace yeegap::io
