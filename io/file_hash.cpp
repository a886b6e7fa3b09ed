// FNV-1a 64 over a file's bytes (see file_hash.h).
#include "io/file_hash.h"

#include <cerrno>
#include <cstring>
#include <fstream>
#include <stdexcept>
#include <vector>

#include <fmt/format.h>

namespace yeegap::io {

namespace {
// FNV-1a 64 parameters (offset basis and prime, as published with the algorithm).
constexpr std::uint64_t fnv_offset_basis = 0xcbf29ce484222325ULL;
constexpr std::uint64_t fnv_prime = 0x100000001b3ULL;

std::uint64_t add_bytes(std::uint64_t h, const char* data, std::size_t n) {
  for (std::size_t i = 0; i < n; ++i) {
    h ^= static_cast<unsigned char>(data[i]);
    h *= fnv_prime;
  }
  return h;
}
}  // namespace

std::uint64_t fnv1a_64(std::string_view bytes) { return add_bytes(fnv_offset_basis, bytes.data(), bytes.size()); }

std::uint64_t file_hash(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw std::runtime_error(fmt::format("cannot read '{}': {}", path, std::strerror(errno)));
  std::uint64_t h = fnv_offset_basis;
  std::vector<char> buffer(1 << 16);
  while (in) {
    in.read(buffer.data(), static_cast<std::streamsize>(buffer.size()));
    h = add_bytes(h, buffer.data(), static_cast<std::size_t>(in.gcount()));
  }
  if (in.bad()) throw std::runtime_error(fmt::format("cannot read '{}': {}", path, std::strerror(errno)));
  return h;
}

std::string hash_text(std::uint64_t hash) { return fmt::format("fnv1a64:{:016x}", hash); }

}  // namespace yeegap::io
