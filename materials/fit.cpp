// Multi-start Levenberg-Marquardt (Marquardt's diagonal scaling) on log-parametrised poles; see
// fit.h. Frequencies are scaled by a reference omega inside the fit so that all variables are O(1).
#include "materials/fit.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <random>

#include <Eigen/Dense>
#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::materials {

namespace {

using cplx = std::complex<double>;
const cplx i_unit(0.0, 1.0);

// Log-variables are kept in this box: e^-30..e^30 times the reference frequency covers any physical pole
// and keeps exp() finite.
constexpr double log_bound = 30.0;

struct Problem {
  std::vector<double> s;     // omega / omega_ref
  std::vector<cplx> eps;     // data
  std::vector<double> w;     // weight per sample
  int drude = 0, lorentz = 0;
  int parameters() const { return 1 + 2 * drude + 3 * lorentz; }
};

// Model value at every sample and, if jac != nullptr, d eps / d x_p (complex) for every parameter.
void evaluate(const Problem& pr, const Eigen::VectorXd& x, std::vector<cplx>& model,
              std::vector<std::vector<cplx>>* jac) {
  const size_t n = pr.s.size();
  const int np = pr.parameters();
  model.assign(n, cplx(1.0 + std::exp(x[0]), 0.0));
  if (jac) {
    jac->assign(np, std::vector<cplx>(n));
    for (size_t i = 0; i < n; ++i) (*jac)[0][i] = std::exp(x[0]);
  }
  int p = 1;
  for (int d = 0; d < pr.drude; ++d, p += 2) {
    const double wp = std::exp(x[p]), g = std::exp(x[p + 1]);
    for (size_t i = 0; i < n; ++i) {
      const double s = pr.s[i];
      const cplx denom = s * s + i_unit * g * s;
      const cplx chi = -wp * wp / denom;
      model[i] += chi;
      if (jac) {
        (*jac)[p][i] = 2.0 * chi;
        (*jac)[p + 1][i] = -chi * i_unit * g * s / denom;
      }
    }
  }
  for (int l = 0; l < pr.lorentz; ++l, p += 3) {
    const double de = std::exp(x[p]), w0 = std::exp(x[p + 1]), g = std::exp(x[p + 2]);
    for (size_t i = 0; i < n; ++i) {
      const double s = pr.s[i];
      const cplx denom = w0 * w0 - s * s - i_unit * g * s;
      const cplx chi = de * w0 * w0 / denom;
      model[i] += chi;
      if (jac) {
        (*jac)[p][i] = chi;
        (*jac)[p + 1][i] = 2.0 * chi * (-s * s - i_unit * g * s) / denom;
        (*jac)[p + 2][i] = chi * i_unit * g * s / denom;
      }
    }
  }
}

double cost_of(const Problem& pr, const std::vector<cplx>& model) {
  double c = 0;
  for (size_t i = 0; i < model.size(); ++i) c += pr.w[i] * pr.w[i] * std::norm(model[i] - pr.eps[i]);
  return c;
}

struct LocalFit {
  Eigen::VectorXd x;
  double cost = std::numeric_limits<double>::infinity();
  int iterations = 0;
};

LocalFit levenberg_marquardt(const Problem& pr, Eigen::VectorXd x, int max_iterations) {
  const size_t n = pr.s.size();
  const int np = pr.parameters();
  std::vector<cplx> model;
  std::vector<std::vector<cplx>> jac;
  evaluate(pr, x, model, &jac);
  double cost = cost_of(pr, model);
  double lambda = 1e-3;
  int it = 0;
  bool converged = false;
  for (; it < max_iterations && !converged; ++it) {
    Eigen::MatrixXd J(2 * n, np);
    Eigen::VectorXd r(2 * n);
    for (size_t i = 0; i < n; ++i) {
      const cplx res = pr.w[i] * (model[i] - pr.eps[i]);
      r[2 * i] = res.real();
      r[2 * i + 1] = res.imag();
      for (int p = 0; p < np; ++p) {
        J(2 * i, p) = pr.w[i] * jac[p][i].real();
        J(2 * i + 1, p) = pr.w[i] * jac[p][i].imag();
      }
    }
    const Eigen::MatrixXd A = J.transpose() * J;
    const Eigen::VectorXd g = J.transpose() * r;
    bool accepted = false;
    while (lambda < 1e12) {
      Eigen::MatrixXd M = A;
      for (int p = 0; p < np; ++p) M(p, p) += lambda * A(p, p) + 1e-14 * (1.0 + A(p, p));
      const Eigen::VectorXd step = M.ldlt().solve(-g);
      Eigen::VectorXd trial = x + step;
      for (int p = 0; p < np; ++p) trial[p] = std::clamp(trial[p], -log_bound, log_bound);
      std::vector<cplx> trial_model;
      evaluate(pr, trial, trial_model, nullptr);
      const double trial_cost = cost_of(pr, trial_model);
      if (std::isfinite(trial_cost) && trial_cost < cost) {
        const double decrease = (cost - trial_cost) / std::max(cost, 1e-300);
        x = trial;
        cost = trial_cost;
        lambda = std::max(lambda / 3.0, 1e-12);
        accepted = true;
        converged = decrease < 1e-13;  // no meaningful progress left
        break;
      }
      lambda *= 4.0;
    }
    if (!accepted) break;  // no step lowers the cost: a local minimum (or a flat valley)
    if (!converged) evaluate(pr, x, model, &jac);
  }
  return {x, cost, it};
}

// Portable random numbers: std::*_distribution differs between standard libraries, the engine does not.
struct Random {
  std::mt19937_64 engine;
  double uniform() { return (engine() >> 11) * (1.0 / 9007199254740992.0); }  // [0, 1)
  double normal() {
    const double u1 = 1.0 - uniform(), u2 = uniform();
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(2.0 * constants::pi * u2);
  }
};

Eigen::VectorXd first_guess(const Problem& pr) {
  const int np = pr.parameters();
  Eigen::VectorXd x(np);
  const auto lowest = std::min_element(pr.s.begin(), pr.s.end());
  const size_t lo = static_cast<size_t>(lowest - pr.s.begin());
  const double s_min = *lowest, s_max = *std::max_element(pr.s.begin(), pr.s.end());
  x[0] = std::log(0.5);  // eps_inf = 1.5
  int p = 1;
  for (int d = 0; d < pr.drude; ++d, p += 2) {
    // Below the plasma frequency Re eps ~ eps_inf - wp^2/s^2 and Im eps ~ wp^2 g / s^3.
    const double re = pr.eps[lo].real(), im = std::max(pr.eps[lo].imag(), 1e-6);
    const double wp = re < 0 ? s_min * std::sqrt(1.5 - re) : 0.5 * s_min;
    const double g = std::clamp(im * s_min * s_min * s_min / (wp * wp), 1e-4 * s_min, s_min);
    x[p] = std::log(wp);
    x[p + 1] = std::log(g);
  }
  for (int l = 0; l < pr.lorentz; ++l, p += 3) {
    // Resonances spread from just below the band to above it, log-uniformly.
    const double a = std::log(0.7 * s_min), b = std::log(2.5 * s_max);
    const double t = pr.lorentz == 1 ? 0.5 : static_cast<double>(l) / (pr.lorentz - 1);
    const double w0 = std::exp(a + t * (b - a));
    x[p] = std::log(1.0);
    x[p + 1] = std::log(w0);
    x[p + 2] = std::log(0.5 * w0);
  }
  return x;
}

Eigen::VectorXd randomised(const Problem& pr, const Eigen::VectorXd& base, Random& rng) {
  Eigen::VectorXd x = base;
  const double s_min = *std::min_element(pr.s.begin(), pr.s.end());
  const double s_max = *std::max_element(pr.s.begin(), pr.s.end());
  x[0] += rng.normal();
  int p = 1;
  for (int d = 0; d < pr.drude; ++d, p += 2) {
    x[p] += 0.3 * rng.normal();
    x[p + 1] += 1.0 * rng.normal();
  }
  for (int l = 0; l < pr.lorentz; ++l, p += 3) {
    const double a = std::log(0.3 * s_min), b = std::log(4.0 * s_max);
    x[p] = 1.5 * rng.normal();
    x[p + 1] = a + rng.uniform() * (b - a);
    x[p + 2] = x[p + 1] + std::log(0.05) + rng.uniform() * std::log(40.0);  // gamma in [0.05, 2] w0
  }
  return x;
}

PoleSet to_poles(const Problem& pr, const Eigen::VectorXd& x, double omega_ref) {
  PoleSet poles;
  poles.eps_inf = 1.0 + std::exp(x[0]);
  int p = 1;
  for (int d = 0; d < pr.drude; ++d, p += 2)
    poles.drude.push_back({std::exp(x[p]) * omega_ref, std::exp(x[p + 1]) * omega_ref});
  for (int l = 0; l < pr.lorentz; ++l, p += 3)
    poles.lorentz.push_back({std::exp(x[p]), std::exp(x[p + 1]) * omega_ref, std::exp(x[p + 2]) * omega_ref});
  std::sort(poles.lorentz.begin(), poles.lorentz.end(),
            [](const LorentzPole& a, const LorentzPole& b) { return a.omega_0 < b.omega_0; });
  return poles;
}

}  // namespace

int fit_parameter_count(const FitOptions& options) {
  return 1 + 2 * options.drude_poles + 3 * options.lorentz_poles;
}

size_t min_samples_for_fit(const FitOptions& options) {
  return static_cast<size_t>((fit_parameter_count(options) + 1) / 2 + 1);
}

void measure_fit_error(const PoleSet& poles, const std::vector<FitSample>& samples, FitResult& result) {
  double sum = 0, worst = 0, worst_relative = 0;
  for (const FitSample& sample : samples) {
    const double err = std::abs(permittivity(poles, sample.omega) - sample.eps);
    sum += err * err;
    worst = std::max(worst, err);
    worst_relative = std::max(worst_relative, err / std::abs(sample.eps));
  }
  result.rms_error = samples.empty() ? 0.0 : std::sqrt(sum / static_cast<double>(samples.size()));
  result.max_error = worst;
  result.max_relative_error = worst_relative;
}

FitResult fit_poles(const std::vector<FitSample>& samples, const FitOptions& options) {
  YG_CHECK(options.drude_poles >= 0 && options.lorentz_poles >= 0 && options.starts >= 1,
           fmt::format("fit options: {} Drude, {} Lorentz poles, {} starts", options.drude_poles,
                       options.lorentz_poles, options.starts));
  YG_CHECK(samples.size() >= min_samples_for_fit(options),
           fmt::format("{} samples for {} fit parameters", samples.size(), fit_parameter_count(options)));
  Problem pr;
  pr.drude = options.drude_poles;
  pr.lorentz = options.lorentz_poles;
  double log_lo = std::numeric_limits<double>::infinity(), log_hi = -log_lo;
  for (const FitSample& sample : samples) {
    YG_CHECK(sample.omega > 0 && std::isfinite(sample.omega), "fit samples need omega > 0");
    log_lo = std::min(log_lo, std::log(sample.omega));
    log_hi = std::max(log_hi, std::log(sample.omega));
  }
  const double omega_ref = std::exp(0.5 * (log_lo + log_hi));  // geometric centre of the band
  for (const FitSample& sample : samples) {
    pr.s.push_back(sample.omega / omega_ref);
    pr.eps.push_back(sample.eps);
    pr.w.push_back(options.relative ? 1.0 / std::max(std::abs(sample.eps), 1.0) : 1.0);
  }

  Random rng{std::mt19937_64(options.seed)};
  const Eigen::VectorXd guess = first_guess(pr);
  LocalFit best;
  int best_start = 0;
  for (int start = 0; start < options.starts; ++start) {
    const Eigen::VectorXd x0 = start == 0 ? guess : randomised(pr, guess, rng);
    LocalFit local = levenberg_marquardt(pr, x0, options.max_iterations);
    if (local.cost < best.cost) {
      best = std::move(local);
      best_start = start;
    }
  }
  // No start reached a finite cost (values at the edge of what a double holds): nothing to return.
  if (best.x.size() == 0 || !std::isfinite(best.cost))
    throw RunError("the pole fit found no finite fit to these values; check the table's n and k");
  FitResult result;
  result.poles = to_poles(pr, best.x, omega_ref);
  result.starts_run = options.starts;
  result.best_start = best_start;
  result.iterations = best.iterations;
  measure_fit_error(result.poles, samples, result);
  return result;
}

FitResult fit_poles(const NkTable& table, const FitOptions& options) {
  if (table.size() < min_samples_for_fit(options))
    throw SceneError(Where{table.file, table.line.empty() ? 0 : table.line.back(), 0, ""},
                     fmt::format("the table has {} rows; fitting {} Drude and {} Lorentz poles ({} parameters) "
                                 "needs at least {}",
                                 table.size(), options.drude_poles, options.lorentz_poles,
                                 fit_parameter_count(options), min_samples_for_fit(options)));
  std::vector<FitSample> samples;
  for (size_t i = 0; i < table.size(); ++i) samples.push_back({table.omega(i), table.permittivity(i)});
  return fit_poles(samples, options);
}

}  // namespace yeegap::materials
