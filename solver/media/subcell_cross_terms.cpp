// Symmetric off-diagonal averaging terms between dielectrics (see subcell_cross_terms.h). A triple is a
// node N and one bit per axis, holding E_a at N - bit_a e_a. Across a mirror plane a location is the
// image of the one inside (the mirror's sign, reflected tensor); images only send terms, and the
// plane's own locations count half in the energy (docs/physics.md 3.8).
#include "solver/media/subcell_cross_terms.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <map>
#include <tuple>

#include <fmt/format.h>

#include "base/errors.h"
#include "solver/engine/simulation_state.h"
#include "solver/media/symmetric_3x3.h"

namespace yeegap::solver {

namespace {

bool lossless_dielectric(const MaterialSpec& m) {
  return !m.perfect_conductor && m.poles.drude.empty() && m.poles.lorentz.empty() && m.poles.critical_points.empty() &&
         m.poles.conductivity == 0;
}

using Key = std::tuple<int, int, int, int>;  // component, i, j, k

// A location of a triple: the node it is (or its mirror image), the sign of D there, and the
// mirror axis.
struct Place {
  int node = -1;
  double sign = 1;
  int mirror_axis = -1;
};

// The locations the cross terms join while they are planned: the sites (mixed locations) first,
// then the bulk dielectric locations their triples reach, each with its averaged inverse
// permittivity kappa (bulk: diagonal).
struct NodePlan {
  struct Node {
    int component = 0;
    std::ptrdiff_t offset = 0;
    int site = -1;
    double eps = 1;
  };
  const Scene& s;
  const Grid& g;
  const BlockLayout& L;
  const MaterialIndex& mi;
  std::vector<std::ptrdiff_t> excluded;  // sorted: 3 offset + component of other pairs' locations
  std::map<Key, int> node_of;
  std::vector<Node> nodes;
  std::vector<Matrix3> kappa;

  void add_sites(const std::vector<SubcellCrossTerms::Site>& sites) {
    for (std::size_t q = 0; q < sites.size(); ++q) {
      const SubcellCrossTerms::Site& st = sites[q];
      const int c = static_cast<int>(st.component);
      const auto ijk = L.index_of(st.offset);
      node_of[{c, ijk[0], ijk[1], ijk[2]}] = static_cast<int>(nodes.size());
      nodes.push_back({c, st.offset, static_cast<int>(q), 1.0});
      // Farjadpour et al. (2006): kappa = <1/eps> n n^T + (1/<eps>) (1 - n n^T).
      const double a = st.fill / st.eps_in + (1 - st.fill) / st.eps_out;
      const double b = 1 / (st.fill * st.eps_in + (1 - st.fill) * st.eps_out);
      Matrix3 t{};
      for (int x = 0; x < 3; ++x)
        for (int y = 0; y < 3; ++y) t[x][y] = (x == y ? b : 0) + (a - b) * st.normal[x] * st.normal[y];
      kappa.push_back(t);
    }
  }

  // E_c at `idx`: a site, a bulk lossless dielectric (added as a node), or nothing (-1).
  Place place(int c, std::array<int, 3> idx) {
    Place p;
    for (int a = 0; a < 3; ++a) {
      if (idx[a] >= 0 && idx[a] < g.n[a]) continue;
      if (g.periodic[a]) {
        idx[a] = ((idx[a] % g.n[a]) + g.n[a]) % g.n[a];
      } else if (idx[a] == -1 && a == c && g.mirror_low[a]) {
        // The normal component half a cell below the plane: odd across a magnetic wall (mirror_even),
        // even across an electric wall.
        idx[a] = 0;
        p.sign = s.domain.edges[2 * a] == EdgeKind::mirror_even ? -1.0 : 1.0;
        p.mirror_axis = a;
      } else {
        return {};
      }
    }
    const Key key{c, idx[0], idx[1], idx[2]};
    if (auto it = node_of.find(key); it != node_of.end()) {
      p.node = it->second;
      return p;
    }
    const std::ptrdiff_t o = L.at(idx[0], idx[1], idx[2]);
    if (std::binary_search(excluded.begin(), excluded.end(), 3 * o + c)) return {};
    const int m = mi.e[c][o];
    if (m >= static_cast<int>(s.materials.size()) || !lossless_dielectric(s.materials[m])) return {};
    const double eps = s.materials[m].poles.eps_inf;
    p.node = static_cast<int>(nodes.size());
    node_of[key] = p.node;
    nodes.push_back({c, o, -1, eps});
    Matrix3 t{};
    for (int x = 0; x < 3; ++x) t[x][x] = 1 / eps;
    kappa.push_back(t);
    return p;
  }
};

// The triples around every site, each once (periodic axes wrap the node): (node i, j, k, bits).
std::map<std::tuple<int, int, int, int>, bool> triples_around(const std::vector<SubcellCrossTerms::Site>& sites,
                                                              const Grid& g, const BlockLayout& L) {
  std::map<std::tuple<int, int, int, int>, bool> triples;
  for (const SubcellCrossTerms::Site& st : sites) {
    const int c = static_cast<int>(st.component);
    const auto idx = L.index_of(st.offset);
    for (int bits = 0; bits < 8; ++bits) {
      std::array<int, 3> node = idx;
      node[c] += (bits >> c) & 1;  // E_c = E_c(N - bit_c e_c)
      for (int a = 0; a < 3; ++a)
        if (g.periodic[a]) node[a] = ((node[a] % g.n[a]) + g.n[a]) % g.n[a];
      triples[{node[0], node[1], node[2], bits}] = true;
    }
  }
  return triples;
}

// Equal cells on both sides of the node along every axis that varies (a graded mesh weighs the
// locations' energies by their volumes, which the 1/8 weights do not).
bool uniform_around(const Grid& g, const std::array<int, 3>& node) {
  for (int a = 0; a < 3; ++a) {
    if (g.invariant(a)) continue;
    auto cell = [&](int i) {
      if (g.periodic[a]) i = ((i % g.n[a]) + g.n[a]) % g.n[a];
      return g.primal(a, std::clamp(i, 0, g.n[a] - 1));
    };
    const double lo = cell(node[a] - 1), hi = cell(node[a]);
    if (std::abs(lo - hi) > 1e-9 * hi) return false;
  }
  return true;
}

// Adds one triple's off-diagonal terms to `coupling` ((target node, source node) -> coefficient);
// returns the scale the positivity cap put on them (1: none needed, or nothing to couple).
double couple_triple(NodePlan& plan, const std::array<int, 3>& node, int bits, double top,
                     std::map<std::pair<int, int>, double>& coupling) {
  std::array<Place, 3> at;
  std::array<Matrix3, 3> k{};
  bool any_site = false;
  for (int c = 0; c < 3; ++c) {
    std::array<int, 3> idx = node;
    idx[c] -= (bits >> c) & 1;
    at[c] = plan.place(c, idx);
    if (at[c].node < 0) continue;
    k[c] = plan.kappa[at[c].node];
    any_site = any_site || plan.nodes[at[c].node].site >= 0;
    if (at[c].mirror_axis >= 0)  // the image's tensor: the normal reflected in the plane
      for (int x = 0; x < 3; ++x)
        for (int y = 0; y < 3; ++y)
          if ((x == at[c].mirror_axis) != (y == at[c].mirror_axis)) k[c][x][y] = -k[c][x][y];
  }
  if (!any_site) return 1;
  // The triple's tensor: each location's own diagonal, the off-diagonal terms averaged over the
  // two locations they join (an absent location sits decoupled at the smallest present diagonal).
  Matrix3 diag{}, off{};
  double lo = 1e300;
  for (int c = 0; c < 3; ++c)
    if (at[c].node >= 0) lo = std::min(lo, k[c][c][c]);
  for (int c = 0; c < 3; ++c) {
    diag[c][c] = at[c].node >= 0 ? k[c][c][c] : lo;
    for (int d = 0; d < 3; ++d)
      if (d != c && at[c].node >= 0 && at[d].node >= 0) off[c][d] = 0.5 * (k[c][c][d] + k[d][c][d]);
  }
  // Largest scale in [0, 1] keeping the eigenvalues in [lo/10, top] (bisection; the scale-0
  // matrix, the diagonal, qualifies: every diagonal is at most 1/eps_min <= 1 <= top).
  auto fits = [&](double sc) {
    Matrix3 m = diag;
    for (int x = 0; x < 3; ++x)
      for (int y = 0; y < 3; ++y) m[x][y] += sc * off[x][y];
    const auto e = symmetric_eigenvalues(m);
    return e[0] >= 0.1 * lo && e[2] <= top;
  };
  double scale = 1;
  if (!fits(1)) {
    double a = 0, b = 1;
    for (int it = 0; it < 40; ++it) {
      const double m = 0.5 * (a + b);
      (fits(m) ? a : b) = m;
    }
    scale = a;
  }
  for (int c = 0; c < 3; ++c)
    for (int d = 0; d < 3; ++d) {
      if (c == d || at[c].node < 0 || at[d].node < 0 || at[c].mirror_axis >= 0 || off[c][d] == 0) continue;
      coupling[{at[c].node, at[d].node}] += scale * off[c][d] * at[d].sign / 8;
    }
  return scale;
}

}  // namespace

SubcellCrossTerms::SubcellCrossTerms(const Scene& s, const Grid& g, const BlockLayout& L, const MaterialIndex& mi,
                                     const std::vector<Site>& sites, const std::vector<std::ptrdiff_t>& other_mixed,
                                     double top) {
  if (sites.empty()) return;
  YG_CHECK(top >= 1, fmt::format("the cross terms' eigenvalue bound {} must be at least the vacuum's 1", top));
  NodePlan plan{s, g, L, mi, other_mixed, {}, {}, {}};
  std::sort(plan.excluded.begin(), plan.excluded.end());
  plan.add_sites(sites);
  std::map<std::pair<int, int>, double> coupling;  // (target node, source node) -> coefficient
  for (const auto& [t, unused] : triples_around(sites, g, L)) {
    const std::array<int, 3> node{std::get<0>(t), std::get<1>(t), std::get<2>(t)};
    if (!uniform_around(g, node)) continue;
    smallest_scale_ = std::min(smallest_scale_, couple_triple(plan, node, std::get<3>(t), top, coupling));
  }
  for (const NodePlan::Node& n : plan.nodes) nodes_.push_back({n.component, n.offset, n.site, n.eps});
  int last = -1;
  for (const auto& [pair, coef] : coupling) {
    if (pair.first != last) {
      row_node_.push_back(pair.first);
      row_start_.push_back(col_node_.size());
      last = pair.first;
    }
    col_node_.push_back(pair.second);
    coef_.push_back(coef);
  }
  row_start_.push_back(col_node_.size());
  d_.assign(nodes_.size(), 0.0);
  diagonal_.assign(row_node_.size(), real(0));
}

void SubcellCrossTerms::remove(Fields& f) const {
  for (std::size_t r = 0; r < row_node_.size(); ++r) {
    const Node& n = nodes_[row_node_[r]];
    f.c[n.component][n.offset] = diagonal_[r];
  }
}

void SubcellCrossTerms::add(Fields& f, const std::vector<double>& site_d) {
  for (std::size_t q = 0; q < nodes_.size(); ++q) {
    const Node& n = nodes_[q];
    d_[q] = n.site >= 0 ? site_d[n.site] : n.eps * f.c[n.component][n.offset];
  }
  for (std::size_t r = 0; r < row_node_.size(); ++r) {
    double sum = 0;
    for (std::size_t p = row_start_[r]; p < row_start_[r + 1]; ++p) sum += coef_[p] * d_[col_node_[p]];
    const Node& n = nodes_[row_node_[r]];
    real& e = f.c[n.component][n.offset];
    diagonal_[r] = e;
    e = static_cast<real>(e + sum);
  }
}

std::vector<SubcellCrossTerms::Coupling> SubcellCrossTerms::couplings() const {
  std::vector<Coupling> out;
  for (std::size_t r = 0; r < row_node_.size(); ++r) {
    const Node& t = nodes_[row_node_[r]];
    for (std::size_t p = row_start_[r]; p < row_start_[r + 1]; ++p) {
      const Node& from = nodes_[col_node_[p]];
      out.push_back({t.component, from.component, t.offset, from.offset, coef_[p]});
    }
  }
  return out;
}

std::size_t SubcellCrossTerms::memory_bytes() const {
  return nodes_.size() * (sizeof(Node) + sizeof(double)) + row_node_.size() * (sizeof(int) + sizeof(std::size_t) + sizeof(real)) +
         col_node_.size() * (sizeof(int) + sizeof(double));
}

void SubcellCrossTerms::add_state(StateArrays& s, const std::string& prefix) {
  s.add_vector(prefix + "/cross_diagonal", diagonal_);
}

}  // namespace yeegap::solver
