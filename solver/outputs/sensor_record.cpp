// The sensor output's record: the figures are attributes, so a script reads them without loading
// arrays; degrees beside radians because every sensor paper quotes degrees. The summary is one
// paragraph and one JSON object (figures in degrees; definitions in docs/sensor.md).
#include <fmt/format.h>

#include "base/constants.h"
#include "solver/outputs/result_records.h"

namespace yeegap::solver {

namespace {

double degrees(double radians) { return radians * (180 / constants::pi); }

// One dip's figures as attributes, `suffix` "" for the reference, "_raised" for n + delta_n and
// "_before_binding" for the scan without the bound layer.
void dip_attributes(Record& r, const ReflectanceDip& d, const std::string& suffix) {
  r.set("resonance_angle" + suffix, d.position);
  r.set("resonance_angle_deg" + suffix, degrees(d.position));
  r.set("r_min" + suffix, d.r_min);
  r.set("baseline" + suffix, d.baseline);
  r.set("width" + suffix, d.width);
  r.set("width_deg" + suffix, degrees(d.width));
  r.set("half_depth_angles_deg" + suffix, std::vector<double>{degrees(d.left), degrees(d.right)});
  r.set("flags" + suffix, static_cast<std::int32_t>(d.flags));
}

Cell json(const char* key, double v) { return json_cell(key, v); }
Cell json(const char* key, const std::string& v) { return json_cell(key, v); }
Cell shown(double v, const char* spec, std::string before, std::string after = "") {
  return Cell("", v, spec, 1, std::move(before), std::move(after));
}

}  // namespace

Record record_of(const SensorResult& s) {
  Record r("sensor", s.name);
  const std::size_t n = s.angles.size();
  require_rows(r, n, {s.reflectance.size(), s.reflectance_raised.size()}, "angles");
  if (!s.binding.empty()) require_rows(r, n, {s.reflectance_before_binding.size()}, "angles");
  const double wl_nm = 2 * constants::pi * constants::c0 / s.omega * 1e9;
  const std::string warnings = describe_dip_flags(s.figures.flags);
  r.set("medium", s.medium);
  r.set("index", s.index);
  r.set("delta_n", s.delta_n);
  r.set("omega", s.omega);
  r.set("wavelength_nm", wl_nm);
  dip_attributes(r, s.dip, "");
  dip_attributes(r, s.dip_raised, "_raised");
  r.set("shift_deg", degrees(s.figures.shift));
  r.set("sensitivity", s.figures.sensitivity);
  r.set("sensitivity_deg_per_riu", degrees(s.figures.sensitivity));
  r.set("figure_of_merit", s.figures.figure_of_merit);
  r.set("warnings", warnings);
  std::vector<double> angle_deg;
  for (double a : s.angles) angle_deg.push_back(degrees(a));
  r.add("angle", "rad", s.angles, "angle of incidence in the incident medium, increasing");
  r.add("angle_deg", "deg", std::move(angle_deg), "the same in degrees");
  r.add("reflectance", "1", s.reflectance, "R at the sensing medium's own index");
  r.add("reflectance_raised", "1", s.reflectance_raised, "R with the sensing medium's index raised by delta_n");
  if (!s.binding.empty()) {
    // The scan before binding: the bound layer's material replaced by the sensing medium.
    r.set("binding", s.binding);
    dip_attributes(r, s.dip_before_binding, "_before_binding");
    r.set("binding_shift_deg", degrees(s.binding_shift));
    r.set("binding_equivalent_index", s.binding_equivalent_index);
    r.add("reflectance_before_binding", "1", s.reflectance_before_binding,
          "R with the binding material replaced by the sensing medium (before binding)");
  }

  r.summary.json_object = true;
  r.summary.heading = fmt::format("  sensor {} at {:.1f} nm ({}, n = {:.5g}, raised by {:g}):", s.name, wl_nm, s.medium,
                                  s.index, s.delta_n);
  auto& rows = r.summary.rows;
  rows.push_back(SummaryRow({json("medium", s.medium), json("index", s.index), json("delta_n", s.delta_n),
                            json("wavelength_nm", wl_nm),
                            shown(degrees(s.dip.position), "{:.3f}", "    resonance angle ", " deg"),
                            json("resonance_angle_deg", degrees(s.dip.position)),
                            shown(s.dip.r_min, "{:.4f}", ", minimum reflectance "), json("r_min", s.dip.r_min),
                            shown(degrees(s.dip.width), "{:.3f}", ", width at half depth ", " deg"),
                            json("width_deg", degrees(s.dip.width))}));
  rows.push_back(SummaryRow({shown(degrees(s.dip_raised.position), "{:.3f}", "    raised: ", " deg"),
                            json("resonance_angle_raised_deg", degrees(s.dip_raised.position)),
                            shown(degrees(s.figures.sensitivity), "{:.1f}", "; sensitivity ", " deg/RIU"),
                            json("sensitivity_deg_per_riu", degrees(s.figures.sensitivity)),
                            shown(s.figures.figure_of_merit, "{:.1f}", ", figure of merit ", " /RIU"),
                            json("figure_of_merit", s.figures.figure_of_merit)}));
  if (!s.binding.empty())
    rows.push_back(SummaryRow({json("binding", s.binding),
                              shown(degrees(s.dip_before_binding.position), "{:.3f}",
                                    fmt::format("    before binding ({} as {}): ", s.binding, s.medium), " deg"),
                              json("resonance_angle_before_binding_deg", degrees(s.dip_before_binding.position)),
                              shown(degrees(s.binding_shift), "{:+.3f}", "; binding shift ", " deg"),
                              json("binding_shift_deg", degrees(s.binding_shift)),
                              shown(s.binding_equivalent_index, "{:.4g}", " (as a bulk index change of ", ")"),
                              json("binding_equivalent_index", s.binding_equivalent_index)}));
  rows.push_back(SummaryRow({json("warnings", warnings)}, false));
  if (!warnings.empty())
    rows.push_back(SummaryRow({Cell("", warnings, "{}", 1, "    warning: ")}, true, false));
  return r;
}

}  // namespace yeegap::solver
