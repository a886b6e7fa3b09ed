// Running DFT on a box (see dft_box.h).
#include "solver/outputs/dft_box.h"

#include "solver/engine/field.h"
#include "solver/engine/simulation_state.h"

#include <cmath>

namespace yeegap::solver {

DftBox::DftBox(Component c, const BlockLayout& L, std::array<std::vector<int>, 3> indices,
               std::ptrdiff_t average_offset, std::size_t frequencies)
    : comp_(c), idx_(std::move(indices)), average_offset_(average_offset), nf_(frequencies) {
  for (int k : idx_[2])
    for (int j : idx_[1]) row_offsets_.push_back(L.at(0, j, k));
  for (int i : idx_[0]) col_offsets_.push_back(L.at(i, 0, 0) - L.at(0, 0, 0));
  acc_.assign(points() * nf_, Complex(0, 0));
}

void DftBox::accumulate(const Fields& f, const std::vector<Complex>& phase) {
  const real* data = f[comp_].data();
  const std::size_t nrows = row_offsets_.size(), ncols = col_offsets_.size(), nf = nf_;
  const std::ptrdiff_t avg = average_offset_;
  Complex* acc = acc_.data();
  const Complex* ph = phase.data();
  for_each_index(parallel_worth(static_cast<long long>(nrows * ncols * nf)), std::size_t{0}, nrows, [&](std::size_t r) {
    for (std::size_t c = 0; c < ncols; ++c) {
      const std::ptrdiff_t o = row_offsets_[r] + col_offsets_[c];
      const double v = avg ? 0.5 * (double(data[o]) + double(data[o + avg])) : double(data[o]);
      Complex* a = acc + (r * ncols + c) * nf;
      for (std::size_t q = 0; q < nf; ++q) a[q] += v * ph[q];
    }
  });
}

std::vector<Complex> dft_phases(const std::vector<double>& omegas, double t, double dt) {
  std::vector<Complex> p(omegas.size());
  for (std::size_t q = 0; q < omegas.size(); ++q) p[q] = std::polar(dt, omegas[q] * t);
  return p;
}

void DftBox::add_state(StateArrays& s, const std::string& name) { s.add_vector(name, acc_); }

}  // namespace yeegap::solver
