// Eigenvalues of a symmetric 3x3 matrix (see symmetric_3x3.h).
#include "solver/media/symmetric_3x3.h"

#include <algorithm>
#include <cmath>

namespace yeegap::solver {

std::array<double, 3> symmetric_eigenvalues(const Matrix3& a) {
  const double p1 = a[0][1] * a[0][1] + a[0][2] * a[0][2] + a[1][2] * a[1][2];
  std::array<double, 3> e{a[0][0], a[1][1], a[2][2]};
  if (p1 == 0) {
    std::sort(e.begin(), e.end());
    return e;
  }
  const double q = (a[0][0] + a[1][1] + a[2][2]) / 3;
  const double p2 = (a[0][0] - q) * (a[0][0] - q) + (a[1][1] - q) * (a[1][1] - q) + (a[2][2] - q) * (a[2][2] - q) + 2 * p1;
  const double p = std::sqrt(p2 / 6);
  Matrix3 b;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) b[i][j] = (a[i][j] - (i == j ? q : 0)) / p;
  const double det = b[0][0] * (b[1][1] * b[2][2] - b[1][2] * b[2][1]) - b[0][1] * (b[1][0] * b[2][2] - b[1][2] * b[2][0]) +
                     b[0][2] * (b[1][0] * b[2][1] - b[1][1] * b[2][0]);
  const double r = std::clamp(det / 2, -1.0, 1.0);
  const double phi = std::acos(r) / 3;
  const double hi = q + 2 * p * std::cos(phi), lo = q + 2 * p * std::cos(phi + 2.0943951023931957);
  return {lo, 3 * q - hi - lo, hi};
}

}  // namespace yeegap::solver
