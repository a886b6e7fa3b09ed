// Passive off-diagonal averaging terms at dispersive interfaces (see
// subcell_dispersive_cross_terms.h).
#include "solver/media/subcell_dispersive_cross_terms.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <tuple>
#include <unordered_map>
#include <utility>

#include <fmt/format.h>

#include "base/errors.h"
#include "solver/engine/simulation_state.h"
#include "solver/media/symmetric_3x3.h"

namespace yeegap::solver {

namespace {

constexpr int outside_domain = -1 << 30;
constexpr int pair_a[3] = {0, 0, 1}, pair_b[3] = {1, 2, 2};

// A triple's members before it is kept: each location's status and fill.
struct Member {
  enum class Kind { wall, mixed, bulk, other } kind = Kind::other;
  std::ptrdiff_t offset = 0;
  double fill = 0;
  Vec3 normal{};
};

// Index i along axis a wrapped across a periodic face; outside_domain beyond a bounded one.
int wrap_index(const Grid& g, int a, int i) {
  if (i >= 0 && i < g.n[a]) return i;
  if (g.periodic[a]) return ((i % g.n[a]) + g.n[a]) % g.n[a];
  return outside_domain;
}

// What each E location is to the pair (inside, outside): a wall, a mixed location of the pair, bulk
// of one of them, or something else.
struct MemberLookup {
  const Grid& g;
  const BlockLayout& L;
  const MaterialIndex& mi;
  const std::vector<MixedCell>& mixed;
  std::unordered_map<std::ptrdiff_t, std::size_t> mixed_at;  // 3 offset + component -> index in `mixed`
  int wall, inside, outside;

  Member operator()(int a, std::array<int, 3> idx) const {
    Member m;
    for (int t = 0; t < 3; ++t) {
      const int w = wrap_index(g, t, idx[t]);
      // Beyond a bounded face, or half a cell below a mirror plane (the image of the location
      // above it, whose triples the plane's locations stand in for, see the shares below).
      if (w == outside_domain) return m;
      idx[t] = w;
    }
    m.offset = L.at(idx[0], idx[1], idx[2]);
    const int here = mi.e[a][m.offset];
    if (here == wall) {
      m.kind = Member::Kind::wall;
    } else if (auto it = mixed_at.find(3 * m.offset + a); it != mixed_at.end()) {
      const MixedCell& c = mixed[it->second];
      if (c.inside == inside && c.outside == outside) {
        m.kind = Member::Kind::mixed;
        m.fill = c.fill;
        m.normal = c.normal;
      }
    } else if (here == inside || here == outside) {
      m.kind = Member::Kind::bulk;
      m.fill = here == inside ? 1.0 : 0.0;
    }
    return m;
  }
};

// The triples around every mixed location of the pair, each once: (node, bits).
std::map<std::tuple<int, int, int, int>, bool> triples_around(const Grid& g, const BlockLayout& L,
                                                              const std::vector<MixedCell>& mixed, int inside,
                                                              int outside) {
  std::map<std::tuple<int, int, int, int>, bool> around;
  for (const MixedCell& c : mixed) {
    if (c.inside != inside || c.outside != outside) continue;
    const int a = static_cast<int>(c.component);
    const auto idx = L.index_of(c.offset);
    for (int bits = 0; bits < 8; ++bits) {
      std::array<int, 3> node = idx;
      node[a] += (bits >> a) & 1;  // E_a = E_a(N - bit_a e_a)
      bool inside_grid = true;
      for (int t = 0; t < 3; ++t) {
        node[t] = wrap_index(g, t, node[t]);
        inside_grid = inside_grid && node[t] != outside_domain;
      }
      if (inside_grid) around[{node[0], node[1], node[2], bits}] = true;
    }
  }
  return around;
}

// A triple's vectors (stored in the field precision, as the update uses them).
struct TripleShape {
  std::array<real, 3> u{}, v{};
  std::array<std::array<real, 3>, 3> r{};
  std::array<real, 3> pair_fill{};
};

enum class Fit { own_fills, drawn_in, none };

// Shapes a triple of members around the unit normal n: pair vectors and fills, then the series
// vectors with each member's own fill, or drawn toward their mean until the instantaneous operator's
// largest eigenvalue fits under `room` (none: not even with one fill).
Fit shape_triple(const std::array<Member, 3>& m, const Vec3& n, const BranchResponse& in, const BranchResponse& out,
                 double room, TripleShape& t) {
  std::array<bool, 3> present{};
  double mean = 0;
  int count = 0;
  for (int a = 0; a < 3; ++a) {
    present[a] = m[a].kind != Member::Kind::wall;
    if (present[a]) mean += m[a].fill, ++count;
  }
  mean /= count;
  for (int k = 0; k < 3; ++k) {
    const int a = pair_a[k], b = pair_b[k];
    const double wa = n[b] * n[b], wb = n[a] * n[a];  // each fill weighted by how far along the surface it lies
    double f = mean;
    if (present[a] && present[b] && wa + wb > 0) f = (wa * m[a].fill + wb * m[b].fill) / (wa + wb);
    else if (present[a] != present[b]) f = present[a] ? m[a].fill : m[b].fill;
    t.pair_fill[k] = static_cast<real>(f);
    if (present[a]) t.r[k][a] = static_cast<real>(n[b]);
    if (present[b]) t.r[k][b] = static_cast<real>(-n[a]);
  }
  auto eps_inf_mix = [&](double f) { return f * in.eps_inf + (1 - f) * out.eps_inf; };
  // The series vectors with the fills drawn toward their mean by `draw` in [0, 1] (1: own fills).
  auto series = [&](double draw) {
    for (int a = 0; a < 3; ++a) {
      const double f = present[a] ? mean + draw * (m[a].fill - mean) : 0;
      t.u[a] = present[a] ? static_cast<real>(std::sqrt(f) * n[a]) : 0;
      t.v[a] = present[a] ? static_cast<real>(std::sqrt(1 - f) * n[a]) : 0;
    }
  };
  // Largest eigenvalue of the instantaneous operator (eps_inf parts) against the room.
  auto fits = [&]() {
    Matrix3 k{};
    for (int x = 0; x < 3; ++x)
      for (int y = 0; y < 3; ++y) {
        k[x][y] = t.u[x] * t.u[y] / in.eps_inf + t.v[x] * t.v[y] / out.eps_inf;
        for (int p = 0; p < 3; ++p) k[x][y] += t.r[p][x] * t.r[p][y] / eps_inf_mix(t.pair_fill[p]);
      }
    return symmetric_eigenvalues(k)[2] <= room;
  };
  series(1);
  if (fits()) return Fit::own_fills;
  series(0);
  if (!fits()) return Fit::none;  // materials the step cannot hold even with one fill: left uncoupled
  double lo = 0, hi = 1;
  for (int it = 0; it < 30; ++it) {
    const double mid = 0.5 * (lo + hi);
    series(mid);
    (fits() ? lo : hi) = mid;
  }
  series(lo);
  return Fit::drawn_in;
}

}  // namespace

SubcellDispersiveCrossTerms::SubcellDispersiveCrossTerms(const Scene& s, const Grid& g, const BlockLayout& L,
                                                         const MaterialIndex& mi, const std::vector<MixedCell>& mixed,
                                                         int inside, int outside, double dt, double room)
    : inside_(inside),
      outside_(outside),
      in_(branch_response(s.materials[inside].poles, dt)),
      out_(branch_response(s.materials[outside].poles, dt)) {
  MemberLookup member{g, L, mi, mixed, {}, static_cast<int>(s.materials.size()), inside_, outside_};
  for (std::size_t q = 0; q < mixed.size(); ++q)
    member.mixed_at[3 * mixed[q].offset + static_cast<int>(mixed[q].component)] = q;
  std::unordered_map<std::ptrdiff_t, int> site_of;  // 3 offset + component -> site
  for (const auto& [key, unused] : triples_around(g, L, mixed, inside_, outside_)) {
    const std::array<int, 3> node{std::get<0>(key), std::get<1>(key), std::get<2>(key)};
    const int bits = std::get<3>(key);
    std::array<Member, 3> m;
    bool usable = true;
    Vec3 n{};
    for (int a = 0; a < 3 && usable; ++a) {
      std::array<int, 3> idx = node;
      idx[a] -= (bits >> a) & 1;
      m[a] = member(a, idx);
      usable = m[a].kind == Member::Kind::wall || m[a].kind == Member::Kind::mixed || m[a].kind == Member::Kind::bulk;
      if (m[a].kind == Member::Kind::mixed) n = n + m[a].normal;
    }
    if (!usable || norm(n) == 0) continue;
    n = n * (1 / norm(n));
    TripleShape shape;
    const Fit fit = shape_triple(m, n, in_, out_, room, shape);
    if (fit == Fit::none) continue;
    if (fit == Fit::drawn_in) ++drawn_in_;
    Triple t;
    t.u = shape.u;
    t.v = shape.v;
    t.r = shape.r;
    t.pair_fill = shape.pair_fill;
    for (int a = 0; a < 3; ++a) {
      if (m[a].kind == Member::Kind::wall) continue;
      auto [it, added] = site_of.emplace(3 * m[a].offset + a, static_cast<int>(sites_.size()));
      if (added) sites_.push_back({static_cast<Component>(a), m[a].offset, m[a].kind == Member::Kind::bulk, m[a].fill});
      t.site[a] = it->second;
    }
    triples_.push_back(t);
    // The cell the triple points into: each member's index along its own axis.
    cell_of_.push_back({wrap_index(g, 0, node[0] - (bits & 1)), wrap_index(g, 1, node[1] - ((bits >> 1) & 1)),
                        wrap_index(g, 2, node[2] - ((bits >> 2) & 1))});
  }
  share_out(g, L);
}

// Each location's share of each of its triples: the energy weighs a location by its own box's
// volume V and a triple by an eighth of the cell it points into, so the share is (V_cell / 8) / V
// (1/8 on equal cells; this keeps the operator symmetric on a graded mesh too). On a mirror plane
// the image triples are not held and the plane's location counts its others twice.
void SubcellDispersiveCrossTerms::share_out(const Grid& g, const BlockLayout& L) {
  std::vector<double> site_volume(sites_.size()), mirror_factor(sites_.size(), 1.0);
  for (std::size_t q = 0; q < sites_.size(); ++q) {
    const Component c = sites_[q].component;
    const auto idx = L.index_of(sites_[q].offset);
    const geometry::Aabb box = averaging_box(g, c, idx[0], idx[1], idx[2]);
    site_volume[q] = (box.hi.x - box.lo.x) * (box.hi.y - box.lo.y) * (box.hi.z - box.lo.z);
    for (int b = 0; b < 3; ++b)
      if (b != static_cast<int>(c) && g.mirror_low[b] && !g.periodic[b] && idx[b] == 0) mirror_factor[q] *= 2;
  }
  for (std::size_t t = 0; t < triples_.size(); ++t) {
    Triple& tr = triples_[t];
    double cell_volume = 1;
    for (int a = 0; a < 3; ++a) cell_volume *= g.primal(a, cell_of_[t][a]);
    for (int a = 0; a < 3; ++a) {
      const int q = tr.site[a];
      if (q < 0) continue;
      const double w = mirror_factor[q] * cell_volume / 8 / site_volume[q];
      tr.weight[a] = static_cast<real>(w);
      sites_[q].coupled += w;
    }
  }
  cell_of_.clear();
  cell_of_.shrink_to_fit();
  for (const Site& st : sites_)
    YG_CHECK(st.coupled <= 1 + 1e-9, fmt::format("a location's triples hold {} of its update, above 1", st.coupled));
}

void SubcellDispersiveCrossTerms::bind(const std::vector<std::size_t>& index) {
  YG_CHECK(index.size() == sites_.size(), "every coupled location needs its averaged location");
  index_ = index;
  slots_ = 4 * (in_.poles.size() + out_.poles.size());  // series: in, out; pairs: both, three times
  e_.assign(5 * triples_.size(), real(0));
  e_previous_.assign(5 * triples_.size(), real(0));
  q_.assign(slots_ * triples_.size(), real(0));
  p_.assign(slots_ * triples_.size(), real(0));
  out_e_.assign(3 * triples_.size(), real(0));
  // Per location, the (triple, component) outputs it sums: 3 t + a, with their shares.
  std::vector<std::vector<std::pair<std::size_t, real>>> from(sites_.size());
  for (std::size_t t = 0; t < triples_.size(); ++t)
    for (int a = 0; a < 3; ++a)
      if (triples_[t].site[a] >= 0) from[triples_[t].site[a]].push_back({3 * t + a, triples_[t].weight[a]});
  gather_start_.assign(1, 0);
  gather_from_.clear();
  gather_weight_.clear();
  for (const auto& list : from) {
    for (const auto& [k, w] : list) gather_from_.push_back(k), gather_weight_.push_back(w);
    gather_start_.push_back(gather_from_.size());
  }
}

void SubcellDispersiveCrossTerms::start(const Fields& f) {
  // Each branch at the projection of E it would carry in a uniform medium: exact for equal fills.
  for (std::size_t t = 0; t < triples_.size(); ++t) {
    const Triple& tr = triples_[t];
    std::array<double, 3> e{0, 0, 0};
    for (int a = 0; a < 3; ++a)
      if (tr.site[a] >= 0) e[a] = f.c[a][sites_[tr.site[a]].offset];
    auto along = [&](const std::array<real, 3>& x) { return x[0] * e[0] + x[1] * e[1] + x[2] * e[2]; };
    e_[5 * t] = static_cast<real>(along(tr.u));
    e_[5 * t + 1] = static_cast<real>(along(tr.v));
    for (int k = 0; k < 3; ++k) e_[5 * t + 2 + k] = static_cast<real>(along(tr.r[k]));
    for (int b = 0; b < 5; ++b) e_previous_[5 * t + b] = e_[5 * t + b];
  }
}

void SubcellDispersiveCrossTerms::advance_triple(std::size_t t, const std::array<double, 3>& dD) {
  const Triple& tr = triples_[t];
  auto along = [&](const std::array<real, 3>& x) { return x[0] * dD[0] + x[1] * dD[1] + x[2] * dD[2]; };
  real* e = &e_[5 * t];
  real* ep = &e_previous_[5 * t];
  real* q = &q_[slots_ * t];
  real* p = &p_[slots_ * t];
  const std::size_t ni = in_.poles.size(), pair = ni + out_.poles.size();
  const double e_in = step_branch(in_, nullptr, 1.0, e[0], ep[0], q, p, along(tr.u));
  const double e_out = step_branch(out_, nullptr, 1.0, e[1], ep[1], q + ni, p + ni, along(tr.v));
  std::array<double, 3> e_pair;
  for (int k = 0; k < 3; ++k) {
    const std::size_t first = pair + k * pair;
    e_pair[k] = step_branch(in_, &out_, tr.pair_fill[k], e[2 + k], ep[2 + k], q + first, p + first, along(tr.r[k]));
  }
  for (int a = 0; a < 3; ++a)
    out_e_[3 * t + a] = static_cast<real>(tr.u[a] * e_in + tr.v[a] * e_out + tr.r[0][a] * e_pair[0] +
                                          tr.r[1][a] * e_pair[1] + tr.r[2][a] * e_pair[2]);
}

void SubcellDispersiveCrossTerms::add(const std::vector<real>& increment, Fields& f) {
  const std::size_t nt = triples_.size();
  for_each_index(parallel_worth(static_cast<long long>(nt) * 40), std::size_t{0}, nt, [&](std::size_t t) {
    std::array<double, 3> dD{0, 0, 0};
    for (int a = 0; a < 3; ++a)
      if (triples_[t].site[a] >= 0) dD[a] = increment[index_[triples_[t].site[a]]];
    advance_triple(t, dD);
  });
  // Each location gathers its triples' shares (neighbouring triples share locations, so a scatter
  // over triples could not run in parallel).
  const std::size_t ns = sites_.size();
  for_each_index(parallel_worth(static_cast<long long>(ns) * 8), std::size_t{0}, ns, [&](std::size_t q) {
    double sum = 0;
    for (std::size_t k = gather_start_[q]; k < gather_start_[q + 1]; ++k) sum += gather_weight_[k] * out_e_[gather_from_[k]];
    f.c[static_cast<int>(sites_[q].component)][sites_[q].offset] += static_cast<real>(sum);
  });
}

std::size_t SubcellDispersiveCrossTerms::memory_bytes() const {
  return sites_.size() * (sizeof(Site) + sizeof(std::size_t)) + triples_.size() * sizeof(Triple) +
         (e_.size() + e_previous_.size() + q_.size() + p_.size() + out_e_.size() + gather_weight_.size()) * sizeof(real) +
         (gather_start_.size() + gather_from_.size()) * sizeof(std::size_t);
}

void SubcellDispersiveCrossTerms::add_state(StateArrays& s, const std::string& prefix) {
  const std::string base = fmt::format("{}/dispersive_cross{}_{}", prefix, inside_, outside_);
  s.add_vector(base + "/e", e_);
  s.add_vector(base + "/e_previous", e_previous_);
  s.add_vector(base + "/q", q_);
  s.add_vector(base + "/p", p_);
}

}  // namespace yeegap::solver
