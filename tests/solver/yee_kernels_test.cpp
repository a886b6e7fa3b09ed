// The bulk H and E updates against the cell-by-cell Yee formulas (Taflove & Hagness 2005,
// "Computational Electrodynamics", 3rd ed., ch. 3, eqs. 3.19-3.20 and 3.31), on a row length that is
// not a multiple of the material block, with a body cutting blocks and a wall cell at i = 0, so the
// single-material blocks, the per-cell gather and the remainder all run; and the AVX2 path against
// the baseline path, bit for bit; and a grid one cell wide along x (its own loop) against the same
// cells inside a wide grid, bit for bit.
#include <gtest/gtest.h>

#include <cmath>
#include <cstring>

#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {
namespace {

constexpr std::array<int, 3> cells = {77, 9, 7};

// Smooth, non-zero fields of order 1 everywhere, halos included.
Fields smooth_fields() {
  Fields f(BlockLayout::of(cells));
  for (int c = 0; c < 6; ++c)
    for (std::size_t i = 0; i < f.c[c].size(); ++i)
      f.c[c][i] = static_cast<real>(std::sin(0.37 * static_cast<double>(i) + c) + 0.1 * c);
  return f;
}

CurlCoefficients varied_curls() {
  CurlCoefficients cc;
  for (int a = 0; a < 3; ++a)
    for (int i = 0; i < cells[a]; ++i) {
      cc.h[a].push_back(static_cast<real>(0.2 + 0.01 * i + 0.1 * a));
      cc.e[a].push_back(static_cast<real>(0.3 - 0.002 * i + 0.05 * a));
    }
  return cc;
}

// A sphere of material 1 inside material 0, and the wall index 2 on the i = 0 cells of Ey, Ez.
MaterialIndex sphere_with_wall(const BlockLayout& L) {
  MaterialIndex mi;
  for (int c = 0; c < 3; ++c) {
    mi.e[c].assign(L.total, 2);
    for (int k = 0; k < cells[2]; ++k)
      for (int j = 0; j < cells[1]; ++j)
        for (int i = 0; i < cells[0]; ++i) {
          const bool inside = std::hypot(i - 40.0, j - 4.0, k - 3.0) < 12.0;
          mi.e[c][L.at(i, j, k)] = (i == 0 && c != 0) ? 2 : (inside ? 1 : 0);
        }
  }
  return mi;
}

TEST(YeeKernels, HUpdateMatchesTheCellByCellFormula) {
  Fields f = smooth_fields();
  const Fields before = f;
  const CurlCoefficients cc = varied_curls();
  update_h(f, cc);

  const BlockLayout& L = f.layout;
  const std::array<std::ptrdiff_t, 3> s = {1, L.sy, L.sz};
  auto e = [&](int c, std::ptrdiff_t o) { return static_cast<double>(before.c[c][o]); };
  for (int k = 0; k < cells[2]; ++k)
    for (int j = 0; j < cells[1]; ++j)
      for (int i = 0; i < cells[0]; ++i) {
        const std::ptrdiff_t o = L.at(i, j, k);
        const std::array<double, 3> inv = {cc.h[0][i], cc.h[1][j], cc.h[2][k]};
        for (int c = 0; c < 3; ++c) {
          // (dt/mu0) (curl E)_c with forward differences; the coefficients already hold dt/mu0.
          const int a = (c + 1) % 3, b = (c + 2) % 3;
          const double curl = (e(b, o + s[a]) - e(b, o)) * inv[a] - (e(a, o + s[b]) - e(a, o)) * inv[b];
          const double expected = static_cast<double>(before.c[3 + c][o]) - curl;
          // Float rounding of order-1 values over about five operations: some ulp of 1, 1.2e-7 each.
          ASSERT_NEAR(f.c[3 + c][o], expected, 2e-6) << "component " << c << " at " << i << "," << j << "," << k;
        }
      }
}

TEST(YeeKernels, EUpdateMatchesTheCellByCellFormula) {
  Fields f = smooth_fields();
  const Fields before = f;
  const CurlCoefficients cc = varied_curls();
  const ECoefficients ec{{1.0f, 0.8f, 0.0f}, {0.5f, 0.25f, 0.0f}};  // vacuum-like, lossy, wall
  const MaterialIndex mi = sphere_with_wall(f.layout);
  update_e(f, cc, ec, mi);

  const BlockLayout& L = f.layout;
  const std::array<std::ptrdiff_t, 3> s = {1, L.sy, L.sz};
  auto h = [&](int c, std::ptrdiff_t o) { return static_cast<double>(before.c[3 + c][o]); };
  int checked_wall = 0, checked_body = 0;
  for (int k = 0; k < cells[2]; ++k)
    for (int j = 0; j < cells[1]; ++j)
      for (int i = 0; i < cells[0]; ++i) {
        const std::ptrdiff_t o = L.at(i, j, k);
        const std::array<double, 3> inv = {cc.e[0][i], cc.e[1][j], cc.e[2][k]};
        for (int c = 0; c < 3; ++c) {
          // (curl H)_c = d H_{c+2} / d x_{c+1} - d H_{c+1} / d x_{c+2}, backward differences.
          const int a = (c + 1) % 3, b = (c + 2) % 3;
          const double curl = (h(b, o) - h(b, o - s[a])) * inv[a] - (h(a, o) - h(a, o - s[b])) * inv[b];
          const int m = mi.e[c][o];
          const double expected = ec.ca[m] * static_cast<double>(before.c[c][o]) + ec.cb[m] * curl;
          // Float rounding of order-1 values over about five operations: some ulp of 1, 1.2e-7 each.
          ASSERT_NEAR(f.c[c][o], expected, 2e-6) << "component " << c << " at " << i << "," << j << "," << k;
          checked_wall += m == 2;
          checked_body += m == 1;
        }
      }
  EXPECT_GT(checked_wall, 0);
  EXPECT_GT(checked_body, 0);
}

TEST(YeeKernels, EUpdateGivesTheSameBitsWhateverTheMaterialLabels) {
  // Two labels with equal coefficients: rows whose blocks mix them take the per-cell gather, the
  // all-0 rows the single-material path; both must round identically.
  Fields mixed = smooth_fields(), plain = smooth_fields();
  const CurlCoefficients cc = varied_curls();
  const ECoefficients ec{{0.9f, 0.9f, 0.9f}, {0.3f, 0.3f, 0.3f}};
  const MaterialIndex labels = sphere_with_wall(mixed.layout);
  MaterialIndex zeros;
  for (int c = 0; c < 3; ++c) zeros.e[c].assign(mixed.layout.total, 0);
  update_e(mixed, cc, ec, labels);
  update_e(plain, cc, ec, zeros);
  for (int c = 0; c < 3; ++c)
    EXPECT_EQ(std::memcmp(mixed.c[c].data(), plain.c[c].data(), mixed.c[c].size() * sizeof(real)), 0) << "component " << c;
}

TEST(YeeKernels, Avx2AndBaselinePathsGiveTheSameBits) {
  if (resolved_kernel_isa(KernelIsa::avx2) != KernelIsa::avx2) GTEST_SKIP() << "no AVX2 path in this build or processor";
  Fields wide = smooth_fields(), narrow = smooth_fields();
  const CurlCoefficients cc = varied_curls();
  const ECoefficients ec{{1.0f, 0.8f, 0.0f}, {0.5f, 0.25f, 0.0f}};
  const MaterialIndex mi = sphere_with_wall(wide.layout);
  for (int step = 0; step < 3; ++step) {
    update_h(wide, cc, KernelIsa::avx2);
    update_e(wide, cc, ec, mi, KernelIsa::avx2);
    update_h(narrow, cc, KernelIsa::baseline);
    update_e(narrow, cc, ec, mi, KernelIsa::baseline);
  }
  for (int c = 0; c < 6; ++c)
    EXPECT_EQ(std::memcmp(wide.c[c].data(), narrow.c[c].data(), wide.c[c].size() * sizeof(real)), 0) << "component " << c;
}

// The column at i0 of `wide` (with its x neighbours as the halo) as a grid one cell wide along x.
struct Column {
  Fields fields;
  CurlCoefficients curls;
  MaterialIndex materials;
};

Column column_of(const Fields& wide, const CurlCoefficients& cc, const MaterialIndex& mi, int i0) {
  const BlockLayout& W = wide.layout;
  Column col{Fields(BlockLayout::of({1, cells[1], cells[2]})), cc, {}};
  const BlockLayout& L = col.fields.layout;
  for (int c = 0; c < 3; ++c) col.materials.e[c].assign(L.total, 0);
  for (int k = -1; k <= cells[2]; ++k)
    for (int j = -1; j <= cells[1]; ++j)
      for (int i = -1; i <= 1; ++i) {
        for (int c = 0; c < 6; ++c) col.fields.c[c][L.at(i, j, k)] = wide.c[c][W.at(i0 + i, j, k)];
        for (int c = 0; c < 3; ++c) col.materials.e[c][L.at(i, j, k)] = mi.e[c][W.at(i0 + i, j, k)];
      }
  col.curls.h[0] = {cc.h[0][i0]};
  col.curls.e[0] = {cc.e[0][i0]};
  return col;
}

TEST(YeeKernels, AGridOneCellWideGivesTheBitsOfTheSameCellsInAWideGrid) {
  const CurlCoefficients cc = varied_curls();
  const ECoefficients ec{{1.0f, 0.8f, 0.0f}, {0.5f, 0.25f, 0.0f}};
  for (KernelIsa isa : {KernelIsa::baseline, KernelIsa::avx2}) {
    Fields wide = smooth_fields();
    const MaterialIndex mi = sphere_with_wall(wide.layout);
    // i0 = 40 crosses the sphere (per-cell coefficients), i0 = 0 holds the wall, i0 = 70 is plain.
    for (int i0 : {0, 40, 70}) {
      Fields h_wide = wide;
      Column col = column_of(wide, cc, mi, i0);
      update_h(h_wide, cc, isa);
      update_h(col.fields, col.curls, isa);
      // E reads H at i0 - 1, which the wide grid has just updated: the column's halo takes it.
      Column e_col = column_of(h_wide, cc, mi, i0);
      Fields e_wide = h_wide;
      update_e(e_wide, cc, ec, mi, isa);
      update_e(e_col.fields, e_col.curls, ec, e_col.materials, isa);
      const BlockLayout &W = wide.layout, &L = col.fields.layout;
      int compared = 0;
      for (int k = 0; k < cells[2]; ++k)
        for (int j = 0; j < cells[1]; ++j) {
          for (int c = 0; c < 3; ++c) {
            const real h_expected = h_wide.c[3 + c][W.at(i0, j, k)], h_got = col.fields.c[3 + c][L.at(0, j, k)];
            const real e_expected = e_wide.c[c][W.at(i0, j, k)], e_got = e_col.fields.c[c][L.at(0, j, k)];
            ASSERT_EQ(std::memcmp(&h_got, &h_expected, sizeof(real)), 0) << "H" << c << " at " << i0 << "," << j << "," << k;
            ASSERT_EQ(std::memcmp(&e_got, &e_expected, sizeof(real)), 0) << "E" << c << " at " << i0 << "," << j << "," << k;
            compared += 2;
          }
        }
      EXPECT_EQ(compared, 6 * cells[1] * cells[2]);
    }
  }
}

}  // namespace
}  // namespace yeegap::solver
