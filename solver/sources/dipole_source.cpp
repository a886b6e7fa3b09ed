// Dipole source (see dipole_source.h). Within half a cell of a face a bracketing Yee location lies
// beyond it; its share goes to the image location inside with the image's sign (+1 normal at an
// electric wall, -1 at a magnetic one) for a metal face or a dipole off a mirror plane, and is dropped
// for a dipole on the plane: it is its own image, and the half domain holds only its half.
#include "solver/sources/dipole_source.h"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::solver {

namespace {

struct Share {
  int index;
  double weight;
};

// The one or two locations of a component along axis a that carry a point at x, with their
// trilinear weights (summing to 1 unless a mirror plane holds the other half).
std::vector<Share> shares_along(const Grid& g, int a, bool half, double x, EdgeKind low, EdgeKind high,
                                bool on_plane) {
  if (g.invariant(a)) return {{0, 1.0}};
  // On a periodic axis the bracket may wrap (index -1 or n, taken modulo n by the caller).
  const int last = g.periodic[a] ? g.n[a] : g.n[a] - (half ? 1 : 0);
  if (half && !g.periodic[a]) {
    // Image of location i across the face at node `face`: 2 * node - position.
    const double first = g.position(a, 0, true), end = g.position(a, last, true);
    auto fold = [&](int i, double beyond_share, EdgeKind face) -> std::vector<Share> {
      if (face == EdgeKind::metal || face == EdgeKind::mirror_odd)  // normal E even at an electric wall
        return {{i, 1.0}};
      if (face == EdgeKind::mirror_even)  // normal E odd at a magnetic wall
        return {{i, 1.0 - 2.0 * beyond_share}};
      return {{i, 1.0}};  // an absorber face: the dipole is refused elsewhere; keep the moment
    };
    if (x < first) {
      const double image = 2 * g.nodes[a][0] - first;
      const double beyond = std::clamp((first - x) / (first - image), 0.0, 1.0);
      if (on_plane && is_mirror(low)) return {{0, 1.0 - beyond}};
      return fold(0, beyond, low);
    }
    if (x > end) {
      const double image = 2 * g.nodes[a][g.n[a]] - end;
      const double beyond = std::clamp((x - end) / (image - end), 0.0, 1.0);
      return fold(last, beyond, high);
    }
  }
  int i0 = g.periodic[a] ? -1 : 0;
  for (int i = i0; i < last; ++i)
    if (g.position(a, i, half) <= x) i0 = i;
  const double x0 = g.position(a, i0, half), x1 = g.position(a, i0 + 1, half);
  const double w1 = std::clamp((x - x0) / (x1 - x0), 0.0, 1.0);
  std::vector<Share> out;
  if (w1 < 1) out.push_back({i0, 1.0 - w1});
  if (w1 > 0) out.push_back({i0 + 1, w1});
  return out;
}

// Volume of the dual cell around a Yee E location: primal along the component's axis, dual across.
double dual_volume(const Grid& g, int comp, int i, int j, int k) {
  const int idx[3] = {i, j, k};
  double v = 1;
  for (int a = 0; a < 3; ++a) v *= (a == comp) ? g.primal(a, idx[a]) : g.dual(a, idx[a]);
  return v;
}

}  // namespace

DipoleSource::DipoleSource(const DipoleSpec& spec, const Grid& g, const BlockLayout& L,
                           const std::array<EdgeKind, 6>& edges)
    : time_(spec.waveform), moment_(spec.moment) {
  const double len = norm(spec.direction);
  YG_CHECK(len > 0, "dipole direction must not be zero");
  std::array<bool, 3> on_plane{};
  for (int a = 0; a < 3; ++a) {
    on_plane[a] = is_mirror(edges[2 * a]) && !g.invariant(a) &&
                  std::abs(spec.position[a] - g.nodes[a][0]) < 1e-6 * g.primal(a, 0);
    if (!on_plane[a]) continue;
    // On the plane the dipole is its own image, so it must keep the plane's symmetry: along the
    // plane for mirror_even, across it for mirror_odd. Otherwise the image cancels it.
    const double across = spec.direction[a] / len;
    const bool wrong = edges[2 * a] == EdgeKind::mirror_even ? across != 0 : std::abs(across) != 1;
    if (wrong)
      throw RunError(fmt::format(
          "{}: the dipole sits on the {} plane {} = {:.6g} nm, where its mirror image cancels it: on a mirror plane a "
          "dipole must lie along the plane for mirror_even and across it for mirror_odd", spec.where.location(),
          edges[2 * a] == EdgeKind::mirror_even ? "mirror_even" : "mirror_odd", "xyz"[a], spec.position[a] * 1e9));
  }
  for (int c = 0; c < 3; ++c) {
    const double u = spec.direction[c] / len;
    if (u == 0) continue;
    std::array<std::vector<Share>, 3> along;
    for (int a = 0; a < 3; ++a)
      along[a] = shares_along(g, a, a == c, spec.position[a], edges[2 * a], edges[2 * a + 1], on_plane[a]);
    for (const Share& sx : along[0])
      for (const Share& sy : along[1])
        for (const Share& sz : along[2]) {
          const double w = u * sx.weight * sy.weight * sz.weight;
          if (w == 0) continue;
          int idx[3] = {sx.index, sy.index, sz.index};
          for (int a = 0; a < 3; ++a)
            if (g.periodic[a]) idx[a] = ((idx[a] % g.n[a]) + g.n[a]) % g.n[a];
          taps_.push_back({c, L.at(idx[0], idx[1], idx[2]), w / dual_volume(g, c, idx[0], idx[1], idx[2])});
        }
  }
}

void DipoleSource::apply_e(Fields& f, const ECoefficients& ec, const MaterialIndex& mi, double t) const {
  const double il = current_moment(t);
  if (il == 0) return;
  for (const Tap& tap : taps_) {
    const real cb = ec.cb[mi.e[tap.component][tap.offset]];
    f.c[tap.component][tap.offset] -= static_cast<real>(cb * il * tap.weight);
  }
}

}  // namespace yeegap::solver
