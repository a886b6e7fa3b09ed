// The numerical permittivity of the J-form ADE scheme: against the scheme itself run in time, against
// physics.md 3.4's closed forms, and its second-order approach to the continuous model.
#include <gtest/gtest.h>

#include <cmath>
#include <complex>
#include <vector>

#include "base/constants.h"
#include "base/units.h"
#include "materials/discrete_permittivity.h"
#include "materials/library.h"

namespace yeegap::materials {
namespace {

using cplx = std::complex<double>;
const cplx I(0.0, 1.0);

// Runs the update equations exactly as the solver will (discrete_permittivity.cpp, "The scheme")
// for a prescribed E^n = exp(-i omega n dt) until the transients have died, then measures
// eps_d = C^{n+1/2} / (z^{1/2} (-i Omega) eps0 E^n) from the E update. Independent of the z-transform.
cplx measured_by_time_stepping(const PoleSet& p, double omega, double dt, long steps) {
  const double eps0 = constants::eps0;
  auto E = [&](long n) { return std::exp(-I * omega * dt * static_cast<double>(n)); };
  std::vector<cplx> jd(p.drude.size()), jl(p.lorentz.size()), pl(p.lorentz.size());
  std::vector<cplx> jc(p.critical_points.size()), pc(p.critical_points.size());
  std::vector<CriticalPointAde> ade;
  for (const CriticalPoint& c : p.critical_points) ade.push_back(critical_point_ade(c));
  cplx sum_j;
  for (long n = 0; n < steps; ++n) {
    sum_j = 0;
    for (size_t k = 0; k < p.drude.size(); ++k) {
      const double g = p.drude[k].gamma, wp = p.drude[k].omega_p;
      jd[k] = ((1 - g * dt / 2) * jd[k] + eps0 * wp * wp * dt * E(n)) / (1 + g * dt / 2);
      sum_j += jd[k];
    }
    for (size_t k = 0; k < p.lorentz.size(); ++k) {
      const LorentzPole& l = p.lorentz[k];
      const double w0sq = l.omega_0 * l.omega_0;
      jl[k] = ((1 - l.gamma * dt / 2) * jl[k] - dt * w0sq * pl[k] + dt * eps0 * l.delta_eps * w0sq * E(n)) /
              (1 + l.gamma * dt / 2);
      pl[k] += dt * jl[k];
      sum_j += jl[k];
    }
    for (size_t k = 0; k < ade.size(); ++k) {
      const double G = ade[k].damping / 2;
      jc[k] = ((1 - G * dt) * jc[k] - dt * ade[k].omega0_sq * pc[k] + dt * eps0 * ade[k].a0 * E(n) +
               eps0 * ade[k].a1 / 2 * (E(n + 1) - E(n - 1))) /
              (1 + G * dt);
      pc[k] += dt * jc[k];
      sum_j += jc[k];
    }
  }
  const long n = steps - 1;  // the last J computed is J^{n+1/2}
  const cplx curl_h = eps0 * p.eps_inf * (E(n + 1) - E(n)) / dt + p.conductivity * (E(n + 1) + E(n)) / 2.0 + sum_j;
  const cplx z_half = std::exp(-I * omega * dt / 2.0);
  return curl_h / (z_half * (-I * yee_omega(omega, dt)) * eps0 * E(n));
}

TEST(DiscretePermittivity, EqualsTheSchemeRunInTimeForGoldModels) {
  // Lossy models only, so that the start-up transient decays; 30 damping times at the slowest pole.
  // Rakic 1998 Au (Appl. Opt. 37, 5271) and Etchegoin 2006 Au (J. Chem. Phys. 125, 164705) from the
  // library, plus a conductivity, at a coarse dt so that eps_d differs visibly from eps.
  PoleSet poles = find_material("Au")->poles;
  const PoleSet cp = find_material("Au_critical_points")->poles;
  poles.critical_points = cp.critical_points;
  poles.conductivity = 2e5;  // S/m, invented for this check
  const double dt = 2e-17;
  const double slowest = poles.drude[0].gamma;
  const long steps = static_cast<long>(60.0 / (slowest * dt));
  for (double lambda_nm : {450.0, 633.0, 900.0}) {
    const double omega = units::wavelength_to_omega(lambda_nm * units::nm);
    const cplx expected = discrete_permittivity(poles, omega, dt);
    const cplx measured = measured_by_time_stepping(poles, omega, dt, steps);
    // Agreement to rounding: the z-transform algebra is exact for the steady state.
    EXPECT_LT(std::abs(measured - expected) / std::abs(expected), 1e-9) << lambda_nm << " nm";
    EXPECT_GT(std::abs(expected - permittivity(poles, omega)) / std::abs(expected), 1e-5)
        << "dt too small for this check to see the discretisation";
  }
}

TEST(DiscretePermittivity, MatchesPhysicsNotesClosedFormsForSinglePoles) {
  // physics.md 3.4 [V-calc, derived there]: with Omega_d = (2/dt) sin(omega dt/2), c = cos(omega dt/2),
  // Lorentz: de w0^2/(w0^2 - Omega_d^2 - i g Omega_d c); Drude: -wp^2/(Omega_d^2 + i g Omega_d c).
  const double dt = 5e-17, omega = 3e15;
  const double od = 2.0 / dt * std::sin(omega * dt / 2), c = std::cos(omega * dt / 2);
  const LorentzPole l{1.7, 4e15, 6e14};
  const DrudePole d{1.3e16, 1e14};
  const cplx lorentz_notes = l.delta_eps * l.omega_0 * l.omega_0 /
                             (l.omega_0 * l.omega_0 - od * od - I * l.gamma * od * c);
  const cplx drude_notes = -d.omega_p * d.omega_p / (od * od + I * d.gamma * od * c);
  EXPECT_LT(std::abs(discrete_lorentz_susceptibility(l, omega, dt) - lorentz_notes), 1e-12 * std::abs(lorentz_notes));
  EXPECT_LT(std::abs(discrete_drude_susceptibility(d, omega, dt) - drude_notes), 1e-12 * std::abs(drude_notes));
}

TEST(DiscretePermittivity, TendsToTheContinuousModelAtSecondOrderInDt) {
  // A second-order scheme (physics.md 3.4): halving dt divides the error by 4 as dt -> 0.
  // Checked for every library entry at three wavelengths inside its range.
  for (const LibraryEntry& e : library()) {
    for (double t : {0.1, 0.5, 0.9}) {
      const double lambda = e.wavelength_min * std::pow(e.wavelength_max / e.wavelength_min, t);
      const double omega = units::wavelength_to_omega(lambda);
      const cplx exact = permittivity(e.poles, omega);
      const double dt = 0.02 / omega;  // omega dt = 0.02: well inside the asymptotic range
      const double err1 = std::abs(discrete_permittivity(e.poles, omega, dt) - exact);
      const double err2 = std::abs(discrete_permittivity(e.poles, omega, dt / 2) - exact);
      ASSERT_GT(err2, 0.0) << e.name;
      // Richardson ratio of a second-order error: 4, to within the O(dt^4) next term (about 1e-3 here).
      EXPECT_NEAR(err1 / err2, 4.0, 0.02) << e.name << " at " << lambda * 1e9 << " nm";
    }
  }
}

TEST(DiscretePermittivity, IsWithinOnePartInAThousandAtOneAttosecondFrom500To1000nm) {
  // physics.md 3.4 check: at dt = 1e-18 s the difference from the continuous eps is below 1e-3
  // relative at 500 to 1000 nm (Rakic 1998 metals; Etchegoin 2006 Au).
  for (const char* name : {"Ag", "Au", "Cu", "Al", "Au_critical_points"}) {
    const PoleSet& p = find_material(name)->poles;
    for (double lambda_nm = 500; lambda_nm <= 1000; lambda_nm += 50) {
      const double omega = units::wavelength_to_omega(lambda_nm * units::nm);
      const cplx exact = permittivity(p, omega);
      EXPECT_LT(std::abs(discrete_permittivity(p, omega, 1e-18) - exact) / std::abs(exact), 1e-3)
          << name << " at " << lambda_nm << " nm";
    }
  }
}

TEST(CriticalPointAde, ReproducesTheEtchegoinWavelengthFormTo1e9) {
  // physics.md 2.3: the second-order ADE (a0 - i omega a1)/(w0^2 - omega^2 - 2 i Gamma omega) must equal
  // the paper's wavelength form (Etchegoin, Le Ru, Meyer, J. Chem. Phys. 125, 164705 (2006)) to 1e-9.
  struct Term {
    double a, phi, lambda_i, gamma_i;  // nm
  };
  const Term terms[] = {{1.27, -constants::pi / 4, 470, 1900}, {1.10, -constants::pi / 4, 325, 1060}};
  for (const Term& t : terms) {
    const CriticalPoint cp{t.a, t.phi, units::wavelength_to_omega(t.lambda_i * units::nm),
                           units::wavelength_to_omega(t.gamma_i * units::nm)};
    const CriticalPointAde ade = critical_point_ade(cp);
    for (double l = 300; l <= 1200; l += 25) {
      const cplx paper = t.a / t.lambda_i *
                         (std::exp(I * t.phi) / (1 / t.lambda_i - 1 / l - I / t.gamma_i) +
                          std::exp(-I * t.phi) / (1 / t.lambda_i + 1 / l + I / t.gamma_i));
      const double w = units::wavelength_to_omega(l * units::nm);
      const cplx ade_form = (ade.a0 - I * w * ade.a1) / (ade.omega0_sq - w * w - I * ade.damping * w);
      EXPECT_LT(std::abs(ade_form - paper) / std::abs(paper), 1e-9) << l << " nm";
    }
  }
}

}  // namespace
}  // namespace yeegap::materials
