// Running discrete Fourier transform of one field component on a box of Yee locations,
//   F(omega) += f(t_n) exp(i omega t_n) dt        (exp(-i omega t) convention, double accumulators),
// the building block of field maps and flux planes. Indices along each axis are given as lists, so
// periodic wrap-around and clamping are resolved once at set-up, never in the loop. With an
// `average_offset` the sample is the mean of two locations (H brought onto an E plane).
#pragma once

#include <array>
#include <complex>
#include <string>
#include <vector>

#include "solver/engine/fields.h"

namespace yeegap::solver {

class StateArrays;  // simulation_state.h

using Complex = std::complex<double>;

class DftBox {
 public:
  DftBox(Component c, const BlockLayout& L, std::array<std::vector<int>, 3> indices, std::ptrdiff_t average_offset,
         std::size_t frequencies);
  /// phase[f] = exp(i omega_f t) dt for this component's sample time t.
  void accumulate(const Fields& f, const std::vector<Complex>& phase);
  Component component() const { return comp_; }
  const std::array<std::vector<int>, 3>& indices() const { return idx_; }
  std::size_t points() const { return idx_[0].size() * idx_[1].size() * idx_[2].size(); }
  /// Accumulated value at list positions (a, b, c) and frequency f.
  Complex at(std::size_t a, std::size_t b, std::size_t c, std::size_t f) const {
    return acc_[((c * idx_[1].size() + b) * idx_[0].size() + a) * nf_ + f];
  }
  std::size_t memory_bytes() const { return acc_.size() * sizeof(Complex); }
  /// The accumulators, for checkpoints.
  void add_state(StateArrays& s, const std::string& name);

 private:
  Component comp_;
  std::array<std::vector<int>, 3> idx_;
  std::vector<std::ptrdiff_t> row_offsets_;  // flat offset of each (j, k) row start
  std::vector<std::ptrdiff_t> col_offsets_;  // offset of each i within a row
  std::ptrdiff_t average_offset_;
  std::size_t nf_;
  std::vector<Complex> acc_;                 // [point][frequency]
};

/// exp(i omega t) dt for each omega.
std::vector<Complex> dft_phases(const std::vector<double>& omegas, double t, double dt);

}  // namespace yeegap::solver
