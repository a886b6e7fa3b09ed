// The `sensor` output's pair of angle scans: the scene again with the sensing medium's refractive
// index raised by delta_n at the scan frequency, and the figures of the two reflectance curves
// (solver/outputs/reflectance_dip.h; definitions in docs/sensor.md). The angle-scan engine is passed in as a
// function, so this file knows nothing of how R(theta) is computed (a test passes a transfer matrix).
#pragma once

#include <functional>
#include <vector>

#include "solver/results.h"
#include "solver/scene.h"

namespace yeegap::solver {

/// R against the angle of incidence at one frequency, as an angle-scan run returns it.
struct AngleScanCurve {
  double omega = 0;                  // rad/s
  std::vector<double> angles;        // rad, in the incident medium, any order
  std::vector<double> reflectance;
};

/// A copy of `scene` whose material `medium` has its refractive index raised by delta_n at omega:
/// eps -> (sqrt(eps) + delta_n)^2. The change 2 sqrt(eps) delta_n + delta_n^2 goes into eps_inf (real
/// part) and the static conductivity (imaginary part, eps0 omega Im), so it is exact at omega, the
/// scan's only frequency, and leaves the medium's poles alone. RunError for a perfect conductor.
Scene with_raised_index(const Scene& scene, int medium, double delta_n, double omega);

/// A copy of `scene` before the layer bound: every body of material `binding` made of `medium`
/// instead. RunError when `binding` fills the background (a layer has to be a body).
Scene before_binding(const Scene& scene, int binding, int medium);

/// The figures from the reference curve and the raised one (same angles, same frequency).
SensorResult sensor_result(const Scene& scene, const SensorSpec& spec, const AngleScanCurve& reference,
                           const AngleScanCurve& raised);

/// Runs `run_scan` on the raised scene and returns the figures; `reference` is the run's own curve.
/// With spec.binding, runs it also on before_binding() and adds the binding shift.
SensorResult run_sensor(const Scene& scene, const SensorSpec& spec, const AngleScanCurve& reference,
                        const std::function<AngleScanCurve(const Scene&)>& run_scan);

}  // namespace yeegap::solver
