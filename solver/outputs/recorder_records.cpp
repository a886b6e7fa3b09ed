// The records of probes and flux surfaces (recorders.h), and records_of: every output's record in
// the order `yeegap run` prints them.
#include <algorithm>
#include <cmath>
#include <stdexcept>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/units.h"
#include "solver/engine/grid.h"
#include "solver/outputs/result_records.h"

namespace yeegap::solver {

namespace {

std::vector<double> flatten(const std::vector<Vec3>& points) {
  std::vector<double> flat;
  for (const Vec3& p : points) flat.insert(flat.end(), {p.x, p.y, p.z});
  return flat;
}

}  // namespace

Cell wavelength_cell(double omega, const char* key) {
  return {key, units::omega_to_wavelength(omega) / units::nm, "{:8.2f}", 1, "    ", " nm"};
}

double relative_to_dipole_alone(const RunResults& run, const Scene& scene, double omega, double power) {
  const auto it = std::find(run.source_omegas.begin(), run.source_omegas.end(), omega);
  const auto background = static_cast<std::size_t>(scene.domain.background);
  if (run.source_spectra.size() != 1 || it == run.source_omegas.end() || background >= scene.materials.size() ||
      run.source_spectra[0].size() != run.source_omegas.size())
    return std::nan("");
  const double n = std::sqrt(scene.materials[background].poles.eps_inf);
  const double il = std::abs(run.source_spectra[0][it - run.source_omegas.begin()]);
  const double k0 = omega / constants::c0;
  return power / (n * constants::eta0 * k0 * k0 * il * il / (12 * constants::pi));
}

Record record_of(const ProbeResult& p, double time_step) {
  Record r("probe", p.name);
  const std::size_t n_comp = p.components.size();
  if (p.values.size() != n_comp || p.sampled_at.size() != n_comp)
    throw std::invalid_argument(fmt::format("probe '{}' has {} components, {} value series and {} sample positions",
                                            p.name, n_comp, p.values.size(), p.sampled_at.size()));
  std::vector<std::string> names;
  for (Component c : p.components) names.emplace_back(component_names[static_cast<int>(c)]);
  r.set("position", std::vector<double>{p.position.x, p.position.y, p.position.z});
  r.set("components", names);
  r.add("time", "s", p.time, "sample times of the E components");
  r.add("sampled_at", "m", flatten(p.sampled_at), "Yee location actually sampled, [component, xyz]").shape = {n_comp, 3};
  r.summary.heading = fmt::format("  probe {}: {} samples", p.name, p.time.size());
  for (std::size_t c = 0; c < n_comp; ++c) {
    if (p.values[c].size() != p.time.size())
      throw std::invalid_argument(fmt::format("probe '{}' component {} has {} samples for {} times", p.name, names[c],
                                              p.values[c].size(), p.time.size()));
    const bool electric = is_electric(p.components[c]);
    // H lives half a step before E in the leapfrog, so its samples are taken at time - dt/2.
    r.add(names[c], electric ? "V/m" : "A/m", p.values[c]).attributes = {
        {"sample_time_offset", electric ? 0.0 : -0.5 * time_step}};
    double peak = 0;
    for (double v : p.values[c]) peak = std::max(peak, std::abs(v));
    r.summary.rows.push_back(SummaryRow({json_cell("component", names[c]), json_cell("peak", peak)}, false));
  }
  return r;
}

/// |E_inc(omega)|^2 of the run's plane wave at each of `omegas`, or empty when the run has no plane
/// wave, more than one (the enhancement would be ambiguous), or lacks one of the frequencies. In a
/// lossless homogeneous background a plane wave has the same |E| everywhere, so the value at the
/// TFSF box centre normalises every node of a map.
std::vector<double> incident_squared_at(const RunResults& r, const std::vector<double>& omegas) {
  if (r.incident_spectra.size() != 1 || r.incident_spectra[0].size() != r.source_omegas.size()) return {};
  std::vector<double> out;
  for (double w : omegas) {
    const auto it = std::find_if(r.source_omegas.begin(), r.source_omegas.end(),
                                 [&](double s) { return std::abs(s - w) <= 1e-9 * w; });
    if (it == r.source_omegas.end()) return {};
    const double e2 = std::norm(r.incident_spectra[0][static_cast<std::size_t>(it - r.source_omegas.begin())]);
    if (!(e2 > 0)) return {};
    out.push_back(e2);
  }
  return out;
}

Record record_of(const FieldMapResult& m, const RunResults& run) {
  Record r("field_map", m.name);
  const std::size_t nf = m.omegas.size(), nx = m.x.size(), ny = m.y.size(), nz = m.z.size();
  const std::size_t nodes = nx * ny * nz;
  require_rows(r, nf, {m.values.size()}, "frequencies");
  for (std::size_t f = 0; f < nf; ++f) require_rows(r, m.components.size(), {m.values[f].size()}, "components");
  std::vector<std::string> names, electric;
  for (Component c : m.components) names.emplace_back(component_names[static_cast<int>(c)]);
  r.set("components", names);
  r.add("x", "m", m.x);
  r.add("y", "m", m.y);
  r.add("z", "m", m.z);
  add_frequency_axes(r, m.omegas);
  std::vector<double> e_squared;
  for (std::size_t c = 0; c < m.components.size(); ++c) {
    ComplexSlabs slabs;
    for (std::size_t f = 0; f < nf; ++f) {
      require_rows(r, nodes, {m.values[f][c].size()}, "nodes");
      slabs.emplace_back(m.values[f][c]);
    }
    const bool is_e = is_electric(m.components[c]);
    Quantity& q = r.add(names[c], is_e ? "V s/m" : "A s/m", std::move(slabs),
                        "DFT sum_n f(t_n) exp(i omega t_n) dt, [frequency, z, y, x]");
    q.shape = {nf, nz, ny, nx};
    q.compressed = true;
    if (!is_e) continue;
    electric.push_back(names[c]);
    e_squared.resize(nf * nodes, 0.0);
    for (std::size_t f = 0; f < nf; ++f)
      for (std::size_t i = 0; i < nodes; ++i) e_squared[f * nodes + i] += std::norm(m.values[f][c][i]);
  }
  r.summary.heading = fmt::format("  field map {}: {} x {} x {} nodes, {} frequencies", m.name, nx, ny, nz, nf);
  for (std::size_t f = 0; f < nf; ++f) {
    double peak = 0;
    for (std::size_t i = 0; i < nodes && !electric.empty(); ++i) peak = std::max(peak, e_squared[f * nodes + i]);
    r.summary.rows.push_back(SummaryRow({json_cell("wavelength_nm", units::omega_to_wavelength(m.omegas[f]) / units::nm),
                                        json_cell("peak_E_squared", peak)},
                                        false));
  }
  if (electric.empty()) return r;
  // Near-field enhancement: only meaningful when all three E components went into the sum.
  const std::vector<double> incident = incident_squared_at(run, m.omegas);
  std::vector<double> enhancement;
  if (incident.size() == nf && electric.size() == 3) {
    enhancement = e_squared;
    for (std::size_t f = 0; f < nf; ++f)
      for (std::size_t i = 0; i < nodes; ++i) enhancement[f * nodes + i] /= incident[f];
  }
  Quantity& e2 = r.add("E_squared", "V^2 s^2/m^2", std::move(e_squared),
                       "sum of |E_c|^2 over the E components listed in components");
  e2.shape = {nf, nz, ny, nx};
  e2.compressed = true;
  e2.attributes = {{"components", electric}};
  if (enhancement.empty()) return r;
  Quantity& en = r.add("E_enhancement", "1", std::move(enhancement),
                       "|E|^2 / |E_inc|^2: E_squared over the plane wave's incident |E|^2 at each frequency");
  en.shape = {nf, nz, ny, nx};
  en.compressed = true;
  return r;
}

Record record_of(const FluxResult& x, const RunResults& run, const Scene& scene) {
  Record r("flux", x.name);
  require_rows(r, x.omegas.size(), {x.power.size()}, "frequencies");
  if (!x.fraction.empty()) require_rows(r, x.omegas.size(), {x.fraction.size()}, "frequencies");
  r.set("closed", std::int32_t{x.closed ? 1 : 0});
  r.set("normal_axis", std::int32_t{x.normal_axis});
  add_frequency_axes(r, x.omegas);
  r.add("power", "W s^2", x.power,
        "0.5 Re of the surface integral of E x conj(H) from DFT spectra; outward for a closed box, towards "
        "+normal_axis for a plane");
  if (!x.fraction.empty())
    r.add("fraction", "1", x.fraction,
          "power over the plane wave's incident power through the same area, positive along the incident direction");
  add_peak_headlines(r, "power", x.omegas, x.power, "W s^2");
  r.summary.heading = fmt::format("  flux {}:", x.name);
  for (std::size_t q = 0; q < x.omegas.size(); ++q) {
    SummaryRow row({wavelength_cell(x.omegas[q]), Cell("power", x.power[q])});
    // Normalised to the same dipole alone in the background: for a box around the dipole this is
    // the total decay-rate enhancement; for a box around everything, the radiative one.
    if (run.source_spectra.size() == 1)
      row.cells.push_back({"relative_to_dipole_alone", relative_to_dipole_alone(run, scene, x.omegas[q], x.power[q]),
                           "{:.4f}", 1, "  (", " x the dipole alone)"});
    if (!x.fraction.empty())
      row.cells.push_back({"fraction_of_incident", x.fraction[q], "{:.5f}", 1, "  (", " of the incident power)"});
    r.summary.rows.push_back(std::move(row));
  }
  return r;
}

std::vector<Record> records_of(const RunResults& run, const Scene& scene) {
  std::vector<Record> out;
  for (const auto& x : run.fluxes) out.push_back(record_of(x, run, scene));
  for (const auto& x : run.reflectance) out.push_back(record_of(x));
  for (const auto& x : run.orders) out.push_back(record_of(x));
  for (const auto& x : run.cross_sections) out.push_back(record_of(x));
  for (const auto& x : run.far_fields) out.push_back(record_of(x, run, scene));
  for (const auto& x : run.decay_rates) out.push_back(record_of(x));
  for (const auto& x : run.field_maps) out.push_back(record_of(x, run));
  for (const auto& x : run.probes) out.push_back(record_of(x, run.summary.time_step));
  for (const auto& x : run.sensors) out.push_back(record_of(x));
  out.insert(out.end(), run.records.begin(), run.records.end());
  return out;
}

}  // namespace yeegap::solver
