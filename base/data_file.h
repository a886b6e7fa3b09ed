// Reading a user's data file whole (an n,k table, an STL mesh): only a regular file of bounded
// size, so a directory, a device (/dev/zero reads forever) or a runaway file is refused with its
// name and what it is, instead of an obscure stream error or a read that never ends.
#pragma once

#include <cstdint>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>

#include "base/errors.h"

namespace yeegap {

inline std::string read_data_file(const std::string& path, const std::string& what, std::uintmax_t max_bytes,
                                  const Where& where) {
  namespace fs = std::filesystem;
  std::error_code ec;
  const fs::file_status status = fs::status(path, ec);
  if (!fs::exists(status)) throw SceneError(where, "cannot open the " + what + " '" + path + "': no such file");
  if (fs::is_directory(status)) throw SceneError(where, "the " + what + " '" + path + "' is a directory, not a file");
  if (!fs::is_regular_file(status))
    throw SceneError(where, "the " + what + " '" + path + "' is not a regular file (a device, pipe or socket)");
  const std::uintmax_t size = fs::file_size(path, ec);
  if (!ec && size > max_bytes)
    throw SceneError(where, "the " + what + " '" + path + "' holds " + std::to_string(size) + " bytes; at most " +
                                std::to_string(max_bytes) + " are read");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw SceneError(where, "cannot open the " + what + " '" + path + "'");
  return std::string((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
}

}  // namespace yeegap
