// Writes one sensor result (see sensor_writer.h). The figures are attributes, so a script reads them
// without loading arrays; degrees beside radians because every sensor paper quotes degrees.
#include "io/results/sensor_writer.h"

#include <cstdint>
#include <fmt/format.h>
#include <stdexcept>
#include <vector>

#include "base/constants.h"
#include "solver/outputs/reflectance_dip.h"

namespace yeegap::io {
namespace {

constexpr double deg = 180 / constants::pi;

void dataset(const h5::Group& g, const char* name, const std::vector<double>& v, const char* units,
             const char* description) {
  h5::Dataset d = g.write(name, v);
  d.set_attribute("units", units);
  d.set_attribute("description", description);
}

// One dip's figures as attributes, `suffix` "" for the reference, "_raised" for n + delta_n and
// "_before_binding" for the scan without the bound layer.
void dip_attributes(const h5::Group& g, const solver::ReflectanceDip& d, const std::string& suffix) {
  g.set_attribute("resonance_angle" + suffix, d.position);
  g.set_attribute("resonance_angle_deg" + suffix, d.position * deg);
  g.set_attribute("r_min" + suffix, d.r_min);
  g.set_attribute("baseline" + suffix, d.baseline);
  g.set_attribute("width" + suffix, d.width);
  g.set_attribute("width_deg" + suffix, d.width * deg);
  g.set_attribute("half_depth_angles_deg" + suffix, std::vector<double>{d.left * deg, d.right * deg});
  g.set_attribute("flags" + suffix, static_cast<std::int32_t>(d.flags));
}

}  // namespace

void write_sensor(const h5::Group& outputs, const solver::SensorResult& s) {
  const std::size_t n = s.angles.size();
  if (s.reflectance.size() != n || s.reflectance_raised.size() != n ||
      (!s.binding.empty() && s.reflectance_before_binding.size() != n))
    throw std::runtime_error(fmt::format("sensor '{}' has curves that do not match its {} angles", s.name, n));
  const h5::Group g = outputs.create_group(s.name);
  g.set_attribute("kind", "sensor");
  g.set_attribute("medium", s.medium);
  g.set_attribute("index", s.index);
  g.set_attribute("delta_n", s.delta_n);
  g.set_attribute("omega", s.omega);
  g.set_attribute("wavelength_nm", 2 * constants::pi * constants::c0 / s.omega * 1e9);
  dip_attributes(g, s.dip, "");
  dip_attributes(g, s.dip_raised, "_raised");
  g.set_attribute("shift_deg", s.figures.shift * deg);
  g.set_attribute("sensitivity", s.figures.sensitivity);
  g.set_attribute("sensitivity_deg_per_riu", s.figures.sensitivity * deg);
  g.set_attribute("figure_of_merit", s.figures.figure_of_merit);
  g.set_attribute("warnings", solver::describe_dip_flags(s.figures.flags));
  std::vector<double> angle_deg(n);
  for (std::size_t k = 0; k < n; ++k) angle_deg[k] = s.angles[k] * deg;
  dataset(g, "angle", s.angles, "rad", "angle of incidence in the incident medium, increasing");
  dataset(g, "angle_deg", angle_deg, "deg", "the same in degrees");
  dataset(g, "reflectance", s.reflectance, "1", "R at the sensing medium's own index");
  dataset(g, "reflectance_raised", s.reflectance_raised, "1", "R with the sensing medium's index raised by delta_n");
  if (s.binding.empty()) return;
  // The scan before binding: the bound layer's material replaced by the sensing medium.
  g.set_attribute("binding", s.binding);
  dip_attributes(g, s.dip_before_binding, "_before_binding");
  g.set_attribute("binding_shift_deg", s.binding_shift * deg);
  g.set_attribute("binding_equivalent_index", s.binding_equivalent_index);
  dataset(g, "reflectance_before_binding", s.reflectance_before_binding, "1",
          "R with the binding material replaced by the sensing medium (before binding)");
}

}  // namespace yeegap::io
