// STREAM triad (see stream_triad.h). Every loop uses the same static OpenMP schedule, so each
// thread touches first, and later streams, the same part of the arrays.
#include "tools/benchmark/stream_triad.h"

#include <chrono>
#include <cstdlib>
#include <new>

namespace yeegap::benchmark {

namespace {
constexpr std::size_t alignment = 64;  // one cache line
constexpr double scalar = 3.0;         // the STREAM triad scalar
constexpr double a0 = 1.0, b0 = 2.0, c0 = 0.5;

double* allocate(std::size_t n) {
  void* p = std::aligned_alloc(alignment, ((n * sizeof(double) + alignment - 1) / alignment) * alignment);
  if (!p) throw std::bad_alloc();
  return static_cast<double*>(p);
}
}  // namespace

TriadArrays::TriadArrays(std::size_t n) : n_(n), a_(allocate(n)), b_(allocate(n)), c_(allocate(n)) {
  double* __restrict a = a_;
  double* __restrict b = b_;
  double* __restrict c = c_;
  const long long m = static_cast<long long>(n);
#pragma omp parallel for schedule(static)
  for (long long i = 0; i < m; ++i) {
    a[i] = a0;
    b[i] = b0;
    c[i] = c0;
  }
}

TriadArrays::~TriadArrays() {
  std::free(a_);
  std::free(b_);
  std::free(c_);
}

double TriadArrays::run_once() {
  double* __restrict a = a_;
  const double* __restrict b = b_;
  const double* __restrict c = c_;
  const long long m = static_cast<long long>(n_);
  const auto t0 = std::chrono::steady_clock::now();
#pragma omp parallel for schedule(static)
  for (long long i = 0; i < m; ++i) a[i] = b[i] + scalar * c[i];
  const double t = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return triad_bytes_per_iteration * static_cast<double>(n_) / t * 1e-9;
}

bool TriadArrays::result_is_right() const {
  const double expected = b0 + scalar * c0;  // b and c never change, so every triad writes this
  for (std::size_t i = 0; i < n_; i += 4096)
    if (a_[i] != expected) return false;
  return a_[n_ - 1] == expected;
}

}  // namespace yeegap::benchmark
