// The dip finder (solver/outputs/reflectance_dip.h) on analytic curves whose minimum and half-depth width are
// known in closed form: the single-resonance form R = B |x - z|^2 / |x - p|^2 and its Lorentzian
// special case (Raether, Surface Plasmons, Springer 1988, ch. 2), a Gaussian dip outside that
// family, noisy samples, the flags, and the sensitivity and figure of merit of a shifted pair.
#include <gtest/gtest.h>

#include <cmath>
#include <algorithm>
#include <cstdint>
#include <vector>

#include "solver/outputs/reflectance_dip.h"

namespace yeegap::solver {
namespace {

struct Curve {
  std::vector<double> x, r;
};

template <class F>
Curve sample(F f, double from, double to, double step) {
  Curve c;
  for (int k = 0; from + k * step <= to + 1e-9; ++k) {
    c.x.push_back(from + k * step);
    c.r.push_back(f(c.x.back()));
  }
  return c;
}

ReflectanceDip dip(const Curve& c, const DipOptions& o = {}) { return find_reflectance_dip(c.x, c.r, o); }

// Minimum of a smooth function on [lo, hi] by golden-section search, to ~1e-13: the reference.
template <class F>
double golden_minimum(F f, double lo, double hi) {
  const double g = (std::sqrt(5.0) - 1) / 2;
  for (int it = 0; it < 200; ++it) {
    const double a = hi - g * (hi - lo), b = lo + g * (hi - lo);
    if (f(a) < f(b)) hi = b;
    else lo = a;
  }
  return 0.5 * (lo + hi);
}

// R = B ((x-a)^2 + b^2) / ((x-c)^2 + d^2): zero at a + ib, pole at c + id. With a = c this is the
// Lorentzian dip B - A / (1 + ((x-c)/d)^2), A = B (1 - b^2/d^2), Raether's form of the SPR dip.
struct Resonance {
  double B, a, b, c, d;
  double operator()(double x) const { return B * ((x - a) * (x - a) + b * b) / ((x - c) * (x - c) + d * d); }
};

TEST(ReflectanceDip, FitFindsTheMinimumOfTheResonanceFormTo1e6) {
  // The fitted form contains these curves exactly, so the only errors are rounding: the position must
  // be right to 1e-6 (in the x unit, here degrees) at any sampling that resolves the dip, wherever
  // the minimum falls between samples. Reference: golden-section minimum of the analytic curve.
  for (const Resonance f : {Resonance{0.97, 72.3, 0.25, 72.0, 1.6}, Resonance{0.95, 43.8, 0.05, 43.8, 0.5},
                            Resonance{0.90, 50.0, 0.4, 50.6, 3.0}}) {
    const double truth = golden_minimum(f, f.c - 5, f.c + 5);
    for (double step : {0.01, 0.05, 0.1, 0.2})
      for (double offset : {0.0, 0.013, 0.037}) {
        const Curve c = sample(f, f.c - 12 + offset, f.c + 12, step);
        const ReflectanceDip d = dip(c);
        EXPECT_NEAR(d.position, truth, 1e-6) << "step " << step << " offset " << offset;
        EXPECT_NEAR(d.r_min, f(truth), 1e-9);
        EXPECT_LT(d.r_min, *std::min_element(c.r.begin(), c.r.end()) + 1e-12);
        EXPECT_EQ(d.flags & dip_fit_fallback, 0u);
      }
  }
}

TEST(ReflectanceDip, HalfDepthWidthOfALorentzianMatchesTheClosedFormAtFourthOrder) {
  // Lorentzian R = B - A / (1 + u^2), u = (x - x0)/w, scanned over [x0 - 6w, x0 + 9w]: the lower
  // shoulder is the left end, so baseline = R(x0 - 6w), and the half-depth level h = (baseline + B - A)/2
  // is crossed at u = +-sqrt(A / (B - h) - 1). Each crossing comes from the cubic through four
  // samples, so the error falls as step^4 (Lagrange interpolation remainder): halving the step must
  // cut it by more than 8 (third order would give 8). Measured: 1.5e-4 at 5 samples per w, 1.3e-5 at
  // 10, 1.0e-6 at 20, 2.3e-8 at 50; the bounds below are 2x those.
  const double B = 0.98, A = 0.95, x0 = 71.3, w = 1.7;
  const Resonance f{B, x0, w * std::sqrt(1 - A / B), x0, w};
  const double baseline = f(x0 - 6 * w), h = 0.5 * (baseline + B - A);
  const double width = 2 * w * std::sqrt(A / (B - h) - 1);
  auto error = [&](int per_w) {
    const ReflectanceDip d = dip(sample(f, x0 - 6 * w, x0 + 9 * w, w / per_w));
    EXPECT_NEAR(d.baseline, baseline, 1e-12);
    EXPECT_NEAR(d.half_level, h, 1e-9);
    EXPECT_NEAR(0.5 * (d.left + d.right), x0, std::abs(d.width - width));  // symmetric about x0
    EXPECT_TRUE(d.ok()) << describe_dip_flags(d.flags);
    return std::abs(d.width / width - 1);
  };
  const double e5 = error(5), e10 = error(10), e20 = error(20), e50 = error(50);
  EXPECT_LT(e5, 3e-4);
  EXPECT_LT(e50, 5e-8);
  EXPECT_GT(e5 / e10, 8.0);
  EXPECT_GT(e10 / e20, 8.0);
}

TEST(ReflectanceDip, GaussianDipOutsideTheFittedFormIsStillLocatedClosely) {
  // R = 1 - 0.9 exp(-((x - x0)/w)^2) is not of the resonance form; its minimum is x0 by symmetry and
  // its half-depth width 2 w sqrt(ln 2) (baseline 1 within 1e-25). The fit uses the bottom quarter,
  // where the resonance form nearly matches any smooth dip; what remains is a model bias, measured:
  // position within 6e-5 (3e-5 w), R_min 4e-5 low, width 3e-4 (from the half level moving with
  // R_min). Bounds 1e-4 w, 1e-4 and 1e-3 w: a fit that ignored the curvature (a chord, the lowest
  // sample) would miss the position by up to half a step, 0.15 here.
  const double x0 = 62.345, w = 2.0;
  auto f = [&](double x) { return 1 - 0.9 * std::exp(-(x - x0) * (x - x0) / (w * w)); };
  for (double step : {0.02, 0.1, 0.3}) {
    const ReflectanceDip d = dip(sample(f, 50.0, 75.0, step));
    EXPECT_NEAR(d.position, x0, 1e-4 * w) << "step " << step;
    EXPECT_NEAR(d.r_min, 0.1, 1e-4);
    EXPECT_NEAR(d.width, 2 * w * std::sqrt(std::log(2.0)), 1e-3 * w);
  }
}

TEST(ReflectanceDip, NoiseOfOneInTenThousandMovesTheMinimumByLittle) {
  // Deterministic pseudo-random noise of +-1e-4 on a Lorentzian dip of width ~3.4 sampled at 0.05:
  // the least-squares fit averages it; the minimum moves by under 1e-3 (0.03 % of the width).
  const Resonance f{0.98, 70.0, 1.7 * std::sqrt(1 - 0.95 / 0.98), 70.0, 1.7};
  Curve c = sample(f, 60.0, 80.0, 0.05);
  std::uint32_t s = 7;
  for (double& r : c.r) r += 1e-4 * (2 * ((s = s * 1664525u + 1013904223u) / 4294967296.0) - 1);
  const ReflectanceDip d = dip(c);
  EXPECT_NEAR(d.position, 70.0, 1e-3);
  EXPECT_NEAR(d.r_min, 0.03, 2e-4);
  EXPECT_TRUE(d.ok());
}

TEST(ReflectanceDip, FlagsADipAtTheScanEdgeAShallowDipAndACoarseScan) {
  const Resonance f{0.97, 72.3, 0.25, 72.0, 1.6};
  // The minimum beyond the scan's end: the lowest sample is the last one.
  const ReflectanceDip edge = dip(sample(f, 60.0, 71.0, 0.1));
  EXPECT_TRUE(edge.flags & dip_at_scan_edge);
  EXPECT_NEAR(edge.position, 71.0, 1e-9);
  EXPECT_TRUE(std::isnan(edge.width));
  // A dip 0.02 deep (Lorentzian A = 0.02) is flagged shallow but still measured.
  const Resonance shallow{0.98, 50, 1.5 * std::sqrt(1 - 0.02 / 0.98), 50, 1.5};
  const ReflectanceDip sd = dip(sample(shallow, 40.0, 60.0, 0.1));
  EXPECT_EQ(sd.flags, unsigned(dip_shallow)) << describe_dip_flags(sd.flags);
  EXPECT_NEAR(sd.position, 50.0, 1e-6);
  // Steps of 1 across a dip ~3 wide: three samples inside the half-depth width.
  const ReflectanceDip coarse = dip(sample(f, 60.3, 85.0, 1.0));
  EXPECT_TRUE(coarse.flags & dip_unresolved);
  EXPECT_LT(coarse.width_points, 5);
  // Three samples: too few to fit five unknowns, so the parabola through them is used.
  const ReflectanceDip three = dip(Curve{{71.0, 72.0, 73.0}, {f(71.0), f(72.0), f(73.0)}});
  EXPECT_TRUE(three.flags & dip_fit_fallback);
  EXPECT_GT(three.position, 71.0);
  EXPECT_LT(three.position, 73.0);
  EXPECT_NE(describe_dip_flags(three.flags).find("parabola"), std::string::npos);
  EXPECT_EQ(describe_dip_flags(0), "");
}

TEST(ReflectanceDip, SensitivityAndFigureOfMeritFollowFromAShiftedPair) {
  // Two Lorentzian dips 0.1234 apart for delta_n = 1e-3: sensitivity 123.4 per RIU, and the figure of
  // merit is that over the reference dip's closed-form width (as in the width test above).
  const double B = 0.98, A = 0.95, w = 1.7, dn = 1e-3, shift = 0.1234;
  const Resonance ref{B, 71.0, w * std::sqrt(1 - A / B), 71.0, w};
  Resonance raised = ref;
  raised.a += shift;
  raised.c += shift;
  const ReflectanceDip d0 = dip(sample(ref, 60.0, 85.0, 0.05)), d1 = dip(sample(raised, 60.0, 85.0, 0.05));
  const SensorFigures s = sensor_figures(d0, d1, dn);
  EXPECT_NEAR(s.sensitivity, shift / dn, 1e-6 / dn);
  EXPECT_NEAR(s.figure_of_merit, shift / dn / d0.width, 1e-9);
  EXPECT_NEAR(d0.width, 2 * w * std::sqrt(A / (B - 0.5 * (ref(60.0) + B - A)) - 1), 1e-5);
  EXPECT_EQ(s.flags, 0u);
  // The flags of either dip are carried: a raised curve whose dip leaves the scan.
  const ReflectanceDip gone = dip(sample(raised, 60.0, 71.0, 0.05));
  EXPECT_TRUE(sensor_figures(d0, gone, dn).flags & dip_at_scan_edge);
}

TEST(ReflectanceDipDeathTest, RefusesPositionsThatDoNotIncrease) {
  const std::vector<double> x{1, 3, 2}, r{0.5, 0.1, 0.5};
  EXPECT_DEATH(find_reflectance_dip(x, r), "positions must increase");
}

}  // namespace
}  // namespace yeegap::solver
