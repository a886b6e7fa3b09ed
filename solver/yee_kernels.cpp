// Bulk H and E updates (see yee_kernels.h). Rows along x are contiguous and vectorised; OpenMP
// splits the (k, j) rows, so every cell is written by one thread and results do not depend on the
// thread count.
#include "solver/yee_kernels.h"

namespace yeegap::solver {

void update_h(Fields& f, const CurlCoefficients& cc) {
  const BlockLayout& L = f.layout;
  const int nx = L.n[0], ny = L.n[1], nz = L.n[2];
  real* __restrict hx0 = f[Component::Hx].data();
  real* __restrict hy0 = f[Component::Hy].data();
  real* __restrict hz0 = f[Component::Hz].data();
  const real* __restrict ex0 = f[Component::Ex].data();
  const real* __restrict ey0 = f[Component::Ey].data();
  const real* __restrict ez0 = f[Component::Ez].data();
  const real* __restrict cx = cc.h[0].data();
  const real* __restrict cy = cc.h[1].data();
  const real* __restrict cz = cc.h[2].data();
  const std::ptrdiff_t sy = L.sy, sz = L.sz;

#pragma omp parallel for collapse(2) schedule(static) if (parallel_worth(nx, ny, nz))
  for (int k = 0; k < nz; ++k) {
    for (int j = 0; j < ny; ++j) {
      const std::ptrdiff_t o = L.at(0, j, k);
      real* __restrict hx = hx0 + o;
      real* __restrict hy = hy0 + o;
      real* __restrict hz = hz0 + o;
      const real* __restrict ex = ex0 + o;
      const real* __restrict ey = ey0 + o;
      const real* __restrict ez = ez0 + o;
      const real cyj = cy[j], czk = cz[k];
#pragma omp simd
      for (int i = 0; i < nx; ++i) {
        hx[i] -= (ez[i + sy] - ez[i]) * cyj - (ey[i + sz] - ey[i]) * czk;
        hy[i] -= (ex[i + sz] - ex[i]) * czk - (ez[i + 1] - ez[i]) * cx[i];
        hz[i] -= (ey[i + 1] - ey[i]) * cx[i] - (ex[i + sy] - ex[i]) * cyj;
      }
    }
  }
}

void update_e(Fields& f, const CurlCoefficients& cc, const ECoefficients& ec, const MaterialIndex& mi) {
  const BlockLayout& L = f.layout;
  const int nx = L.n[0], ny = L.n[1], nz = L.n[2];
  real* __restrict ex0 = f[Component::Ex].data();
  real* __restrict ey0 = f[Component::Ey].data();
  real* __restrict ez0 = f[Component::Ez].data();
  const real* __restrict hx0 = f[Component::Hx].data();
  const real* __restrict hy0 = f[Component::Hy].data();
  const real* __restrict hz0 = f[Component::Hz].data();
  const std::uint8_t* __restrict mx0 = mi.e[0].data();
  const std::uint8_t* __restrict my0 = mi.e[1].data();
  const std::uint8_t* __restrict mz0 = mi.e[2].data();
  const real* __restrict ca = ec.ca.data();
  const real* __restrict cb = ec.cb.data();
  const real* __restrict cx = cc.e[0].data();
  const real* __restrict cy = cc.e[1].data();
  const real* __restrict cz = cc.e[2].data();
  const std::ptrdiff_t sy = L.sy, sz = L.sz;

#pragma omp parallel for collapse(2) schedule(static) if (parallel_worth(nx, ny, nz))
  for (int k = 0; k < nz; ++k) {
    for (int j = 0; j < ny; ++j) {
      const std::ptrdiff_t o = L.at(0, j, k);
      real* __restrict ex = ex0 + o;
      real* __restrict ey = ey0 + o;
      real* __restrict ez = ez0 + o;
      const real* __restrict hx = hx0 + o;
      const real* __restrict hy = hy0 + o;
      const real* __restrict hz = hz0 + o;
      const std::uint8_t* __restrict mx = mx0 + o;
      const std::uint8_t* __restrict my = my0 + o;
      const std::uint8_t* __restrict mz = mz0 + o;
      const real cyj = cy[j], czk = cz[k];
#pragma omp simd
      for (int i = 0; i < nx; ++i) {
        ex[i] = ca[mx[i]] * ex[i] + cb[mx[i]] * ((hz[i] - hz[i - sy]) * cyj - (hy[i] - hy[i - sz]) * czk);
        ey[i] = ca[my[i]] * ey[i] + cb[my[i]] * ((hx[i] - hx[i - sz]) * czk - (hz[i] - hz[i - 1]) * cx[i]);
        ez[i] = ca[mz[i]] * ez[i] + cb[mz[i]] * ((hy[i] - hy[i - 1]) * cx[i] - (hx[i] - hx[i - sy]) * cyj);
      }
    }
  }
}

}  // namespace yeegap::solver
