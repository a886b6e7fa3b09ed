// Bulk H and E updates (see yee_kernels.h). Rows along x are contiguous and vectorised; OpenMP
// splits the (k, j) rows, so every cell is written by one thread and results do not depend on the
// thread count. Each row function is compiled into two drivers, baseline and AVX2; the E update
// takes its coefficients once per block of cells that share one material instead of per cell.
#include "solver/engine/yee_kernels.h"

// A separate AVX2 driver only where the compiler can target it per function and the build's own
// target lacks it (with -march=native the baseline already is AVX2 or better).
#if defined(__GNUC__) && defined(__x86_64__) && !defined(__AVX2__)
#define YEEGAP_AVX2_DRIVER 1
#define YEEGAP_TARGET_AVX2 __attribute__((target("avx2")))
#else
#define YEEGAP_AVX2_DRIVER 0
#endif

namespace yeegap::solver {

namespace {

// Cells per block tested for a single material. A gather of ca[m[i]] has no vector form before
// AVX2 and is slow even there; a block is 4 AVX2 or 8 SSE vectors of floats, short enough that the
// blocks a body's surface cuts (and the wall cell of a bounded face) stay few.
constexpr int material_block = 32;

struct HSweep {
  real *hx, *hy, *hz;
  const real *ex, *ey, *ez;
  const real *cx, *cy, *cz;  // dt / (mu0 d) per axis
  BlockLayout layout;
};

struct ESweep {
  real *ex, *ey, *ez;
  const real *hx, *hy, *hz;
  const std::uint8_t *mx, *my, *mz;
  const real *ca, *cb;
  const real *cx, *cy, *cz;  // 1 / d per axis
  BlockLayout layout;
};

// H^{n+1/2} = H^{n-1/2} - (dt/mu0) curl E^n along row (j, k); forward differences.
[[gnu::always_inline]] inline void h_row(const HSweep& s, int j, int k) {
  const std::ptrdiff_t o = s.layout.at(0, j, k), sy = s.layout.sy, sz = s.layout.sz;
  real* __restrict hx = s.hx + o;
  real* __restrict hy = s.hy + o;
  real* __restrict hz = s.hz + o;
  const real* __restrict ex = s.ex + o;
  const real* __restrict ey = s.ey + o;
  const real* __restrict ez = s.ez + o;
  const real* __restrict cx = s.cx;
  const real cyj = s.cy[j], czk = s.cz[k];
  const int nx = s.layout.n[0];
#pragma omp simd
  for (int i = 0; i < nx; ++i) {
    hx[i] -= (ez[i + sy] - ez[i]) * cyj - (ey[i + sz] - ey[i]) * czk;
    hy[i] -= (ex[i + sz] - ex[i]) * czk - (ez[i + 1] - ez[i]) * cx[i];
    hz[i] -= (ey[i + 1] - ey[i]) * cx[i] - (ex[i + sy] - ex[i]) * cyj;
  }
}

// Coefficients of one block whose three E components each have a single material.
struct BlockCoefficients {
  real ax, bx, ay, by, az, bz;
  real ca_x(int) const { return ax; }
  real cb_x(int) const { return bx; }
  real ca_y(int) const { return ay; }
  real cb_y(int) const { return by; }
  real ca_z(int) const { return az; }
  real cb_z(int) const { return bz; }
};

// Coefficients looked up cell by cell through the material index.
struct CellCoefficients {
  const std::uint8_t *mx, *my, *mz;
  const real *ca, *cb;
  real ca_x(int i) const { return ca[mx[i]]; }
  real cb_x(int i) const { return cb[mx[i]]; }
  real ca_y(int i) const { return ca[my[i]]; }
  real cb_y(int i) const { return cb[my[i]]; }
  real ca_z(int i) const { return ca[mz[i]]; }
  real cb_z(int i) const { return cb[mz[i]]; }
};

// E^{n+1} = ca E^n + cb curl H^{n+1/2} for cells [i0, i1) of the row at offset o; backward
// differences. One expression for both coefficient sources, so a block's path changes no bit.
template <class Coefficients>
[[gnu::always_inline]] inline void e_cells(const ESweep& s, std::ptrdiff_t o, real cyj, real czk, const Coefficients& c,
                                           int i0, int i1) {
  const std::ptrdiff_t sy = s.layout.sy, sz = s.layout.sz;
  real* __restrict ex = s.ex + o;
  real* __restrict ey = s.ey + o;
  real* __restrict ez = s.ez + o;
  const real* __restrict hx = s.hx + o;
  const real* __restrict hy = s.hy + o;
  const real* __restrict hz = s.hz + o;
  const real* __restrict cx = s.cx;
#pragma omp simd
  for (int i = i0; i < i1; ++i) {
    ex[i] = c.ca_x(i) * ex[i] + c.cb_x(i) * ((hz[i] - hz[i - sy]) * cyj - (hy[i] - hy[i - sz]) * czk);
    ey[i] = c.ca_y(i) * ey[i] + c.cb_y(i) * ((hx[i] - hx[i - sz]) * czk - (hz[i] - hz[i - 1]) * cx[i]);
    ez[i] = c.ca_z(i) * ez[i] + c.cb_z(i) * ((hy[i] - hy[i - 1]) * cx[i] - (hx[i] - hx[i - sy]) * cyj);
  }
}

[[gnu::always_inline]] inline bool single_material(const std::uint8_t* __restrict m) {
  unsigned differs = 0;
  for (int i = 0; i < material_block; ++i) differs |= static_cast<unsigned>(m[i] ^ m[0]);
  return differs == 0;
}

[[gnu::always_inline]] inline void e_row(const ESweep& s, int j, int k) {
  const std::ptrdiff_t o = s.layout.at(0, j, k);
  const std::uint8_t* mx = s.mx + o;
  const std::uint8_t* my = s.my + o;
  const std::uint8_t* mz = s.mz + o;
  const CellCoefficients per_cell{mx, my, mz, s.ca, s.cb};
  const real cyj = s.cy[j], czk = s.cz[k];
  const int nx = s.layout.n[0];
  int i0 = 0;
  for (; i0 + material_block <= nx; i0 += material_block) {
    if (single_material(mx + i0) && single_material(my + i0) && single_material(mz + i0)) {
      const BlockCoefficients block{s.ca[mx[i0]], s.cb[mx[i0]], s.ca[my[i0]], s.cb[my[i0]], s.ca[mz[i0]], s.cb[mz[i0]]};
      e_cells(s, o, cyj, czk, block, i0, i0 + material_block);
    } else {
      e_cells(s, o, cyj, czk, per_cell, i0, i0 + material_block);
    }
  }
  e_cells(s, o, cyj, czk, per_cell, i0, nx);
}

// Grids one cell wide along x (a stack along y or z, a 2D problem in the y-z plane): a row is one
// cell, and the per-row set-up of h_row and e_row cost more than its arithmetic (the two sweeps
// took a third of a 1D angle-scan step, measured). The same expressions for that one cell, so the
// same bits.
[[gnu::always_inline]] inline void h_column(const HSweep& s, int k) {
  const std::ptrdiff_t sy = s.layout.sy, sz = s.layout.sz;
  const real cx = s.cx[0], czk = s.cz[k];
  for (int j = 0, ny = s.layout.n[1]; j < ny; ++j) {
    const std::ptrdiff_t o = s.layout.at(0, j, k);
    const real cyj = s.cy[j];
    const real ex = s.ex[o], ey = s.ey[o], ez = s.ez[o];
    s.hx[o] -= (s.ez[o + sy] - ez) * cyj - (s.ey[o + sz] - ey) * czk;
    s.hy[o] -= (s.ex[o + sz] - ex) * czk - (s.ez[o + 1] - ez) * cx;
    s.hz[o] -= (s.ey[o + 1] - ey) * cx - (s.ex[o + sy] - ex) * cyj;
  }
}

[[gnu::always_inline]] inline void e_column(const ESweep& s, int k) {
  const std::ptrdiff_t sy = s.layout.sy, sz = s.layout.sz;
  const real cx = s.cx[0], czk = s.cz[k];
  for (int j = 0, ny = s.layout.n[1]; j < ny; ++j) {
    const std::ptrdiff_t o = s.layout.at(0, j, k);
    const real cyj = s.cy[j];
    const real hx = s.hx[o], hy = s.hy[o], hz = s.hz[o];
    s.ex[o] = s.ca[s.mx[o]] * s.ex[o] + s.cb[s.mx[o]] * ((hz - s.hz[o - sy]) * cyj - (hy - s.hy[o - sz]) * czk);
    s.ey[o] = s.ca[s.my[o]] * s.ey[o] + s.cb[s.my[o]] * ((hx - s.hx[o - sz]) * czk - (hz - s.hz[o - 1]) * cx);
    s.ez[o] = s.ca[s.mz[o]] * s.ez[o] + s.cb[s.mz[o]] * ((hy - s.hy[o - 1]) * cx - (hx - s.hx[o - sy]) * cyj);
  }
}

// Both sweeps' loop nest: rows along x, or columns along y where x is one cell wide. A macro, not
// a function, so that each driver's OpenMP body is outlined from the driver and takes its target.
#define YEEGAP_SWEEP(s, row, column)                                      \
  const int ny = s.layout.n[1], nz = s.layout.n[2];                       \
  const bool parallel = parallel_worth(s.layout.n[0], ny, nz);            \
  if (s.layout.n[0] == 1) {                                               \
    if (parallel) {                                                       \
      _Pragma("omp parallel for schedule(static)")                        \
      for (int k = 0; k < nz; ++k) column(s, k);                          \
    } else {                                                              \
      for (int k = 0; k < nz; ++k) column(s, k);                          \
    }                                                                     \
    return;                                                               \
  }                                                                       \
  if (!parallel) { /* no OpenMP region at all (field.h, for_each_index) */ \
    for (int k = 0; k < nz; ++k)                                          \
      for (int j = 0; j < ny; ++j) row(s, j, k);                          \
    return;                                                               \
  }                                                                       \
  _Pragma("omp parallel for collapse(2) schedule(static)")                \
  for (int k = 0; k < nz; ++k)                                            \
    for (int j = 0; j < ny; ++j) row(s, j, k)

// The drivers: the same loop nest, compiled for each instruction set. The function's target
// carries over to the OpenMP body and to the inlined rows, which is where the vector width is chosen.
void h_sweep_baseline(const HSweep& s) {
  YEEGAP_SWEEP(s, h_row, h_column);
}

void e_sweep_baseline(const ESweep& s) {
  YEEGAP_SWEEP(s, e_row, e_column);
}

#if YEEGAP_AVX2_DRIVER
YEEGAP_TARGET_AVX2 void h_sweep_avx2(const HSweep& s) {
  YEEGAP_SWEEP(s, h_row, h_column);
}

YEEGAP_TARGET_AVX2 void e_sweep_avx2(const ESweep& s) {
  YEEGAP_SWEEP(s, e_row, e_column);
}

bool processor_has_avx2() {
  static const bool has = [] {
    __builtin_cpu_init();
    return __builtin_cpu_supports("avx2") != 0;  // also checks that the OS saves the AVX registers
  }();
  return has;
}
#endif

}  // namespace

KernelIsa resolved_kernel_isa(KernelIsa requested) {
#if YEEGAP_AVX2_DRIVER
  if (requested != KernelIsa::baseline && processor_has_avx2()) return KernelIsa::avx2;
#endif
  (void)requested;
  return KernelIsa::baseline;
}

void update_h(Fields& f, const CurlCoefficients& cc, KernelIsa isa) {
  const HSweep s{f[Component::Hx].data(), f[Component::Hy].data(), f[Component::Hz].data(),
                 f[Component::Ex].data(), f[Component::Ey].data(), f[Component::Ez].data(),
                 cc.h[0].data(),          cc.h[1].data(),          cc.h[2].data(),
                 f.layout};
#if YEEGAP_AVX2_DRIVER
  if (resolved_kernel_isa(isa) == KernelIsa::avx2) return h_sweep_avx2(s);
#endif
  h_sweep_baseline(s);
}

void update_e(Fields& f, const CurlCoefficients& cc, const ECoefficients& ec, const MaterialIndex& mi, KernelIsa isa) {
  const ESweep s{f[Component::Ex].data(), f[Component::Ey].data(), f[Component::Ez].data(),
                 f[Component::Hx].data(), f[Component::Hy].data(), f[Component::Hz].data(),
                 mi.e[0].data(),          mi.e[1].data(),          mi.e[2].data(),
                 ec.ca.data(),            ec.cb.data(),
                 cc.e[0].data(),          cc.e[1].data(),          cc.e[2].data(),
                 f.layout};
#if YEEGAP_AVX2_DRIVER
  if (resolved_kernel_isa(isa) == KernelIsa::avx2) return e_sweep_avx2(s);
#endif
  e_sweep_baseline(s);
}

}  // namespace yeegap::solver
