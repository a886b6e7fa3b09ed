// Dipole source (see dipole_source.h).
#include "solver/dipole_source.h"

#include <algorithm>
#include <cmath>

#include "base/errors.h"

namespace yeegap::solver {

namespace {

// Lower index and fractional weight of x between the Yee positions of one component on axis a.
void bracket(const Grid& g, int a, bool half, double x, int& i0, double& w1) {
  if (g.invariant(a)) {
    i0 = 0;
    w1 = 0;
    return;
  }
  int lo = 0, hi = g.n[a] - (half ? 1 : 0);
  i0 = lo;
  for (int i = lo; i < hi; ++i)
    if (g.position(a, i, half) <= x) i0 = i;
  const double x0 = g.position(a, i0, half), x1 = g.position(a, i0 + 1, half);
  w1 = std::clamp((x - x0) / (x1 - x0), 0.0, 1.0);
}

// Volume of the dual cell around a Yee E location: primal along the component's axis, dual across.
double dual_volume(const Grid& g, int comp, int i, int j, int k) {
  const int idx[3] = {i, j, k};
  double v = 1;
  for (int a = 0; a < 3; ++a) v *= (a == comp) ? g.primal(a, idx[a]) : g.dual(a, idx[a]);
  return v;
}

}  // namespace

DipoleSource::DipoleSource(const DipoleSpec& spec, const Grid& g, const BlockLayout& L)
    : time_(spec.waveform), moment_(spec.moment) {
  const double len = norm(spec.direction);
  YG_CHECK(len > 0, "dipole direction must not be zero");
  for (int c = 0; c < 3; ++c) {
    const double u = spec.direction[c] / len;
    if (u == 0) continue;
    int i0[3];
    double w1[3];
    for (int a = 0; a < 3; ++a) bracket(g, a, a == c, spec.position[a], i0[a], w1[a]);
    for (int corner = 0; corner < 8; ++corner) {
      int idx[3];
      double w = u;
      for (int a = 0; a < 3; ++a) {
        const int bit = (corner >> a) & 1;
        idx[a] = i0[a] + bit;
        w *= bit ? w1[a] : 1.0 - w1[a];
      }
      if (w == 0) continue;
      for (int a = 0; a < 3; ++a)
        if (g.periodic[a]) idx[a] %= g.n[a];
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
