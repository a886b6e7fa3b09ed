// Bare fused vacuum update (see bare_kernel.h). Normalised units: H -= S curl E, E += S curl H with
// the Courant number S = 0.5, below the 3D limit 1/sqrt(3) (Taflove & Hagness 2005, eq. 4.64).
// Index 0 and n + 1 along each axis are the walls, never written; cells are 1..n.
#include "tools/benchmark/bare_kernel.h"

#include <omp.h>

#include <chrono>
#include <cmath>

#include "tools/benchmark/fingerprint.h"
#include "tools/benchmark/timing.h"

namespace yeegap::benchmark {

namespace {

constexpr float courant = 0.5f;

}  // namespace

BareVacuumBox::BareVacuumBox(int cells) : n_(cells) {
  const int p = cells + 2;
  sy_ = static_cast<std::size_t>(p);
  sz_ = sy_ * static_cast<std::size_t>(p);
  const std::size_t total = sz_ * static_cast<std::size_t>(p);
  for (auto* v : {&hx_, &hy_, &hz_, &ex_, &ey_, &ez_}) v->assign(total, 0.0f);
  // One wavelength per box along each axis, each with its own polarisation (as periodic_box.cpp).
  const double kw = 2 * 3.141592653589793 / cells;
#pragma omp parallel for schedule(static)
  for (int k = 1; k <= cells; ++k)
    for (int j = 1; j <= cells; ++j)
      for (int i = 1; i <= cells; ++i) {
        const std::size_t o = at(i, j, k);
        ex_[o] = static_cast<float>(std::cos(kw * k));
        hy_[o] = static_cast<float>(std::cos(kw * (k + 0.5)));
        ey_[o] = static_cast<float>(std::cos(kw * i));
        hz_[o] = static_cast<float>(std::cos(kw * (i + 0.5)));
        ez_[o] = static_cast<float>(std::cos(kw * j));
        hx_[o] = static_cast<float>(std::cos(kw * (j + 0.5)));
      }
}

void BareVacuumBox::h_row(int j, int k) {
  const std::size_t o = at(1, j, k);
  const auto sy = static_cast<std::ptrdiff_t>(sy_), sz = static_cast<std::ptrdiff_t>(sz_);
  float* __restrict hx = hx_.data() + o;
  float* __restrict hy = hy_.data() + o;
  float* __restrict hz = hz_.data() + o;
  const float* __restrict ex = ex_.data() + o;
  const float* __restrict ey = ey_.data() + o;
  const float* __restrict ez = ez_.data() + o;
#pragma omp simd
  for (int i = 0; i < n_; ++i) {
    hx[i] -= courant * ((ez[i + sy] - ez[i]) - (ey[i + sz] - ey[i]));
    hy[i] -= courant * ((ex[i + sz] - ex[i]) - (ez[i + 1] - ez[i]));
    hz[i] -= courant * ((ey[i + 1] - ey[i]) - (ex[i + sy] - ex[i]));
  }
}

void BareVacuumBox::e_row(int j, int k) {
  const std::size_t o = at(1, j, k);
  // Signed strides: E reads H at i - sy and i - sz, which unsigned arithmetic would wrap.
  const auto sy = static_cast<std::ptrdiff_t>(sy_), sz = static_cast<std::ptrdiff_t>(sz_);
  float* __restrict ex = ex_.data() + o;
  float* __restrict ey = ey_.data() + o;
  float* __restrict ez = ez_.data() + o;
  const float* __restrict hx = hx_.data() + o;
  const float* __restrict hy = hy_.data() + o;
  const float* __restrict hz = hz_.data() + o;
#pragma omp simd
  for (int i = 0; i < n_; ++i) {
    ex[i] += courant * ((hz[i] - hz[i - sy]) - (hy[i] - hy[i - sz]));
    ey[i] += courant * ((hx[i] - hx[i - sz]) - (hz[i] - hz[i - 1]));
    ez[i] += courant * ((hy[i] - hy[i - 1]) - (hx[i] - hx[i - sy]));
  }
}

void BareVacuumBox::step_split() {
#pragma omp parallel for schedule(static)
  for (int k = 1; k <= n_; ++k)
    for (int j = 1; j <= n_; ++j) h_row(j, k);
#pragma omp parallel for schedule(static)
  for (int k = 1; k <= n_; ++k)
    for (int j = 1; j <= n_; ++j) e_row(j, k);
}

// Row (j, k) of H reads E rows (j, k), (j + 1, k) and (j, k + 1) at step n; E row (j, k) reads H rows
// (j, k), (j - 1, k) and (j, k - 1) at step n + 1/2. Walking a slab's planes upwards and each plane's
// rows upwards, H row then E row, meets both needs inside the slab. Across a slab's top face, H of
// its last plane reads E of the next slab's first plane before that slab changes it, and that E
// reads this H after: so every slab's last H plane is done first, then a barrier, then the sweep.
void BareVacuumBox::step_fused() {
#pragma omp parallel
  {
    const int threads = omp_get_num_threads(), t = omp_get_thread_num();
    const int k0 = 1 + static_cast<int>(static_cast<long>(n_) * t / threads);
    const int k1 = 1 + static_cast<int>(static_cast<long>(n_) * (t + 1) / threads);
    if (k1 > k0)
      for (int j = 1; j <= n_; ++j) h_row(j, k1 - 1);
#pragma omp barrier
    for (int k = k0; k < k1; ++k)
      for (int j = 1; j <= n_; ++j) {
        if (k != k1 - 1) h_row(j, k);
        e_row(j, k);
      }
  }
}

double BareVacuumBox::timed_mcells_per_second(int steps) {
  const auto t0 = std::chrono::steady_clock::now();
  for (int s = 0; s < steps; ++s) step_fused();
  return std::pow(static_cast<double>(n_), 3) * steps / seconds_since(t0) * 1e-6;
}

std::uint64_t BareVacuumBox::field_hash() const {
  std::uint64_t h = fingerprint_start;
  for (const auto* v : {&hx_, &hy_, &hz_, &ex_, &ey_, &ez_}) h = fingerprint(h, v->data(), v->size() * sizeof(float));
  return h;
}

}  // namespace yeegap::benchmark
