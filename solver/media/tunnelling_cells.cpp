// Tunnelling cells (see tunnelling_cells.h). gamma_g(l) comes from the materials/ tunnelling model,
// tabulated once on a fine grid of widths and interpolated in log(gamma), since gamma_g grows about
// tenfold per Angstrom (physics.md 1.3) and a barrier integral per cell would cost seconds.
#include "solver/media/tunnelling_cells.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::solver {

namespace {
// Widths in the damping table: 0.001 nm steps up to the cut-off keep the log-linear interpolation
// error of gamma_g far below 1e-3 (gamma changes by about 0.2 % per step).
constexpr double table_step = 1e-12;

double cutoff_of(const TunnellingSpec& t) { return t.cutoff > 0 ? t.cutoff : t.model.cutoff_width; }
}  // namespace

Scene with_tunnelling_material(const Scene& scene) {
  if (scene.tunnelling.empty() || !scene.tunnelling[0].quantum) return scene;
  Scene s = scene;
  const TunnellingSpec& t = s.tunnelling[0];
  MaterialSpec gap;
  gap.name = "tunnelling_gap";
  gap.poles.eps_inf = t.model.options.background;
  // The damping here is a placeholder; every gap cell gets its own (TunnellingCells::set_damping).
  gap.poles.drude.push_back({t.model.metal.plasma_frequency, t.model.metal.damping});
  gap.where = t.where;
  s.materials.push_back(gap);
  return s;
}

TunnellingCells::TunnellingCells(const Scene& scene, const Grid& g, const BlockLayout& L, MaterialIndex& mi)
    : layout_(L) {
  if (scene.tunnelling.empty()) return;
  const TunnellingSpec& t = scene.tunnelling[0];
  const double cutoff = cutoff_of(t);
  if (t.quantum) material_ = static_cast<int>(scene.materials.size()) - 1;
  stride_ = static_cast<std::ptrdiff_t>(L.total);
  const auto background = static_cast<std::uint8_t>(scene.domain.background);
  for (const auto& pair : t.pairs) {
    TunnellingGap rep;
    rep.pair = pair;
    rep.cutoff = cutoff;
    rep.quantum = t.quantum;
    rep.smallest_width = std::numeric_limits<double>::infinity();
    const BodySpec& a = scene.bodies.at(pair[0]);
    const BodySpec& b = scene.bodies.at(pair[1]);
    // Only points within the cut-off of both bodies can be gap cells: the overlap of their boxes
    // grown by the cut-off.
    const geometry::Aabb ba = a.shape->bounds(), bb = b.shape->bounds();
    Vec3 lo, hi;
    for (int ax = 0; ax < 3; ++ax) {
      lo[ax] = std::max(ba.lo[ax], bb.lo[ax]) - cutoff;
      hi[ax] = std::min(ba.hi[ax], bb.hi[ax]) + cutoff;
    }
    for (int c = 0; c < 3; ++c) {
      const auto comp = static_cast<Component>(c);
      for (int k = 0; k < L.n[2]; ++k)
        for (int j = 0; j < L.n[1]; ++j)
          for (int i = 0; i < L.n[0]; ++i) {
            const Vec3 p = yee_position(g, comp, i, j, k);
            if (p.x < lo.x || p.y < lo.y || p.z < lo.z || p.x > hi.x || p.y > hi.y || p.z > hi.z) continue;
            const std::ptrdiff_t o = L.at(i, j, k);
            const std::uint8_t m = mi.e[c][o];
            if (m != background && !(material_ >= 0 && m == material_)) continue;
            const double da = a.shape->signed_distance(p), db = b.shape->signed_distance(p);
            if (!(da > 0 && db > 0) || da + db >= cutoff) continue;
            const double l = da + db;
            ++rep.cells;
            rep.smallest_width = std::min(rep.smallest_width, l);
            if (material_ < 0) continue;
            mi.e[c][o] = static_cast<std::uint8_t>(material_);
            const std::ptrdiff_t key = c * stride_ + o;
            const auto it = width_.find(key);
            width_[key] = it == width_.end() ? l : std::min(it->second, l);
          }
    }
    if (rep.cells == 0) rep.smallest_width = 0;
    report_.push_back(rep);
  }
  if (material_ >= 0) {
    for (double l = 0; l <= cutoff + table_step; l += table_step) {
      table_l_.push_back(l);
      // Past the barrier's reach gamma_g overflows; a huge finite damping is the same medium
      // (the Drude term vanishes) and keeps the update free of infinities.
      table_log_gamma_.push_back(std::log(std::min(materials::gap_damping(t.model, l), 1e300)));
    }
  }
}

void TunnellingCells::set_damping(DispersiveCurrents& d) const {
  // A gap wider than the cut-off everywhere has no gap cells: the run is classical there, as the
  // model says (a sweep of widths crosses the cut-off), and the gap material has no pool to set.
  if (material_ < 0 || width_.empty()) return;
  const std::vector<DispersiveCell> cells = d.cells(material_);
  if (cells.empty()) return;
  std::vector<double> gamma;
  gamma.reserve(cells.size());
  for (const DispersiveCell& cell : cells) {
    const auto it = width_.find(static_cast<int>(cell.component) * stride_ + layout_.at(cell.i, cell.j, cell.k));
    YG_CHECK(it != width_.end(), "every cell of the gap material must have a gap width");
    const double l = it->second;
    const double x = std::clamp(l / table_step, 0.0, static_cast<double>(table_l_.size() - 1));
    const std::size_t i = std::min(static_cast<std::size_t>(x), table_l_.size() - 2);
    const double f = x - static_cast<double>(i);
    gamma.push_back(std::exp((1 - f) * table_log_gamma_[i] + f * table_log_gamma_[i + 1]));
  }
  d.set_drude_damping(material_, 0, gamma);
}

}  // namespace yeegap::solver
