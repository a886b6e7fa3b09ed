// The sensor output's second scan and its figures (see sensor_scan.h). The index is raised only at
// the scan frequency: an angle scan runs every angle at one frequency, so nothing else is seen.
#include "solver/runs/sensor_scan.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <fmt/format.h>
#include <numeric>

#include "base/constants.h"
#include "base/errors.h"
#include "materials/pole_set.h"

namespace yeegap::solver {
namespace {

struct SortedCurve {
  std::vector<double> angles, reflectance;
};

SortedCurve sorted(const AngleScanCurve& c) {
  YG_CHECK(c.angles.size() == c.reflectance.size(),
           fmt::format("{} angles, {} reflectances", c.angles.size(), c.reflectance.size()));
  std::vector<std::size_t> order(c.angles.size());
  std::iota(order.begin(), order.end(), 0);
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return c.angles[a] < c.angles[b]; });
  SortedCurve s;
  for (std::size_t k : order) {
    if (!s.angles.empty() && !(c.angles[k] > s.angles.back()))
      throw RunError(fmt::format("sensor: the angle {:.6g} deg is scanned twice", c.angles[k] * 180 / constants::pi));
    s.angles.push_back(c.angles[k]);
    s.reflectance.push_back(c.reflectance[k]);
  }
  return s;
}

}  // namespace

Scene with_raised_index(const Scene& scene, int medium, double delta_n, double omega) {
  YG_CHECK(medium >= 0 && medium < static_cast<int>(scene.materials.size()), fmt::format("material {}", medium));
  YG_CHECK(omega > 0, fmt::format("omega = {}", omega));
  Scene raised = scene;
  MaterialSpec& m = raised.materials[static_cast<std::size_t>(medium)];
  if (m.perfect_conductor)
    throw RunError(fmt::format("sensor: the sensing medium '{}' is a perfect conductor; it has no index to raise", m.name));
  const std::complex<double> n = materials::refractive_index(m.poles, omega);
  const std::complex<double> d_eps = 2.0 * n * delta_n + delta_n * delta_n;
  m.poles.eps_inf += d_eps.real();
  m.poles.conductivity += constants::eps0 * omega * d_eps.imag();
  return raised;
}

Scene before_binding(const Scene& scene, int binding, int medium) {
  YG_CHECK(binding >= 0 && binding < static_cast<int>(scene.materials.size()), fmt::format("material {}", binding));
  if (scene.domain.background == binding)
    throw RunError(fmt::format("sensor: the binding material '{}' fills the background; the bound layer has to be a body",
                               scene.materials[static_cast<std::size_t>(binding)].name));
  Scene before = scene;
  for (BodySpec& b : before.bodies)
    if (b.material == binding) b.material = medium;
  return before;
}

SensorResult sensor_result(const Scene& scene, const SensorSpec& spec, const AngleScanCurve& reference,
                           const AngleScanCurve& raised) {
  YG_CHECK(reference.omega == raised.omega, "both scans at one frequency");
  const SortedCurve a = sorted(reference), b = sorted(raised);
  YG_CHECK(a.angles == b.angles, "both scans at the same angles");
  SensorResult r;
  r.name = spec.name;
  r.medium = scene.materials[static_cast<std::size_t>(spec.medium)].name;
  r.delta_n = spec.delta_n;
  r.index = materials::refractive_index(scene.materials[static_cast<std::size_t>(spec.medium)].poles, reference.omega).real();
  r.omega = reference.omega;
  r.angles = a.angles;
  r.reflectance = a.reflectance;
  r.reflectance_raised = b.reflectance;
  r.dip = find_reflectance_dip(a.angles, a.reflectance);
  r.dip_raised = find_reflectance_dip(b.angles, b.reflectance);
  r.figures = sensor_figures(r.dip, r.dip_raised, spec.delta_n);
  return r;
}

SensorResult run_sensor(const Scene& scene, const SensorSpec& spec, const AngleScanCurve& reference,
                        const std::function<AngleScanCurve(const Scene&)>& run_scan) {
  Scene raised = with_raised_index(scene, spec.medium, spec.delta_n, reference.omega);
  raised.sensors.clear();  // the repeats are plain scans
  SensorResult r = sensor_result(scene, spec, reference, run_scan(raised));
  if (spec.binding < 0) return r;
  Scene before = before_binding(scene, spec.binding, spec.medium);
  before.sensors.clear();
  const AngleScanCurve b = run_scan(before);
  YG_CHECK(b.omega == reference.omega, "the binding scan at the run's frequency");
  const SortedCurve s = sorted(b);
  YG_CHECK(s.angles == r.angles, "the binding scan at the run's angles");
  r.binding = scene.materials[static_cast<std::size_t>(spec.binding)].name;
  r.reflectance_before_binding = s.reflectance;
  r.dip_before_binding = find_reflectance_dip(s.angles, s.reflectance);
  r.binding_shift = r.dip.position - r.dip_before_binding.position;
  r.binding_equivalent_index = r.binding_shift / r.figures.sensitivity;
  r.figures.flags |= r.dip_before_binding.flags;
  return r;
}

}  // namespace yeegap::solver
