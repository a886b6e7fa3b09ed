// Whole spectra of a gold sphere (radius 30 nm, Rakic gold in water) at 10 cells per radius with the
// whole averaged tensor: extinction, scattering and absorption over 450-800 nm against Mie theory
// (Bohren & Huffman 1983, ch. 4), every sample within 2 % of the spectrum's peak (the issue's). The
// largest errors, relative to the peak and to the local value, are printed.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

#include "gold_sphere_run.h"

namespace yeegap::solver {
namespace {

TEST(GoldSphereSpectra, ExtinctionScatteringAndAbsorptionWithinTwoPercentOfThePeakFrom450To800nm) {
  std::vector<double> lambdas;
  for (double l = 450e-9; l <= 800.1e-9; l += 10e-9) lambdas.push_back(l);
  const testing::SphereSpectra s = testing::gold_sphere_spectra(10, testing::Averaging::full, lambdas);
  const std::vector<double>* fdtd[] = {&s.extinction, &s.scattering, &s.absorption};
  const std::vector<double>* mie[] = {&s.mie_extinction, &s.mie_scattering, &s.mie_absorption};
  const char* names[] = {"extinction", "scattering", "absorption"};
  for (int q = 0; q < 3; ++q) {
    const double peak = *std::max_element(mie[q]->begin(), mie[q]->end());
    double worst = 0, worst_local = 0, at = 0, at_local = 0;
    for (std::size_t i = 0; i < lambdas.size(); ++i) {
      const double diff = (*fdtd[q])[i] - (*mie[q])[i];
      EXPECT_LT(std::abs(diff), 0.02 * peak) << names[q] << " at " << lambdas[i] * 1e9 << " nm: " << (*fdtd[q])[i]
                                             << " vs Mie " << (*mie[q])[i];
      if (std::abs(diff) / peak > std::abs(worst)) worst = diff / peak, at = lambdas[i];
      if (std::abs(diff) / (*mie[q])[i] > std::abs(worst_local)) worst_local = diff / (*mie[q])[i], at_local = lambdas[i];
    }
    std::printf("%-10s: largest error %+.2f %% of the peak at %.0f nm; %+.2f %% of the local value at %.0f nm\n",
                names[q], 100 * worst, at * 1e9, 100 * worst_local, at_local * 1e9);
  }
}

}  // namespace
}  // namespace yeegap::solver
