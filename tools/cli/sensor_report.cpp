// Prints a sensor result (see sensor_report.h). Warnings name what to change (scan range, step).
#include "sensor_report.h"

#include <cstdio>

#include "base/constants.h"
#include "json.h"
#include "solver/outputs/reflectance_dip.h"

namespace yeegap::cli {

std::string report_sensor(const solver::SensorResult& s) {
  constexpr double deg = 180 / constants::pi;
  const double wl_nm = 2 * constants::pi * constants::c0 / s.omega * 1e9;
  const solver::ReflectanceDip& d = s.dip;
  std::fprintf(stderr, "  sensor %s at %.1f nm (%s, n = %.5g, raised by %g):\n", s.name.c_str(), wl_nm, s.medium.c_str(),
               s.index, s.delta_n);
  std::fprintf(stderr, "    resonance angle %.3f deg, minimum reflectance %.4f, width at half depth %.3f deg\n",
               d.position * deg, d.r_min, d.width * deg);
  std::fprintf(stderr, "    raised: %.3f deg; sensitivity %.1f deg/RIU, figure of merit %.1f /RIU\n",
               s.dip_raised.position * deg, s.figures.sensitivity * deg, s.figures.figure_of_merit);
  if (!s.binding.empty())
    std::fprintf(stderr, "    before binding (%s as %s): %.3f deg; binding shift %+.3f deg (as a bulk index change of %.4g)\n",
                 s.binding.c_str(), s.medium.c_str(), s.dip_before_binding.position * deg, s.binding_shift * deg,
                 s.binding_equivalent_index);
  const std::string warnings = solver::describe_dip_flags(s.figures.flags);
  if (!warnings.empty()) std::fprintf(stderr, "    warning: %s\n", warnings.c_str());
  JsonObject j;
  j.text("medium", s.medium)
      .number("index", s.index)
      .number("delta_n", s.delta_n)
      .number("wavelength_nm", wl_nm)
      .number("resonance_angle_deg", d.position * deg)
      .number("r_min", d.r_min)
      .number("width_deg", d.width * deg)
      .number("resonance_angle_raised_deg", s.dip_raised.position * deg)
      .number("sensitivity_deg_per_riu", s.figures.sensitivity * deg)
      .number("figure_of_merit", s.figures.figure_of_merit);
  if (!s.binding.empty())
    j.text("binding", s.binding)
        .number("resonance_angle_before_binding_deg", s.dip_before_binding.position * deg)
        .number("binding_shift_deg", s.binding_shift * deg)
        .number("binding_equivalent_index", s.binding_equivalent_index);
  j.text("warnings", warnings);
  return j.str();
}

}  // namespace yeegap::cli
