// Temporary name, fsync, rename (see atomic_file.h).
#include "io/atomic_file.h"

#include <fcntl.h>
#include <fmt/format.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <stdexcept>

namespace yeegap::io {

namespace fs = std::filesystem;

namespace {

/// Forces the file's bytes to disk, so the rename cannot expose an empty file after a crash.
void sync_file(const std::string& path) {
  const int fd = ::open(path.c_str(), O_RDONLY);
  if (fd < 0 || ::fsync(fd) != 0) {
    const int err = errno;
    if (fd >= 0) ::close(fd);
    throw std::runtime_error(fmt::format("cannot flush '{}' to disk: {}", path, std::strerror(err)));
  }
  ::close(fd);
}

/// Makes the rename itself durable; best effort, since some file systems refuse fsync on a directory.
void sync_directory(const fs::path& dir) {
  const int fd = ::open(dir.empty() ? "." : dir.c_str(), O_RDONLY | O_DIRECTORY);
  if (fd < 0) return;
  ::fsync(fd);
  ::close(fd);
}

}  // namespace

std::string partial_path(const std::string& path) { return path + ".partial"; }

void commit_file(const std::string& partial, const std::string& path) {
  sync_file(partial);
  fs::rename(partial, path);  // atomic replacement of an older file within one file system (POSIX)
  sync_directory(fs::path(path).parent_path());
}

}  // namespace yeegap::io
