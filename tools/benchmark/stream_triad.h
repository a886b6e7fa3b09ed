// Memory bandwidth by the STREAM triad a[i] = b[i] + s c[i] over double arrays far larger than the
// caches (McCalpin 1995, "Memory Bandwidth and Machine Balance in Current High Performance
// Computers", IEEE TCCA Newsletter). Reported as STREAM does: 24 bytes per iteration (two loads,
// one store); the write-allocate read of a[] is not counted.
#pragma once

#include <cstddef>

namespace yeegap::benchmark {

/// Bytes per triad iteration by McCalpin's STREAM convention.
inline constexpr double triad_bytes_per_iteration = 24.0;

/// Double arrays a, b, c of n elements, placed in memory by first touch from the threads that use them.
class TriadArrays {
 public:
  explicit TriadArrays(std::size_t n);
  ~TriadArrays();
  TriadArrays(const TriadArrays&) = delete;
  TriadArrays& operator=(const TriadArrays&) = delete;

  /// Runs the triad once with the current OpenMP thread count; bandwidth in GB/s (1e9 B/s).
  double run_once();
  std::size_t size() const { return n_; }
  /// After a run: checks a[] against the value the triad must have left, so the loop cannot be
  /// optimised away.
  bool result_is_right() const;

 private:
  std::size_t n_;
  double* a_;
  double* b_;
  double* c_;
};

}  // namespace yeegap::benchmark
