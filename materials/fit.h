// Least-squares fit of eps_inf + Drude + Lorentz poles to sampled permittivity (e.g. a measured n,k
// table). Every parameter is written as a positive function of a free variable (eps_inf = 1 + e^u,
// others e^u), so any result is passive (Im eps >= 0 for all omega > 0) and stable (damping >= 0,
// omega_0 > 0) by construction; Levenberg-Marquardt from several starts picks the best local fit.
#pragma once

#include <complex>
#include <cstdint>
#include <vector>

#include "materials/nk_table.h"
#include "materials/pole_set.h"

namespace yeegap::materials {

struct FitOptions {
  int drude_poles = 1;        // metals: 1; dielectrics: 0
  int lorentz_poles = 2;
  int starts = 20;            // the first start is a deterministic guess, the rest are randomised from it
  int max_iterations = 1000;  // Levenberg-Marquardt iterations per start
  std::uint64_t seed = 1;     // the random starts are reproducible for a given seed
  bool relative = true;       // weight each sample by 1/max(|eps|, 1): fits small and large |eps| alike
};

struct FitSample {
  double omega = 0;             // rad/s
  std::complex<double> eps;     // relative permittivity (exp(-i omega t): Im eps >= 0 absorbs)
};

struct FitResult {
  PoleSet poles;                    // SI
  double rms_error = 0;             // sqrt(mean |eps_fit - eps_data|^2) over the samples
  double max_error = 0;             // max |eps_fit - eps_data|
  double max_relative_error = 0;    // max |eps_fit - eps_data| / |eps_data|
  int starts_run = 0;
  int best_start = 0;               // which start gave the result (0 = the deterministic one)
  int iterations = 0;               // iterations of the best start
};

/// Number of real parameters fitted: 1 + 2 per Drude pole + 3 per Lorentz pole.
int fit_parameter_count(const FitOptions& options);

/// Fewest samples (table rows) a fit accepts: each gives two real equations, and we ask for at least
/// one more sample than a square system needs.
size_t min_samples_for_fit(const FitOptions& options);

/// Fits the samples. YG_CHECKs that there are at least min_samples_for_fit samples with omega > 0.
FitResult fit_poles(const std::vector<FitSample>& samples, const FitOptions& options);

/// Fits a table; too few rows is a SceneError naming the table file.
FitResult fit_poles(const NkTable& table, const FitOptions& options);

/// The fit errors of given poles against given samples (the same measures as FitResult).
void measure_fit_error(const PoleSet& poles, const std::vector<FitSample>& samples, FitResult& result);

}  // namespace yeegap::materials
