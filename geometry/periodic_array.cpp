// Periodic array (see periodic_array.h). Search: start with the cube of copies within r = 1 of the
// copy nearest to p; any copy outside the cube differs along some axis a by more than r, so its
// box is at least g_a(r) away along a; stop when the best value found is at most min_a g_a(r)
// (for a point inside a copy: when no remaining copy's box holds the point).
#include "geometry/periodic_array.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

constexpr double inf = std::numeric_limits<double>::infinity();

class PeriodicArray final : public Shape {
 public:
  PeriodicArray(ShapePtr body, std::array<int, 3> counts, Vec3 pitch)
      : body_(std::move(body)), n_(counts), pitch_(pitch), box_(body_->bounds()) {
    for (int a = 0; a < 3; ++a) {
      first_[a] = n_[a] > 1 ? -0.5 * (n_[a] - 1) * pitch_[a] : 0.0;
      box_mid_[a] = n_[a] > 1 ? 0.5 * (box_.lo[a] + box_.hi[a]) : 0.0;
    }
  }

  double signed_distance(const Vec3& p) const override {
    std::array<int, 3> near{};
    for (int a = 0; a < 3; ++a)
      near[a] = n_[a] > 1 ? std::clamp(static_cast<int>(std::lround((p[a] - box_mid_[a] - first_[a]) / pitch_[a])), 0,
                                       n_[a] - 1)
                          : 0;
    double best = inf;
    int done = -1;  // copies with Chebyshev index distance <= done are already evaluated
    for (int r = 1;; ++r) {
      std::array<int, 3> lo{}, hi{};
      for (int a = 0; a < 3; ++a) {
        lo[a] = std::max(0, near[a] - r);
        hi[a] = std::min(n_[a] - 1, near[a] + r);
      }
      for (int k = lo[2]; k <= hi[2]; ++k)
        for (int j = lo[1]; j <= hi[1]; ++j)
          for (int i = lo[0]; i <= hi[0]; ++i) {
            const int cheb = std::max({std::abs(i - near[0]), std::abs(j - near[1]), std::abs(k - near[2])});
            if (cheb <= done) continue;
            best = std::min(best, body_->signed_distance(p - offset({i, j, k})));
          }
      done = r;
      // Lower bound on the distance to any copy outside the cube, axis by axis.
      double outside = inf;
      bool any_left = false;
      for (int a = 0; a < 3; ++a) {
        for (int idx : {near[a] - r - 1, near[a] + r + 1}) {
          if (idx < 0 || idx >= n_[a]) continue;
          any_left = true;
          const double c = first_[a] + idx * pitch_[a];
          const double gap = std::max({box_.lo[a] + c - p[a], p[a] - (box_.hi[a] + c), 0.0});
          outside = std::min(outside, gap);
        }
      }
      // A copy whose box does not hold p has a value of at least its box distance; so a point
      // inside some copy is settled once no remaining box holds it (overlapping copies).
      const bool settled = best < 0 ? outside > 0 : best <= outside;
      if (!any_left || settled) return best;
    }
  }

  Aabb bounds() const override {
    Aabb b = box_;
    for (int a = 0; a < 3; ++a) {
      b.lo[a] += first_[a];
      b.hi[a] += first_[a] + (n_[a] - 1) * (n_[a] > 1 ? pitch_[a] : 0.0);
    }
    return b;
  }

 private:
  Vec3 offset(std::array<int, 3> idx) const {
    Vec3 o;
    for (int a = 0; a < 3; ++a) o[a] = n_[a] > 1 ? first_[a] + idx[a] * pitch_[a] : 0.0;
    return o;
  }

  ShapePtr body_;
  std::array<int, 3> n_;
  Vec3 pitch_;
  Aabb box_;
  Vec3 first_, box_mid_;
};

}  // namespace

ShapePtr make_periodic_array(ShapePtr body, std::array<int, 3> counts, Vec3 pitch) {
  YG_CHECK(body != nullptr, "array needs a body");
  const Aabb b = body->bounds();
  for (int a = 0; a < 3; ++a) {
    YG_CHECK(counts[a] >= 1, "array counts must be at least 1");
    if (counts[a] > 1)
      YG_CHECK(pitch[a] > 0 && std::isfinite(b.lo[a]) && std::isfinite(b.hi[a]),
               "an array axis with several copies needs a positive pitch and a body bounded along it");
  }
  return std::make_shared<PeriodicArray>(std::move(body), counts, pitch);
}

}  // namespace yeegap::geometry
