// The order of convergence of a series of errors e at resolutions x: minus the least-squares slope
// of log e against log x (second order: the error falls fourfold when the cells halve).
#pragma once

#include <cmath>
#include <vector>

namespace yeegap::test_support {

inline double fitted_order(const std::vector<double>& x, const std::vector<double>& e) {
  double sx = 0, sy = 0, sxx = 0, sxy = 0;
  const double n = static_cast<double>(e.size());
  for (std::size_t i = 0; i < e.size(); ++i) {
    const double lx = std::log(x[i]), ly = std::log(e[i]);
    sx += lx, sy += ly, sxx += lx * lx, sxy += lx * ly;
  }
  return -(n * sxy - sx * sy) / (n * sxx - sx * sx);
}

}  // namespace yeegap::test_support
