// Rounded cone (see cone.h). In the meridian plane (r >= 0 radial, z along the axis from the base):
// B = (R, 0) the base rim, C = (0, L - rho) the cap's centre, T the point where the flank from B
// touches the cap circle. The section is the quadrilateral (0,0) B T C plus the disc around C.
#include "geometry/cone.h"

#include <algorithm>
#include <cmath>
#include <string>

#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::geometry {
namespace {

struct P2 {
  double r, z;
};
P2 operator-(P2 a, P2 b) { return {a.r - b.r, a.z - b.z}; }
double dot2(P2 a, P2 b) { return a.r * b.r + a.z * b.z; }
double len2(P2 a) { return std::hypot(a.r, a.z); }

double segment_distance(P2 p, P2 a, P2 b) {
  const P2 ab = b - a, ap = p - a;
  const double l2 = dot2(ab, ab);
  const double t = l2 > 0 ? std::clamp(dot2(ap, ab) / l2, 0.0, 1.0) : 0.0;
  return len2({ap.r - t * ab.r, ap.z - t * ab.z});
}

// Tangent point T and the flank's outward unit normal n for base radius R, length L, cap rho.
struct Flank {
  P2 t, n;
};
Flank flank(double L, double R, double rho) {
  const P2 B{R, 0}, C{0, L - rho};
  const P2 bc = C - B;
  const double d = len2(bc);
  const P2 v{bc.r / d, bc.z / d};
  // The flank leaves B at angle asin(rho/d) clockwise from BC, so it grazes the cap's outer side.
  const double sb = rho / d, cb = std::sqrt(std::max(0.0, 1 - sb * sb));
  const P2 t{v.r * cb + v.z * sb, -v.r * sb + v.z * cb};
  const double along = std::sqrt(std::max(0.0, d * d - rho * rho));
  return {{B.r + along * t.r, B.z + along * t.z}, {t.z, -t.r}};
}

class Cone final : public Shape {
 public:
  Cone(Vec3 base, Vec3 axis, double L, double R, double rho)
      : base_(base), u_((1.0 / norm(axis)) * axis), L_(L), R_(R), rho_(rho) {
    const Flank f = flank(L, R, rho);
    T_ = f.t;
    n_ = f.n;
  }
  double signed_distance(const Vec3& p3) const override {
    const Vec3 d = p3 - base_;
    const double z = dot(d, u_);
    const P2 p{norm(d - z * u_), z};
    const P2 B{R_, 0}, C{0, L_ - rho_}, top{0, L_};
    const P2 w = p - C;
    // Beyond the line through C and T (counter-clockwise from n) the boundary is the cap.
    const bool cap_side = n_.r * w.z - n_.z * w.r >= 0;
    const double to_cap = cap_side ? std::abs(len2(w) - rho_) : std::min(len2(p - T_), len2(p - top));
    const double dist = std::min({segment_distance(p, {0, 0}, B), segment_distance(p, B, T_), to_cap});
    const bool inside = p.z >= 0 && (cap_side ? len2(w) <= rho_ : dot2(p - B, n_) <= 0);
    return inside ? -dist : dist;
  }
  Aabb bounds() const override {
    Aabb b;
    for (int a = 0; a < 3; ++a) {
      const double across = R_ * std::sqrt(std::max(0.0, 1.0 - u_[a] * u_[a]));
      const double z0 = base_[a], z1 = base_[a] + L_ * u_[a];
      b.lo[a] = std::min(z0, z1) - across;
      b.hi[a] = std::max(z0, z1) + across;
    }
    return b;
  }

 private:
  Vec3 base_, u_;
  double L_, R_, rho_;
  P2 T_{}, n_{};
};

}  // namespace

std::string cone_problem(double length, double base_radius, double tip_radius) {
  if (!(length > 0 && base_radius > 0)) return "a cone needs a positive length and base radius";
  if (!(tip_radius >= 0 && tip_radius < base_radius))
    return fmt::format("the tip radius must lie in [0, base radius = {:.6g} nm), got {:.6g} nm", base_radius * 1e9,
                       tip_radius * 1e9);
  // The cap's centre must lie above the base; then the flank from the rim always meets the cap above
  // its centre, and for tip_radius < base_radius it leans towards the axis.
  if (!(tip_radius < length))
    return fmt::format("the tip radius must be smaller than the length {:.6g} nm", length * 1e9);
  return {};
}

ShapePtr make_cone(Vec3 base, Vec3 axis, double length, double base_radius, double tip_radius) {
  YG_CHECK(norm(axis) > 0, "cone needs an axis");
  const std::string problem = cone_problem(length, base_radius, tip_radius);
  YG_CHECK(problem.empty(), problem);
  return std::make_shared<Cone>(base, axis, length, base_radius, tip_radius);
}

}  // namespace yeegap::geometry
