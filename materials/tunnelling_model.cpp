// Gap damping and permittivity (see tunnelling_model.h). The short-gap join follows the published
// QCM anchoring (physics.md 1.3): gamma_p at l = 0, the barrier result from l' on, an exponential in
// between. A sum of resistivities would not do: l G_A -> 0 as l -> 0 (the contact conductance per
// area stays finite), so the barrier damping alone diverges at contact instead of reaching gamma_p.
#include "materials/tunnelling_model.h"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "materials/tunnelling_barrier.h"
#include "materials/tunnelling_conductance.h"

namespace yeegap::materials {

namespace {

// Root finding stops when log f is within this of its target (f to 1e-10 relative), or when the
// bracket is narrower than 1e-5 Angstrom, far below any grid cell.
constexpr double log_tolerance = 1e-10;
constexpr double width_resolution = 1e-15;

// The width in [lo, hi] where the increasing, positive f crosses `target`. log f is nearly linear
// in l (exponential tunnelling), so regula falsi on log f (Illinois variant, which keeps both ends
// moving) needs a handful of evaluations where bisection needs fifty; each one may be an integral.
double find_width(const std::function<double(double)>& f, double target, double lo, double hi) {
  const auto g = [&](double l) { return std::log(f(l)) - std::log(target); };
  double a = lo, b = hi, ga = g(a), gb = g(b);
  YG_CHECK(ga < 0 && gb > 0, fmt::format("no crossing of {} between {} and {} m", target, lo, hi));
  int side = 0;
  for (int iteration = 0; iteration < 200; ++iteration) {
    const double c = std::isfinite(ga) && std::isfinite(gb) ? (a * gb - b * ga) / (gb - ga) : 0.5 * (a + b);
    const double gc = g(c);
    if (std::abs(gc) < log_tolerance) return c;
    if (gc > 0) {
      b = c, gb = gc;
      if (side == -1) ga *= 0.5;
      side = -1;
    } else {
      a = c, ga = gc;
      if (side == +1) gb *= 0.5;
      side = +1;
    }
    if (b - a < width_resolution) break;
  }
  return 0.5 * (a + b);
}

double barrier_height(const TunnellingMetal& m) { return m.fermi_energy + m.work_function; }

// gamma_g of the barrier alone (no join): infinite at l = 0 and wherever G_A underflows.
double barrier_damping(const TunnellingModel& model, double gap) {
  return damping_from_conductivity(model.metal.plasma_frequency, gap * barrier_conductance_per_area(model, gap));
}

}  // namespace

const char* barrier_kind_name(BarrierKind kind) {
  switch (kind) {
    case BarrierKind::rectangular: return "rectangular";
    case BarrierKind::image_rounded: return "image_rounded";
    case BarrierKind::exponential_fit: return "exponential_fit";
  }
  return "unknown";
}

double damping_from_conductivity(double plasma_frequency, double conductivity) {
  if (!(conductivity > 0)) return std::numeric_limits<double>::infinity();
  return constants::eps0 * plasma_frequency * plasma_frequency / conductivity;
}

double barrier_transmission_fermi(const TunnellingModel& model, double gap) {
  const TunnellingMetal& m = model.metal;
  switch (model.barrier) {
    case BarrierKind::rectangular: return rectangular_transmission(m.fermi_energy, barrier_height(m), gap);
    case BarrierKind::image_rounded:
      return profile_transmission(image_rounded_profile(m.fermi_energy, m.work_function, gap,
                                                        model.options.barrier_permittivity, model.options.max_slab),
                                  m.fermi_energy);
    case BarrierKind::exponential_fit: break;
  }
  return std::numeric_limits<double>::quiet_NaN();
}

double barrier_conductance_per_area(const TunnellingModel& model, double gap) {
  const TunnellingMetal& m = model.metal;
  switch (model.barrier) {
    case BarrierKind::rectangular: {
      const double v0 = barrier_height(m);
      return conductance_per_area([&](double e) { return rectangular_transmission(e, v0, gap); }, m.fermi_energy);
    }
    case BarrierKind::image_rounded: {
      const BarrierProfile p = image_rounded_profile(m.fermi_energy, m.work_function, gap,
                                                     model.options.barrier_permittivity, model.options.max_slab);
      return conductance_per_area([&](double e) { return profile_transmission(p, e); }, m.fermi_energy);
    }
    case BarrierKind::exponential_fit: break;
  }
  return std::numeric_limits<double>::quiet_NaN();
}

TunnellingModel make_tunnelling_model(const TunnellingMetal& metal, BarrierKind barrier,
                                      const TunnellingOptions& options) {
  YG_CHECK(metal.work_function > 0 && metal.fermi_energy > 0 && metal.plasma_frequency > 0 && metal.damping > 0,
           fmt::format("metal '{}' needs positive W, E_F, omega_p and gamma_p", metal.name));
  YG_CHECK(options.join_transmission >= 0 && options.join_transmission < 1 && options.cutoff_damping_ratio > 1,
           fmt::format("join transmission {} must lie in [0, 1) and the cut-off ratio {} exceed 1",
                       options.join_transmission, options.cutoff_damping_ratio));
  TunnellingModel model;
  model.metal = metal;
  model.barrier = barrier;
  model.options = options;
  const double log_ratio = std::log(options.cutoff_damping_ratio);
  if (barrier == BarrierKind::exponential_fit) {
    YG_CHECK(metal.fit_decay_length > 0, fmt::format("metal '{}' has no fit decay length", metal.name));
    model.join_decay_length = metal.fit_decay_length;
    model.cutoff_width = metal.fit_decay_length * log_ratio;
    return model;
  }
  const double target = options.cutoff_damping_ratio * metal.damping;
  // Bracket in 1 A steps: wide gaps cost most (the image profile has more slabs and the integrand
  // spans more decades), so they are only evaluated when needed.
  const double bracket_step = 1e-10;
  if (options.join_transmission == 0) {
    // No join: the barrier's damping at every width. It is infinite at contact (l G_A -> 0) and
    // falls to a minimum within about an Angstrom, so the cut-off search starts beyond that.
    double lo = bracket_step, hi = lo + bracket_step;
    while (barrier_damping(model, hi) < target) {
      lo = hi;
      hi += bracket_step;
      if (hi > options.max_width) {
        model.cutoff_width = options.max_width;
        return model;
      }
    }
    model.cutoff_width = find_width([&](double l) { return barrier_damping(model, l); }, target, lo, hi);
    return model;
  }
  // l': T(E_F) falls monotonically from 1 at contact.
  const auto opacity = [&](double l) { return 1.0 / barrier_transmission_fermi(model, l); };
  model.join_width = find_width(opacity, 1.0 / options.join_transmission, 0.0, options.max_width);
  const double gamma_join = barrier_damping(model, model.join_width);
  YG_CHECK(gamma_join > metal.damping,
           fmt::format("barrier damping {} rad/s at l' = {} m is not above the bulk {} rad/s", gamma_join,
                       model.join_width, metal.damping));
  model.join_decay_length = model.join_width / std::log(gamma_join / metal.damping);
  if (target <= gamma_join) {
    model.cutoff_width = model.join_decay_length * log_ratio;
    return model;
  }
  double lo = model.join_width, hi = lo + bracket_step;
  while (barrier_damping(model, hi) < target) {
    lo = hi;
    hi += bracket_step;
    if (hi > options.max_width) {
      model.cutoff_width = options.max_width;  // not reached within the searched widths
      return model;
    }
  }
  model.cutoff_width = find_width([&](double l) { return barrier_damping(model, l); }, target, lo, hi);
  return model;
}

double gap_damping(const TunnellingModel& model, double gap) {
  const double l = std::max(gap, 0.0);
  if (model.barrier == BarrierKind::exponential_fit || l < model.join_width)
    return model.metal.damping * std::exp(l / model.join_decay_length);
  return barrier_damping(model, l);
}

TunnellingPoint evaluate_tunnelling(const TunnellingModel& model, double gap) {
  TunnellingPoint p;
  p.gap = gap;
  const double wp2 = model.metal.plasma_frequency * model.metal.plasma_frequency;
  if (model.barrier == BarrierKind::exponential_fit) {
    p.damping = gap_damping(model, gap);
    p.conductivity = constants::eps0 * wp2 / p.damping;
    p.transmission_fermi = std::numeric_limits<double>::quiet_NaN();
    p.conductance_per_area = gap > 0 ? p.conductivity / gap : std::numeric_limits<double>::quiet_NaN();
    return p;
  }
  // As gap_damping, but the (costly, for image_rounded) conductance is computed once.
  p.transmission_fermi = barrier_transmission_fermi(model, gap);
  p.conductance_per_area = barrier_conductance_per_area(model, gap);
  p.damping = gap < model.join_width
                  ? model.metal.damping * std::exp(std::max(gap, 0.0) / model.join_decay_length)
                  : damping_from_conductivity(model.metal.plasma_frequency, gap * p.conductance_per_area);
  p.conductivity = constants::eps0 * wp2 / p.damping;
  return p;
}

std::complex<double> gap_permittivity(const TunnellingModel& model, double gap, double omega) {
  const double gamma = gap_damping(model, gap);
  const double wp = model.metal.plasma_frequency;
  if (!std::isfinite(gamma)) return {model.options.background, 0.0};
  return model.options.background - wp * wp / (omega * std::complex<double>(omega, gamma));
}

PoleSet gap_pole_set(const TunnellingModel& model, double gap) {
  PoleSet p;
  p.eps_inf = model.options.background;
  const double gamma = gap_damping(model, gap);
  if (std::isfinite(gamma)) p.drude.push_back({model.metal.plasma_frequency, gamma});  // else: background only
  return p;
}

}  // namespace yeegap::materials
