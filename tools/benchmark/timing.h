// Best, median and worst of repeated measurements: the best is the headline figure (least
// disturbed by other work on a shared machine), the others show how much the machine disturbed it.
#pragma once

#include <algorithm>
#include <chrono>
#include <vector>

namespace yeegap::benchmark {

struct Spread {
  double best = 0, median = 0, worst = 0;  // of a rate: larger is better
};

/// Spread of rates (larger is better). Empty input gives zeros.
inline Spread spread_of(std::vector<double> rates) {
  Spread s;
  if (rates.empty()) return s;
  std::sort(rates.begin(), rates.end());
  s.worst = rates.front();
  s.best = rates.back();
  const std::size_t m = rates.size() / 2;
  s.median = rates.size() % 2 ? rates[m] : 0.5 * (rates[m - 1] + rates[m]);
  return s;
}

inline double seconds_since(std::chrono::steady_clock::time_point t0) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
}

}  // namespace yeegap::benchmark
