// Stability bound of the explicit pole updates, from the bulk discrete dispersion relation
// (materials/discrete_permittivity.cpp; root argument after Taflove & Hagness 2005, ch. 4 and 9):
// S^2 < eps_d(pi/dt), S = dt over the vacuum Courant limit; the damping drops out. Derivation and
// the figures for gold: docs/physics.md 3.2.
#include "solver/media/dispersive_stability.h"

#include <cmath>
#include <complex>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "materials/discrete_permittivity.h"

namespace yeegap::solver {

double nyquist_permittivity(const materials::PoleSet& poles, double dt) {
  const double omega_sq = 4.0 / (dt * dt);  // Omega^2 at w = pi/dt
  double eps = poles.eps_inf;
  for (const auto& d : poles.drude) eps -= d.omega_p * d.omega_p / omega_sq;
  for (const auto& l : poles.lorentz) eps += l.delta_eps * l.omega_0 * l.omega_0 / (l.omega_0 * l.omega_0 - omega_sq);
  for (const auto& cp : poles.critical_points) {
    const materials::CriticalPointAde a = materials::critical_point_ade(cp);
    eps += a.a0 / (a.omega0_sq - omega_sq);
  }
  return eps;
}

namespace {

// Frequencies at which passivity is checked: log-spaced over six decades below pi/dt (about 680 per
// decade), every pole's own frequency, where a narrow feature could hide between samples, and three
// decades either side of each pole's scales (frequency, plasma frequency, damping). The last keep
// gain visible at any dt: six decades below pi/dt alone start above the model's scales once dt is
// small enough, where the gain term is too small to see, and the step search would settle there.
std::vector<double> passivity_samples(const materials::PoleSet& poles, double dt) {
  const double top = constants::pi / dt;
  std::vector<double> w;
  constexpr int count = 4096;
  for (int q = 0; q < count; ++q) w.push_back(top * std::pow(10.0, -6.0 * (count - 0.5 - q) / count));
  for (const auto& l : poles.lorentz) w.push_back(l.omega_0);
  for (const auto& cp : poles.critical_points) w.push_back(cp.omega);
  std::vector<double> scales;
  for (const auto& d : poles.drude) scales.insert(scales.end(), {d.omega_p, std::abs(d.gamma)});
  for (const auto& l : poles.lorentz) scales.insert(scales.end(), {l.omega_0, std::abs(l.gamma)});
  for (const auto& cp : poles.critical_points) scales.insert(scales.end(), {cp.omega, std::abs(cp.gamma)});
  constexpr int per_scale = 121;  // 20 per decade over 1e-3 .. 1e3
  for (double scale : scales)
    if (scale > 0)
      for (int q = 0; q < per_scale; ++q) {
        const double x = scale * std::pow(10.0, -3.0 + 6.0 * q / (per_scale - 1));
        if (x < top) w.push_back(x);
      }
  return w;
}

}  // namespace

std::string dispersive_instability(const MaterialSpec& m, double dt, double courant_limit) {
  if (m.perfect_conductor) return {};
  const materials::PoleSet& p = m.poles;
  for (const auto& l : p.lorentz)
    if (!(l.omega_0 * dt < 2.0))
      return fmt::format("a Lorentz pole at {:.4g} rad/s has omega_0 dt = {:.4g}, at or above 2 (the central-difference "
                         "oscillator is unstable there)", l.omega_0, l.omega_0 * dt);
  double implicit = 0;  // the critical points' share of the E^{n+1} coefficient, over eps0/dt
  for (const auto& cp : p.critical_points) {
    const materials::CriticalPointAde a = materials::critical_point_ade(cp);
    if (!(std::sqrt(a.omega0_sq) * dt < 2.0))
      return fmt::format("a critical point at {:.4g} rad/s has sqrt(Omega^2 + Gamma^2) dt = {:.4g}, at or above 2",
                         cp.omega, std::sqrt(a.omega0_sq) * dt);
    implicit += 0.5 * a.a1 * dt / (1.0 + 0.5 * a.damping * dt);
  }
  if (!(p.eps_inf + implicit > 0))
    return fmt::format("eps_inf plus the critical points' implicit term is {:.4g}, not positive", p.eps_inf + implicit);
  const double s = dt / courant_limit;
  const double eps_n = nyquist_permittivity(p, dt);
  const bool too_low = p.dispersive() ? eps_n <= s * s : eps_n < s * s;
  if (too_low)
    return fmt::format("its discrete permittivity at the grid's highest frequency pi/dt is {:.6g}, not above the square of "
                       "the Courant number S = {:.6g}", eps_n, s);
  if (!p.dispersive()) return {};
  if (p.conductivity < 0) return fmt::format("its conductivity {} S/m is negative (gain)", p.conductivity);
  for (double w : passivity_samples(p, dt)) {
    const std::complex<double> eps = materials::discrete_permittivity(p, w, dt);
    if (eps.imag() < -1e-9 * std::abs(eps))
      return fmt::format("its model has gain (Im eps = {:.4g} < 0) at {:.4g} rad/s ({:.4g} nm), where fields can grow",
                         eps.imag(), w, 2 * constants::pi * constants::c0 / w * 1e9);
  }
  return {};
}

namespace {
bool stable_at(const std::vector<MaterialSpec>& materials, double dt, double courant_limit) {
  for (const MaterialSpec& m : materials)
    if (!dispersive_instability(m, dt, courant_limit).empty()) return false;
  return true;
}
}  // namespace

double stable_time_step(const std::vector<MaterialSpec>& materials, double courant_limit) {
  auto stable = [&](double dt) { return stable_at(materials, dt, courant_limit); };
  if (stable(courant_limit)) return courant_limit;
  // Every condition holds as dt -> 0 for a model with eps_inf > 0 and no gain; bisect for the edge.
  double lo = 0, hi = courant_limit;
  for (int it = 0; it < 60; ++it) {
    const double mid = 0.5 * (lo + hi);
    (stable(mid) ? lo : hi) = mid;
  }
  if (lo > 0) return lo;
  // Not stable even at 1e-18 of the Courant limit: a model with gain, or a negative eps_inf, which
  // no time step cures. Name the material and the rule it breaks rather than run with dt = 0.
  for (const MaterialSpec& m : materials) {
    const std::string why = dispersive_instability(m, hi, courant_limit);
    if (!why.empty())
      throw RunError(fmt::format("{}: material '{}' cannot run at any time step: {}", m.where.location(), m.name, why));
  }
  throw RunError("no time step makes the scene's materials stable");
}

void check_dispersive_stability(const Scene& s, double dt, double courant_limit) {
  for (const MaterialSpec& m : s.materials) {
    const std::string why = dispersive_instability(m, dt, courant_limit);
    if (why.empty()) continue;
    const double best = stable_time_step(s.materials, courant_limit);
    // A Courant number with four decimals that is itself stable (rounding could land on the edge).
    double courant = std::floor(best / courant_limit * 1e4) / 1e4;
    while (courant > 0 && !stable_at(s.materials, courant * courant_limit, courant_limit)) courant -= 1e-4;
    const std::string advice =
        courant > 0 ? fmt::format("The largest stable time step of this scene is {:.6g} s, i.e. domain.stability_fraction at most {:.4f}",
                                  best, courant)
                    : std::string("No time step makes it stable; check the material's parameters");
    throw RunError(fmt::format("{}: material '{}' is unstable at the time step {:.6g} s: {}. {} "
                               "(solver/media/dispersive_stability.cpp derives the bound).",
                               m.where.location(), m.name, dt, why, advice));
  }
}

}  // namespace yeegap::solver
