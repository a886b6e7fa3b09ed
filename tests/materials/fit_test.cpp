// Pole fitting: recovers known poles from synthetic data, stays passive and stable on noisy data,
// and refuses tables too short to fit.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <random>
#include <string>

#include <fmt/format.h>

#include "base/errors.h"
#include "base/units.h"
#include "materials/fit.h"
#include "materials/library.h"

namespace yeegap::materials {
namespace {

using cplx = std::complex<double>;

// A gold-like test medium (invented numbers for a synthetic-data check, in eV): eps_inf, one Drude
// pole and two Lorentz poles, the shape of a noble metal with interband absorption.
PoleSet gold_like() {
  PoleSet p;
  p.eps_inf = 2.0;
  p.drude.push_back({units::eV_to_omega(8.5), units::eV_to_omega(0.07)});
  p.lorentz.push_back({1.2, units::eV_to_omega(2.9), units::eV_to_omega(0.8)});
  p.lorentz.push_back({2.0, units::eV_to_omega(4.2), units::eV_to_omega(1.5)});
  return p;
}

std::vector<FitSample> sample(const PoleSet& p, double lo_nm, double hi_nm, int count) {
  std::vector<FitSample> s;
  for (int i = 0; i < count; ++i) {
    const double lambda = (lo_nm + (hi_nm - lo_nm) * i / (count - 1)) * units::nm;
    const double omega = units::wavelength_to_omega(lambda);
    s.push_back({omega, permittivity(p, omega)});
  }
  return s;
}

// Largest |eps_fit - eps_true| / |eps_true| on a grid 5x denser than the samples, across the band.
double worst_relative_error(const PoleSet& fit, const PoleSet& truth, double lo_nm, double hi_nm) {
  double worst = 0;
  for (int i = 0; i <= 200; ++i) {
    const double omega = units::wavelength_to_omega((lo_nm + (hi_nm - lo_nm) * i / 200.0) * units::nm);
    const cplx t = permittivity(truth, omega);
    worst = std::max(worst, std::abs(permittivity(fit, omega) - t) / std::abs(t));
  }
  return worst;
}

void expect_passive_and_stable(const PoleSet& p, double omega_centre) {
  EXPECT_GE(p.eps_inf, 1.0);
  for (const DrudePole& d : p.drude) EXPECT_GE(d.gamma, 0.0);
  for (const LorentzPole& l : p.lorentz) {
    EXPECT_GE(l.delta_eps, 0.0);
    EXPECT_GT(l.omega_0, 0.0);
    EXPECT_GE(l.gamma, 0.0);
  }
  // Passive far outside the fitted band too: six decades around its centre.
  for (int i = 0; i <= 600; ++i) {
    const double omega = omega_centre * std::pow(10.0, -3.0 + i / 100.0);
    EXPECT_GE(permittivity(p, omega).imag(), 0.0) << omega;
  }
}

TEST(Fit, RecoversKnownDrudeLorentzPolesToOnePercentOverTheBand) {
  const PoleSet truth = gold_like();
  const std::vector<FitSample> data = sample(truth, 400, 1000, 40);
  FitOptions options;  // 1 Drude + 2 Lorentz: the model the data came from
  const FitResult r = fit_poles(data, options);
  std::printf("gold-like fit: rms |d eps| = %.3g, max |d eps| = %.3g, max rel = %.3g, best start %d\n",
              r.rms_error, r.max_error, r.max_relative_error, r.best_start);
  // The brief's criterion: eps within 1 % over the band (on a grid denser than the data).
  EXPECT_LT(worst_relative_error(r.poles, truth, 400, 1000), 0.01);
  EXPECT_LT(r.max_relative_error, 0.01);
}

TEST(Fit, RecoversASellmeierGlassWithLorentzPolesOnly) {
  // Lossless data (N-BK7, Schott Sellmeier; library entry) fitted with 2 Lorentz poles, no Drude: the
  // dampings must go to ~0 and eps must match within 1 % over 400-1600 nm.
  const PoleSet truth = find_material("N-BK7")->poles;
  FitOptions options;
  options.drude_poles = 0;
  options.lorentz_poles = 2;
  const FitResult r = fit_poles(sample(truth, 400, 1600, 30), options);
  EXPECT_LT(worst_relative_error(r.poles, truth, 400, 1600), 0.01);
}

TEST(Fit, NoisyDataStillGivesAPassiveStableFitNearTheTruth) {
  // 1 % complex noise (rms of |delta eps|/|eps|) on the gold-like data. The fit is passive and stable by
  // construction; the claim checked here is that it holds up and that least squares averages the noise:
  // 9 parameters from 40 samples leave an rms error of about 1 % * sqrt(9/40) = 0.5 % against the
  // noise-free model, so the worst point over the band should stay within 2 %.
  const PoleSet truth = gold_like();
  std::vector<FitSample> data = sample(truth, 400, 1000, 40);
  std::mt19937_64 engine(7);
  auto normal = [&] {  // Box-Muller on the raw engine: the same numbers with any standard library
    const double u1 = 1.0 - (engine() >> 11) * (1.0 / 9007199254740992.0);
    const double u2 = (engine() >> 11) * (1.0 / 9007199254740992.0);
    return std::sqrt(-2.0 * std::log(u1)) * std::cos(2.0 * 3.14159265358979323846 * u2);
  };
  for (FitSample& s : data) s.eps *= 1.0 + 0.01 * cplx(normal(), normal()) / std::sqrt(2.0);
  const FitResult r = fit_poles(data, FitOptions{});
  std::printf("noisy fit: rms |d eps| = %.3g, max |d eps| = %.3g, max rel vs data = %.3g\n", r.rms_error,
              r.max_error, r.max_relative_error);
  expect_passive_and_stable(r.poles, units::wavelength_to_omega(632 * units::nm));
  const double vs_truth = worst_relative_error(r.poles, truth, 400, 1000);
  std::printf("noisy fit: worst relative error against the noise-free model = %.3g\n", vs_truth);
  EXPECT_LT(vs_truth, 0.02);
}

TEST(Fit, IsReproducibleForAGivenSeed) {
  const std::vector<FitSample> data = sample(gold_like(), 450, 900, 25);
  const FitResult a = fit_poles(data, FitOptions{});
  const FitResult b = fit_poles(data, FitOptions{});
  EXPECT_EQ(a.rms_error, b.rms_error);
  EXPECT_EQ(a.poles.eps_inf, b.poles.eps_inf);
}

TEST(Fit, FitsATableReadFromCsvText) {
  // Round trip: n,k written from known poles, read back, fitted; within 1 % over the band.
  const PoleSet truth = gold_like();
  std::string text = "# synthetic gold-like medium\nwavelength_nm,n,k\n";
  for (int lambda = 400; lambda <= 1000; lambda += 15) {
    const cplx n = refractive_index(truth, units::wavelength_to_omega(lambda * units::nm));
    text += fmt::format("{},{:.10g},{:.10g}\n", lambda, n.real(), n.imag());
  }
  const NkTable table = parse_nk_table(text, "synthetic.csv");
  const FitResult r = fit_poles(table, FitOptions{});
  EXPECT_LT(worst_relative_error(r.poles, truth, 400, 1000), 0.01);
}

TEST(Fit, TableTooShortForThePoleCountIsASceneErrorNamingTheFile) {
  // 1 Drude + 2 Lorentz = 9 parameters: 4.5 complex samples square, so 6 rows are required.
  const std::string text = "wavelength_nm,n,k\n500,0.9,2.0\n600,0.3,3.0\n700,0.2,4.0\n800,0.2,5.0\n900,0.2,6.0\n";
  const NkTable table = parse_nk_table(text, "short.csv");
  EXPECT_EQ(min_samples_for_fit(FitOptions{}), 6u);
  try {
    fit_poles(table, FitOptions{});
    FAIL() << "expected a SceneError";
  } catch (const SceneError& e) {
    EXPECT_EQ(e.where().file, "short.csv");
    EXPECT_EQ(e.where().line, 6);
    EXPECT_NE(std::string(e.what()).find("needs at least 6"), std::string::npos) << e.what();
  }
}

}  // namespace
}  // namespace yeegap::materials
