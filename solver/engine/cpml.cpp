// CPML profiles and psi updates (see cpml.h). For an absorbing axis a with cyclic successors b, c:
//   E_b -= cb psi(dH_c/da),  E_c += cb psi(dH_b/da),  H_b += (dt/mu0) psi(dE_c/da),
//   H_c -= (dt/mu0) psi(dE_b/da),  with psi^n = b psi^{n-1} + a dF/da  (Roden & Gedney 2000, eqs. 9-11).
#include "solver/engine/cpml.h"

#include <cmath>

#include "base/constants.h"
#include <fmt/format.h>

#include "base/errors.h"
#include "solver/engine/simulation_state.h"

namespace yeegap::solver {

double cpml_sigma_max(double order, double reflection, double thickness, double background_index) {
  YG_CHECK(reflection > 0 && reflection < 1 && thickness > 0, "CPML needs 0 < R < 1 and a thickness");
  return -(order + 1.0) * std::log(reflection) / (2.0 * background_index * constants::eta0 * thickness);
}

namespace {

struct Coefficients {
  double b, a, kappa;
};

// Graded sigma, kappa, alpha at relative depth rho in [0, 1] (0 at the inner interface).
Coefficients coefficients_at(double rho, const CpmlProfile& p, int face, double dt) {
  if (rho <= 0) return {1.0, 0.0, 1.0};
  const double g = std::pow(rho, p.order);
  const double sigma = p.sigma_max[face] * g;
  const double kappa = 1.0 + (p.kappa_max[face] - 1.0) * g;
  const double alpha = p.alpha_max * (1.0 - rho);
  const double b = std::exp(-(sigma / kappa + alpha) * dt / constants::eps0);
  const double a = sigma > 0 ? sigma * (b - 1.0) / (kappa * (sigma + kappa * alpha)) : 0.0;
  return {b, a, kappa};
}

}  // namespace

Cpml::Cpml(const Grid& g, const std::array<bool, 6>& absorber, const CpmlProfile& p, double dt,
           CurlCoefficients& curls) {
  for (int a = 0; a < 3; ++a) {
    const int n = g.n[a];
    be_[a].assign(n, 1);
    ae_[a].assign(n, 0);
    bh_[a].assign(n, 1);
    ah_[a].assign(n, 0);
    inv_dual_[a].resize(n);
    inv_primal_[a].resize(n);
    for (int i = 0; i < n; ++i) {
      inv_dual_[a][i] = static_cast<real>(1.0 / g.dual(a, i));
      inv_primal_[a][i] = static_cast<real>(1.0 / g.primal(a, i));
    }
    for (int side = 0; side < 2; ++side) {
      if (!absorber[2 * a + side]) continue;
      YG_CHECK(2 * p.cells < n, "absorbing layers must leave interior cells");
      const int inner = side == 0 ? p.cells : n - p.cells;  // node index of the inner interface
      const double x_if = g.nodes[a][inner];
      const double thickness = std::abs(g.nodes[a][side == 0 ? 0 : n] - x_if);
      for (int i = 0; i < n; ++i) {
        const double xe = g.nodes[a][i], xh = g.position(a, i, true);
        const double rho_e = (side == 0 ? x_if - xe : xe - x_if) / thickness;
        const double rho_h = (side == 0 ? x_if - xh : xh - x_if) / thickness;
        if (rho_e > 0) {
          const Coefficients c = coefficients_at(rho_e, p, 2 * a + side, dt);
          be_[a][i] = static_cast<real>(c.b);
          ae_[a][i] = static_cast<real>(c.a);
          curls.e[a][i] = static_cast<real>(curls.e[a][i] / c.kappa);
        }
        if (rho_h > 0) {
          const Coefficients c = coefficients_at(rho_h, p, 2 * a + side, dt);
          bh_[a][i] = static_cast<real>(c.b);
          ah_[a][i] = static_cast<real>(c.a);
          curls.h[a][i] = static_cast<real>(curls.h[a][i] / c.kappa);
        }
      }
      Slab s;
      s.axis = a;
      s.lo = {0, 0, 0};
      s.hi = g.n;
      s.lo[a] = side == 0 ? 0 : n - p.cells;
      s.hi[a] = side == 0 ? p.cells : n;
      const std::size_t size = 1ULL * (s.hi[0] - s.lo[0]) * (s.hi[1] - s.lo[1]) * (s.hi[2] - s.lo[2]);
      for (auto& v : s.psi) v.assign(size, real(0));
      slabs_.push_back(std::move(s));
    }
  }
}

namespace {

// Loops over a slab's cells in layout order with a running psi index; `body(o, p, q)` gets the
// flat field offset, the index along the absorbing axis and the psi index.
template <class Body>
void for_each_slab_cell(const BlockLayout& L, const std::array<int, 3>& lo, const std::array<int, 3>& hi, int axis,
                        Body body) {
  const int wx = hi[0] - lo[0], wy = hi[1] - lo[1];
  auto row = [&](int j, int k) {
    const std::size_t q0 = (static_cast<std::size_t>(k - lo[2]) * wy + (j - lo[1])) * wx;
    const std::ptrdiff_t o0 = L.at(lo[0], j, k);
    for (int i = 0; i < wx; ++i) {
      const int p = axis == 0 ? lo[0] + i : (axis == 1 ? j : k);
      body(o0 + i, p, q0 + i);
    }
  };
  if (!parallel_worth(wx, wy, hi[2] - lo[2])) {  // no OpenMP region at all (field.h, for_each_index)
    for (int k = lo[2]; k < hi[2]; ++k)
      for (int j = lo[1]; j < hi[1]; ++j) row(j, k);
    return;
  }
#pragma omp parallel for collapse(2) schedule(static)
  for (int k = lo[2]; k < hi[2]; ++k)
    for (int j = lo[1]; j < hi[1]; ++j) row(j, k);
}

}  // namespace

void Cpml::apply_h(Fields& f, double dt) {
  const real ch = static_cast<real>(dt / constants::mu0);
  for (Slab& s : slabs_) {
    const int a = s.axis, b = (a + 1) % 3, c = (a + 2) % 3;
    const std::ptrdiff_t st = f.layout.stride(a);
    const real* eb = f.c[b].data();
    const real* ec = f.c[c].data();
    real* hb = f.c[3 + b].data();
    real* hc = f.c[3 + c].data();
    real* psi_b = s.psi[2].data();
    real* psi_c = s.psi[3].data();
    const real* bh = bh_[a].data();
    const real* ah = ah_[a].data();
    const real* ip = inv_primal_[a].data();
    for_each_slab_cell(f.layout, s.lo, s.hi, a, [=](std::ptrdiff_t o, int p, std::size_t q) {
      psi_b[q] = bh[p] * psi_b[q] + ah[p] * (ec[o + st] - ec[o]) * ip[p];
      psi_c[q] = bh[p] * psi_c[q] + ah[p] * (eb[o + st] - eb[o]) * ip[p];
      hb[o] += ch * psi_b[q];
      hc[o] -= ch * psi_c[q];
    });
  }
}

void Cpml::apply_e(Fields& f, const ECoefficients& ecoef, const MaterialIndex& mi) {
  const real* cb = ecoef.cb.data();
  for (Slab& s : slabs_) {
    const int a = s.axis, b = (a + 1) % 3, c = (a + 2) % 3;
    const std::ptrdiff_t st = f.layout.stride(a);
    real* eb = f.c[b].data();
    real* ec = f.c[c].data();
    const real* hb = f.c[3 + b].data();
    const real* hc = f.c[3 + c].data();
    const std::uint8_t* mb = mi.e[b].data();
    const std::uint8_t* mc = mi.e[c].data();
    real* psi_b = s.psi[0].data();
    real* psi_c = s.psi[1].data();
    const real* be = be_[a].data();
    const real* ae = ae_[a].data();
    const real* id = inv_dual_[a].data();
    for_each_slab_cell(f.layout, s.lo, s.hi, a, [=](std::ptrdiff_t o, int p, std::size_t q) {
      psi_b[q] = be[p] * psi_b[q] + ae[p] * (hc[o] - hc[o - st]) * id[p];
      psi_c[q] = be[p] * psi_c[q] + ae[p] * (hb[o] - hb[o - st]) * id[p];
      eb[o] -= cb[mb[o]] * psi_b[q];
      ec[o] += cb[mc[o]] * psi_c[q];
    });
  }
}

std::size_t Cpml::memory_bytes() const {
  std::size_t bytes = 0;
  for (const Slab& s : slabs_)
    for (const auto& v : s.psi) bytes += v.size() * sizeof(real);
  return bytes;
}

void Cpml::add_state(StateArrays& s, const std::string& prefix) {
  for (std::size_t i = 0; i < slabs_.size(); ++i)
    for (std::size_t t = 0; t < slabs_[i].psi.size(); ++t)
      s.add_vector(fmt::format("{}/slab{}/psi{}", prefix, i, t), slabs_[i].psi[t]);
}

}  // namespace yeegap::solver
