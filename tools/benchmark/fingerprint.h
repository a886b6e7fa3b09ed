// A quick fingerprint of arrays: 64-bit FNV-1a (Fowler, Noll and Vo; common practice), taken over
// 8-byte words rather than bytes to be eight times faster. Any differing bit changes it with near
// certainty, which is all the benchmark needs to say "the same fields".
#pragma once

#include <cstdint>
#include <cstring>

namespace yeegap::benchmark {

inline constexpr std::uint64_t fingerprint_start = 14695981039346656037ull;

/// Folds `bytes` bytes at `data` into the fingerprint `h`.
inline std::uint64_t fingerprint(std::uint64_t h, const void* data, std::size_t bytes) {
  constexpr std::uint64_t prime = 1099511628211ull;
  const auto* p = static_cast<const unsigned char*>(data);
  std::size_t b = 0;
  for (; b + 8 <= bytes; b += 8) {
    std::uint64_t w;
    std::memcpy(&w, p + b, 8);
    h = (h ^ w) * prime;
  }
  for (; b < bytes; ++b) h = (h ^ p[b]) * prime;
  return h;
}

}  // namespace yeegap::benchmark
