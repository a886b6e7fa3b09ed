// Critical-point terms in an explicit `poles` block (Etchegoin, Le Ru, Meyer, J. Chem. Phys. 125,
// 164705 (2006)), and the scene text that pole_block_writer.h prints for a PoleSet: read back, it is
// the same model, so a printed fit can be pasted into a scene as is.
#include <complex>
#include <string>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/errors.h"
#include "base/units.h"
#include "io/results/pole_block_writer.h"
#include "io/scene/scene_reader.h"
#include "materials/fit.h"
#include "materials/library.h"
#include "scene_refusal.h"

namespace {

using ::testing::HasSubstr;
using yeegap::materials::PoleSet;
namespace units = yeegap::units;

constexpr const char* scene_head = R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
bodies:
  - {shape: sphere, material: m, center: [0, 0, 0], radius: 40 nm}
excitation: {dipole: {position: [0, 0, 100 nm], direction: z, band: {from: 450 nm, to: 900 nm}}}
stop: {after: 100 fs}
)";

void ignore(const std::string&) {}

PoleSet poles_of(const std::string& materials_block) {
  const auto scene = yeegap::io::read_scene_text(scene_head + materials_block, "cp.yaml", {}, ignore);
  return scene.materials.at(0).poles;
}

std::string failure_of(const std::string& materials_block) {
  return yeegap::io::testing::refusal_of([&] { poles_of(materials_block); }, materials_block).what();
}

std::complex<double> eps_at_nm(const PoleSet& p, double nm) {
  return yeegap::materials::permittivity(p, units::wavelength_to_omega(nm * units::nm));
}

// Etchegoin et al. (2006) gold in the frequency form of the project's physics notes §2.3:
// hbar omega_p = 8.670 eV, hbar gamma = 0.08551 eV; critical points A = 1.27 and 1.10, phi = -pi/4,
// hbar Omega = 2.638 and 3.815 eV, hbar Gamma = 0.6525 and 1.1697 eV; eps_inf 1.54.
constexpr const char* etchegoin_block = R"(materials:
  m:
    poles:
      eps_inf: 1.54
      drude: {plasma_frequency: 143 nm, damping: 14500 nm}
      critical_points:
        - {amplitude: 1.27, phase: -45 deg, resonance: 470 nm, damping: 1900 nm}
        - {amplitude: 1.10, phase: -0.7853981634 rad, resonance: 325 nm, damping: 1060 nm}
)";

TEST(SceneCriticalPoints, EtchegoinGoldFromThePolesBlockMatchesThePublishedCheckValue) {
  const PoleSet p = poles_of(etchegoin_block);
  ASSERT_EQ(p.critical_points.size(), 2u);
  // Check value at 632.8 nm: -11.411 + 1.187i, computed from the parameters of Etchegoin, Le Ru,
  // Meyer, J. Chem. Phys. 125, 164705 (2006) in the physics notes §2.3, tolerance 1e-3 as stated there.
  const std::complex<double> eps = eps_at_nm(p, 632.8);
  EXPECT_NEAR(eps.real(), -11.411, 1e-3);
  EXPECT_NEAR(eps.imag(), 1.187, 1e-3);
  // ... and the same model as the library's entry (which maps the published form exactly), to rounding.
  const PoleSet& lib = yeegap::materials::find_material("Au_critical_points")->poles;
  for (double nm : {400.0, 500.0, 632.8, 800.0, 1000.0})
    EXPECT_LT(std::abs(eps_at_nm(p, nm) - eps_at_nm(lib, nm)), 1e-9 * std::abs(eps_at_nm(lib, nm))) << nm;
}

TEST(SceneCriticalPoints, BarePhaseIsRefusedAsAmbiguous) {
  const std::string e = failure_of(R"(materials:
  m: {poles: {critical_points: {amplitude: 1, phase: -45, resonance: 2 eV, damping: 0.5 eV}}}
)");
  EXPECT_THAT(e, HasSubstr("materials.m.poles.critical_points.phase: must be an angle with its unit, e.g. '-45 deg'"));
}

TEST(SceneCriticalPoints, UnknownAngleUnitSuggestsTheNearestOne) {
  const std::string e = failure_of(R"(materials:
  m: {poles: {critical_points: {amplitude: 1, phase: -45 degs, resonance: 2 eV, damping: 0.5 eV}}}
)");
  EXPECT_THAT(e, HasSubstr("'degs' is not an angle unit; did you mean 'deg'?"));
}

TEST(SceneCriticalPoints, MissingResonanceIsNamed) {
  const std::string e = failure_of(R"(materials:
  m: {poles: {critical_points: [{amplitude: 1, phase: 0 deg, damping: 0.5 eV}]}}
)");
  EXPECT_THAT(e, HasSubstr("missing key 'resonance'"));
}

// The printed block, read back, is the model that was printed: every library entry (Drude, Lorentz,
// lossless Lorentz and critical points) at 9 significant digits agrees to 1e-7 relative.
TEST(PoleBlockWriter, PrintedBlockReadsBackAsTheSameModelForEveryLibraryEntry) {
  for (const auto& entry : yeegap::materials::library()) {
    const std::string text = yeegap::io::material_block_text("m", entry.poles);
    const PoleSet back = poles_of(text);
    for (double nm : {450.0, 550.0, 650.0, 800.0}) {
      const std::complex<double> want = eps_at_nm(entry.poles, nm);
      EXPECT_LT(std::abs(eps_at_nm(back, nm) - want), 1e-7 * std::abs(want)) << entry.name << " at " << nm << " nm\n"
                                                                             << text;
    }
  }
}

TEST(PoleBlockWriter, PrintedFitOfATableReadsBackAsTheFittedModel) {
  // Invented gold-like samples (demo numbers, eV): what `yeegap materials fit` prints for such a fit.
  PoleSet truth;
  truth.eps_inf = 2.0;
  truth.drude.push_back({units::eV_to_omega(8.5), units::eV_to_omega(0.07)});
  truth.lorentz.push_back({1.2, units::eV_to_omega(2.9), units::eV_to_omega(0.8)});
  std::vector<yeegap::materials::FitSample> samples;
  for (int i = 0; i < 30; ++i) {
    const double omega = units::wavelength_to_omega((450.0 + 15.0 * i) * units::nm);
    samples.push_back({omega, yeegap::materials::permittivity(truth, omega)});
  }
  yeegap::materials::FitOptions options;
  options.lorentz_poles = 1;
  const PoleSet fit = yeegap::materials::fit_poles(samples, options).poles;
  const PoleSet back = poles_of(yeegap::io::material_block_text("m", fit));
  for (const auto& s : samples) {
    const std::complex<double> want = yeegap::materials::permittivity(fit, s.omega);
    EXPECT_LT(std::abs(yeegap::materials::permittivity(back, s.omega) - want), 1e-7 * std::abs(want));
  }
}

}  // namespace
