// Dip finding for sampled reflectance curves (definitions and the reason for this fit: docs/sensor.md).
// The fit is linear: R (u^2 + q1 u + q0) = b u^2 + p1 u + p0 is solved for q1, q0, b, p1, p0 by least
// squares (Levy's linearisation of a rational fit), so it needs no starting guess and is exact for
// any curve of the single-resonance form, the Lorentzian dip included.
#include "solver/outputs/reflectance_dip.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::solver {
namespace {

struct Vertex {
  double x, r;
};

// Minimum of the parabola through three samples (the fallback when the resonance form cannot be fitted).
Vertex parabola_vertex(double x0, double r0, double x1, double r1, double x2, double r2) {
  const double d01 = (r1 - r0) / (x1 - x0), d12 = (r2 - r1) / (x2 - x1);
  const double a = (d12 - d01) / (x2 - x0);  // second divided difference
  if (!(a > 0)) return {x1, r1};
  const double xv = 0.5 * (x0 + x1) - d01 / (2 * a);
  return {xv, r1 + d01 * (xv - x1) + a * (xv - x0) * (xv - x1)};
}

// Least-squares fit of R = (b u^2 + p1 u + p0) / (u^2 + q1 u + q0) on samples [lo, hi], u = (x - xc)/s,
// and the minimum of the fitted curve inside the window; false when the fit is ill-posed (a real
// pole, no minimum inside the window, a rank-deficient system).
bool fit_resonance_form(std::span<const double> x, std::span<const double> r, int lo, int hi, double xc,
                        Vertex& out) {
  const int m = hi - lo + 1;
  const double s = 0.5 * (x[hi] - x[lo]);
  Eigen::MatrixXd a(m, 5);
  Eigen::VectorXd rhs(m);
  for (int k = 0; k < m; ++k) {
    const double u = (x[lo + k] - xc) / s, y = r[lo + k];
    a.row(k) << -y * u, -y, u * u, u, 1.0;
    rhs(k) = y * u * u;
  }
  const Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(a);
  if (qr.rank() < 5) return false;
  const Eigen::VectorXd c = qr.solve(rhs);
  const double q1 = c(0), q0 = c(1), b = c(2), p1 = c(3), p0 = c(4);
  if (!(q0 - 0.25 * q1 * q1 > 0)) return false;  // the denominator has a real root: a pole on the scan
  auto f = [&](double u) { return (b * u * u + p1 * u + p0) / (u * u + q1 * u + q0); };
  // d/du (N/D) = 0  <=>  (b q1 - p1) u^2 + 2 (b q0 - p0) u + (p1 q0 - p0 q1) = 0 (the cubic terms cancel).
  const double c2 = b * q1 - p1, c1 = 2 * (b * q0 - p0), c0 = p1 * q0 - p0 * q1;
  double roots[2];
  int n_roots = 0;
  if (std::abs(c2) < 1e-14 * (std::abs(c1) + std::abs(c0))) {
    if (c1 != 0) roots[n_roots++] = -c0 / c1;
  } else {
    const double disc = c1 * c1 - 4 * c2 * c0;
    if (disc < 0) return false;
    // Stable form of the two roots (no cancellation between -c1 and the square root).
    const double qq = -0.5 * (c1 + std::copysign(std::sqrt(disc), c1));
    roots[n_roots++] = qq / c2;
    if (qq != 0) roots[n_roots++] = c0 / qq;
  }
  const double u_lo = (x[lo] - xc) / s, u_hi = (x[hi] - xc) / s;
  bool found = false;
  for (int k = 0; k < n_roots; ++k) {
    const double u = roots[k];
    if (!(u > u_lo && u < u_hi)) continue;
    const double v = f(u);
    if (!(v < f(u_lo) && v < f(u_hi))) continue;  // a maximum of the fitted curve, not the dip
    if (!found || v < out.r) out = {xc + s * u, v};
    found = true;
  }
  return found;
}

// x where the samples cross `level` between j and j+1 (r[j] and r[j+1] on either side of it), from
// the cubic through the four samples around the interval: error O(h^4) against O(h^2) for a chord.
double crossing(std::span<const double> x, std::span<const double> r, int j, double level) {
  const int n = static_cast<int>(x.size());
  if (n < 4) return x[j] + (level - r[j]) * (x[j + 1] - x[j]) / (r[j + 1] - r[j]);
  const int s = std::clamp(j - 1, 0, n - 4);
  auto cubic = [&](double t) {
    double sum = 0;
    for (int a = s; a < s + 4; ++a) {
      double w = r[a];
      for (int b = s; b < s + 4; ++b)
        if (b != a) w *= (t - x[b]) / (x[a] - x[b]);
      sum += w;
    }
    return sum - level;
  };
  double lo = x[j], hi = x[j + 1];
  const bool lo_above = r[j] >= level;  // the cubic passes through the samples, so it brackets
  for (int it = 0; it < 200 && hi - lo > 1e-15 * (std::abs(lo) + std::abs(hi)); ++it) {
    const double mid = 0.5 * (lo + hi);
    ((cubic(mid) >= 0) == lo_above ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}

}  // namespace

ReflectanceDip find_reflectance_dip(std::span<const double> x, std::span<const double> r, const DipOptions& opt) {
  const int n = static_cast<int>(x.size());
  YG_CHECK(n >= 1 && r.size() == x.size(), fmt::format("{} positions, {} reflectances", x.size(), r.size()));
  for (int k = 0; k < n; ++k) {
    YG_CHECK(std::isfinite(x[k]) && std::isfinite(r[k]), fmt::format("sample {} is not finite", k));
    YG_CHECK(k == 0 || x[k] > x[k - 1], fmt::format("positions must increase: x[{}] = {} after {}", k, x[k], x[k - 1]));
  }
  ReflectanceDip d;
  const int i = static_cast<int>(std::min_element(r.begin(), r.end()) - r.begin());
  d.position = x[i];
  d.r_min = r[i];
  if (i == 0 || i == n - 1) {
    d.flags |= dip_at_scan_edge;
    return d;
  }
  d.baseline = std::min(*std::max_element(r.begin(), r.begin() + i + 1), *std::max_element(r.begin() + i, r.end()));

  // Fit window: the samples below the fit level around the lowest one, widened to min_fit_points.
  const double fit_level = r[i] + opt.fit_level * (d.baseline - r[i]);
  int lo = i, hi = i;
  while (lo > 0 && r[lo - 1] < fit_level) --lo;
  while (hi < n - 1 && r[hi + 1] < fit_level) ++hi;
  while (hi - lo + 1 < opt.min_fit_points && (lo > 0 || hi < n - 1)) {
    if (lo > 0) --lo;
    if (hi - lo + 1 < opt.min_fit_points && hi < n - 1) ++hi;
  }
  d.fit_points = hi - lo + 1;
  Vertex v{x[i], r[i]};
  if (d.fit_points < 6 || !fit_resonance_form(x, r, lo, hi, x[i], v)) {
    d.flags |= dip_fit_fallback;
    v = parabola_vertex(x[i - 1], r[i - 1], x[i], r[i], x[i + 1], r[i + 1]);
  }
  d.position = v.x;
  d.r_min = v.r;
  d.half_level = 0.5 * (d.baseline + d.r_min);
  if (d.baseline - d.r_min < opt.min_depth) d.flags |= dip_shallow;

  // Half-depth crossings: the nearest samples at or above the level on each side. The baseline is
  // the lower shoulder, so both exist whenever the dip is deeper than the noise of its bottom.
  int jl = i, jr = i;
  while (jl > 0 && r[jl] < d.half_level) --jl;
  while (jr < n - 1 && r[jr] < d.half_level) ++jr;
  if (r[i] >= d.half_level || r[jl] < d.half_level || r[jr] < d.half_level) {
    d.flags |= dip_unresolved;
    return d;
  }
  d.left = crossing(x, r, jl, d.half_level);
  d.right = crossing(x, r, jr - 1, d.half_level);
  d.width = d.right - d.left;
  d.width_points = jr - jl - 1;
  if (d.width_points < opt.min_width_points) d.flags |= dip_unresolved;
  return d;
}

std::string describe_dip_flags(unsigned flags, const DipOptions& opt) {
  std::string s;
  auto add = [&](unsigned bit, const std::string& text) {
    if (!(flags & bit)) return;
    if (!s.empty()) s += "; ";
    s += text;
  };
  add(dip_at_scan_edge, "the lowest reflectance is at an end of the scan: the minimum may lie outside it");
  add(dip_shallow, fmt::format("the dip is shallower than {} in reflectance", opt.min_depth));
  add(dip_unresolved, fmt::format("fewer than {} samples inside the half-depth width: scan more finely",
                                  opt.min_width_points));
  add(dip_fit_fallback, "the resonance form did not fit; the minimum is the parabola through the three lowest samples");
  return s;
}

SensorFigures sensor_figures(const ReflectanceDip& reference, const ReflectanceDip& raised, double delta_n) {
  YG_CHECK(delta_n != 0 && std::isfinite(delta_n), fmt::format("delta_n = {}", delta_n));
  SensorFigures f;
  f.flags = reference.flags | raised.flags;
  f.shift = raised.position - reference.position;
  f.sensitivity = f.shift / delta_n;
  f.figure_of_merit = std::abs(f.sensitivity) / reference.width;  // NaN when the width is undefined
  return f;
}

}  // namespace yeegap::solver
