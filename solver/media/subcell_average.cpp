// Averaged update of mixed E locations (see subcell_average.h): three subcell_branch.h media driven by
// one increment of D, recovered from the bulk kernel's result as (dt/eps0)/cb (E_k - ca E^n), exact
// whatever CPML and sources added. Passive branches, and an eps_inf between the two materials', so the
// bulk Courant bound holds (docs/physics.md 3.8).
#include "solver/media/subcell_average.h"

#include <algorithm>
#include <map>

#include <fmt/format.h>
#include <utility>

#include "base/constants.h"
#include "base/errors.h"
#include "solver/engine/simulation_state.h"

namespace yeegap::solver {

SubcellAverage::SubcellAverage(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi,
                               const ECoefficients& ec, double dt)
    : cells_(find_mixed_cells(s, g, L, mi)) {
  for (const MaterialSpec& m : s.materials) responses_.push_back(branch_response(m.poles, dt));
  if (s.domain.averaging_cross_terms) plan_dispersive_cross_terms(s, g, L, mi, dt);
  // Group the cells by material pair, keeping each group's cells in layout order per component.
  std::map<std::pair<int, int>, std::vector<const MixedCell*>> pairs;
  for (const MixedCell& c : cells_) pairs[{c.inside, c.outside}].push_back(&c);
  for (const auto& [pair, list] : pairs) {
    Group gr;
    gr.inside = pair.first;
    gr.outside = pair.second;
    std::size_t q = 0;
    for (int c = 0; c < 3; ++c) {
      gr.start[c] = q;
      for (const MixedCell* m : list) {
        if (static_cast<int>(m->component) != c) continue;
        const int here = mi.e[c][m->offset];
        YG_CHECK(ec.cb[here] > 0, "a mixed location needs a material with cb > 0 under it");
        gr.offset.push_back(m->offset);
        gr.ca.push_back(ec.ca[here]);
        gr.recover.push_back(static_cast<real>(dt / constants::eps0 / ec.cb[here]));
        gr.fill.push_back(static_cast<real>(m->fill));
        gr.share.push_back(static_cast<real>(m->normal_share));
        gr.normal.push_back(m->normal);
        gr.own_weight.push_back(1);
        ++q;
      }
    }
    gr.start[3] = q;
    gr.e_old.assign(q, real(0));
    gr.increment.assign(q, real(0));
    gr.slots = 2 * (responses_[gr.inside].poles.size() + responses_[gr.outside].poles.size());
    gr.e.assign(3 * q, real(0));
    gr.e_previous.assign(3 * q, real(0));
    gr.q.assign(gr.slots * q, real(0));
    gr.p.assign(gr.slots * q, real(0));
    groups_.push_back(std::move(gr));
  }
  bind_dispersive_cross_terms();
  if (s.domain.averaging_cross_terms) build_cross_terms(s, g, L, mi, dt);
}

void SubcellAverage::plan_dispersive_cross_terms(const Scene& s, const Grid& g, const BlockLayout& L,
                                                 const MaterialIndex& mi, double dt) {
  auto dielectric = [&](int m) { return responses_[m].poles.empty() && responses_[m].loss == 0; };
  std::map<std::pair<int, int>, bool> pairs;
  for (const MixedCell& c : cells_)
    if (!dielectric(c.inside) || !dielectric(c.outside)) pairs[{c.inside, c.outside}] = true;
  const double room = g.courant_limit() / dt;
  for (const auto& [pair, unused] : pairs) {
    // Each pair sees the bulk locations earlier pairs took as theirs, so no location joins two.
    SubcellDispersiveCrossTerms t(s, g, L, mi, cells_, pair.first, pair.second, dt, room * room);
    if (t.empty()) continue;
    for (const SubcellDispersiveCrossTerms::Site& st : t.sites())
      if (st.joins) cells_.push_back({st.component, st.offset, pair.first, pair.second, st.fill, 0.0, Vec3{}});
    dispersive_cross_.push_back(std::move(t));
  }
  // Back to layout order, component by component (mixed_cells.h).
  std::sort(cells_.begin(), cells_.end(), [](const MixedCell& a, const MixedCell& b) {
    return a.component != b.component ? a.component < b.component : a.offset < b.offset;
  });
}

void SubcellAverage::bind_dispersive_cross_terms() {
  for (SubcellDispersiveCrossTerms& t : dispersive_cross_) {
    Group* gr = nullptr;
    for (Group& candidate : groups_)
      if (candidate.inside == t.inside() && candidate.outside == t.outside()) gr = &candidate;
    YG_CHECK(gr != nullptr, "a coupled pair has averaged locations");
    std::map<std::pair<int, std::ptrdiff_t>, std::size_t> where;
    for (int c = 0; c < 3; ++c)
      for (std::size_t i = gr->start[c]; i < gr->start[c + 1]; ++i) where[{c, gr->offset[i]}] = i;
    std::vector<std::size_t> index;
    for (const SubcellDispersiveCrossTerms::Site& st : t.sites()) {
      const auto it = where.find({static_cast<int>(st.component), st.offset});
      YG_CHECK(it != where.end(), "every coupled location is an averaged location of its pair");
      index.push_back(it->second);
      gr->own_weight[it->second] = static_cast<real>(1 - st.coupled);
    }
    t.bind(index);
  }
}

void SubcellAverage::build_cross_terms(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi,
                                       double dt) {
  auto dielectric = [&](const BranchResponse& r) { return r.poles.empty() && r.loss == 0; };
  std::vector<SubcellCrossTerms::Site> sites;
  std::vector<std::ptrdiff_t> others;  // other mixed locations, as 3 offset + component
  for (std::size_t q = 0; q < groups_.size(); ++q) {
    const Group& gr = groups_[q];
    const bool both = dielectric(responses_[gr.inside]) && dielectric(responses_[gr.outside]) &&
                      !s.materials[gr.inside].perfect_conductor && !s.materials[gr.outside].perfect_conductor;
    for (int c = 0; c < 3; ++c)
      for (std::size_t i = gr.start[c]; i < gr.start[c + 1]; ++i) {
        if (!both) {
          others.push_back(3 * gr.offset[i] + c);
          continue;
        }
        site_cell_.push_back({q, i});
        sites.push_back({static_cast<Component>(c), gr.offset[i], responses_[gr.inside].eps_inf,
                         responses_[gr.outside].eps_inf, static_cast<double>(gr.fill[i]), gr.normal[i]});
      }
  }
  if (sites.empty()) return;
  // The time step's room above the vacuum's Courant bound, as an eigenvalue bound on eps0/eps.
  const double room = g.courant_limit() / dt;
  cross_ = std::make_unique<SubcellCrossTerms>(s, g, L, mi, sites, others, room * room);
  if (cross_->empty()) {
    cross_.reset();
    site_cell_.clear();
    return;
  }
  site_d_.assign(sites.size(), 0.0);
}

MaterialIndex SubcellAverage::without_mixed(const MaterialIndex& mi, int wall) const {
  MaterialIndex out = mi;
  for (const MixedCell& c : cells_) out.e[static_cast<int>(c.component)][c.offset] = static_cast<std::uint8_t>(wall);
  return out;
}

void SubcellAverage::keep(Fields& f) {
  if (cross_) cross_->remove(f);
  for (Group& g : groups_)
    for (int c = 0; c < 3; ++c) {
      const real* e = f.c[c].data();
      for (std::size_t i = g.start[c]; i < g.start[c + 1]; ++i) g.e_old[i] = e[g.offset[i]];
    }
  if (started_[0] != 0) return;
  // Fields given before the first step (a test's initial condition) start every branch there.
  for (Group& g : groups_)
    for (std::size_t i = 0; i < g.e_old.size(); ++i)
      for (int b = 0; b < 3; ++b) g.e[3 * i + b] = g.e_old[i];
  for (SubcellDispersiveCrossTerms& t : dispersive_cross_) t.start(f);
  started_[0] = 1;
}

void SubcellAverage::apply(Fields& f) {
  for (Group& g : groups_) apply_group(g, f);
  for (SubcellDispersiveCrossTerms& t : dispersive_cross_)
    for (const Group& g : groups_)
      if (g.inside == t.inside() && g.outside == t.outside()) t.add(g.increment, f);
  if (!cross_) return;
  // A dielectric branch advances eps_in (E^{n+1} - E^n) = dD, so it holds D / eps_in.
  for (std::size_t q = 0; q < site_cell_.size(); ++q) {
    const Group& g = groups_[site_cell_[q].first];
    site_d_[q] = responses_[g.inside].eps_inf * g.e[3 * site_cell_[q].second];
  }
  cross_->add(f, site_d_);
}

void SubcellAverage::apply_group(Group& g, Fields& f) {
  const BranchResponse& in = responses_[g.inside];
  const BranchResponse& out = responses_[g.outside];
  const std::size_t ni = in.poles.size(), pair = ni + out.poles.size();
  for (int c = 0; c < 3; ++c) {
    real* field = f.c[c].data();
    const std::size_t lo = g.start[c], hi = g.start[c + 1];
    for_each_index(parallel_worth(static_cast<long long>(hi - lo) * 8), lo, hi, [&](std::size_t i) {
      const double fill = g.fill[i];
      const double dD = g.recover[i] * (field[g.offset[i]] - g.ca[i] * g.e_old[i]);
      g.increment[i] = static_cast<real>(dD);
      real* e = &g.e[3 * i];
      real* ep = &g.e_previous[3 * i];
      // Pointer arithmetic, not &v[k]: a group without poles has empty q and p (UBSan: null reference).
      real* q = g.q.data() + g.slots * i;
      real* p = g.p.data() + g.slots * i;
      const double e_in = step_branch(in, nullptr, 1.0, e[0], ep[0], q, p, dD);
      const double e_out = step_branch(out, nullptr, 1.0, e[1], ep[1], q + ni, p + ni, dD);
      const double e_mix = step_branch(in, &out, fill, e[2], ep[2], q + pair, p + pair, dD);
      const double share = g.share[i];
      const double own = share * (fill * e_in + (1 - fill) * e_out) + (1 - share) * e_mix;
      field[g.offset[i]] = static_cast<real>(g.own_weight[i] * own);
    });
  }
}

std::size_t SubcellAverage::memory_bytes() const {
  std::size_t bytes = cells_.size() * sizeof(MixedCell) + (cross_ ? cross_->memory_bytes() : 0);
  for (const SubcellDispersiveCrossTerms& t : dispersive_cross_) bytes += t.memory_bytes();
  for (const Group& g : groups_) {
    bytes += g.offset.size() * (sizeof(std::ptrdiff_t) + 8 * sizeof(real) + sizeof(Vec3)) +
             (g.e.size() + g.e_previous.size() + g.q.size() + g.p.size()) * sizeof(real);
  }
  return bytes;
}

void SubcellAverage::add_state(StateArrays& s, const std::string& prefix) {
  s.add_vector(prefix + "/started", started_);
  if (cross_) cross_->add_state(s, prefix);
  for (SubcellDispersiveCrossTerms& t : dispersive_cross_) t.add_state(s, prefix);
  for (Group& g : groups_) {
    const std::string base = fmt::format("{}/pair{}_{}", prefix, g.inside, g.outside);
    s.add_vector(base + "/branches/e", g.e);
    s.add_vector(base + "/branches/e_previous", g.e_previous);
    s.add_vector(base + "/branches/q", g.q);
    s.add_vector(base + "/branches/p", g.p);
  }
}

}  // namespace yeegap::solver
