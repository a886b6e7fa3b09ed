// The results file layout of docs/results_file.md, written group by group. Sizes inside RunResults are
// checked as each group is written; a mismatch is our bug, reported with the output's name, and
// (like any failure) leaves no .partial file and no damage to an older results file.
#include "io/results/results_writer.h"

#include <fmt/format.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <complex>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <stdexcept>

#include "base/constants.h"
#include "base/units.h"
#include "io/atomic_file.h"
#include "io/h5.h"
#include "io/results/sensor_writer.h"

namespace yeegap::io {

namespace fs = std::filesystem;
using solver::Component;

namespace {

// Big arrays (field maps, material map) are chunked and compressed; the shuffle filter groups the
// bytes of doubles by significance, which is what lets smooth fields compress at all.
h5::Storage compressed() { return {.chunk = {}, .deflate_level = 1, .shuffle = true}; }

void require(bool ok, const std::string& message) {
  if (!ok) throw std::invalid_argument(message);
}

bool is_electric(Component c) { return c == Component::Ex || c == Component::Ey || c == Component::Ez; }
const char* name_of(Component c) { return solver::component_names[static_cast<int>(c)]; }

std::vector<std::string> names_of(const std::vector<Component>& components) {
  std::vector<std::string> names;
  for (Component c : components) names.emplace_back(name_of(c));
  return names;
}

/// Every dataset carries a `units` attribute ("1" dimensionless, "none" for labels and indices).
h5::Dataset with_units(h5::Dataset d, const char* units) {
  d.set_attribute("units", units);
  return d;
}

/// Cells per axis of a grid given by its node coordinates.
hsize_t cells(const std::vector<double>& nodes) { return nodes.empty() ? 0 : nodes.size() - 1; }

/// A spectrum's frequency axis, also as vacuum wavelength and photon energy, for plotting either way.
void write_frequency_axes(const h5::Group& g, const std::vector<double>& omegas) {
  std::vector<double> wavelength_nm, energy_eV;
  for (double w : omegas) {
    wavelength_nm.push_back(units::omega_to_wavelength(w) / units::nm);
    energy_eV.push_back(units::omega_to_eV(w));
  }
  with_units(g.write("omega", omegas), "rad/s");
  with_units(g.write("wavelength_nm", wavelength_nm), "nm").set_attribute("description", "vacuum wavelength 2 pi c / omega");
  with_units(g.write("photon_energy_eV", energy_eV), "eV").set_attribute("description", "hbar omega");
}

std::vector<double> flatten(const std::vector<Vec3>& points) {
  std::vector<double> flat;
  for (const Vec3& p : points) flat.insert(flat.end(), {p.x, p.y, p.z});
  return flat;
}

void write_scene(const h5::File& file, const solver::Scene& scene) {
  const h5::Group g = file.create_group("scene");
  g.set_attribute("file", scene.file);
  g.set_attribute("title", scene.title);
  g.set_attribute("version", std::int32_t{scene.version});
  // A dataset, not an attribute: attributes are limited to 64 KiB and a scene file need not be.
  with_units(g.write_string("text", scene.text), "none")
      .set_attribute("description", "the scene file's text, byte for byte");
}

void write_program(const h5::File& file, const WriteInfo& info) {
  const h5::Group g = file.create_group("program");
  g.set_attribute("version", info.program_version);
  g.set_attribute("command_line", info.command_line);
  g.set_attribute("start_time", info.start_time);
  g.set_attribute("threads", std::int32_t{info.threads});
  unsigned major = 0, minor = 0, release = 0;
  H5get_libversion(&major, &minor, &release);
  g.set_attribute("hdf5_version", fmt::format("{}.{}.{}", major, minor, release));
}

void write_summary(const h5::File& file, const solver::RunSummary& s) {
  const h5::Group g = file.create_group("summary");
  g.set_attribute("steps", std::int64_t{s.steps});
  g.set_attribute("time_step", s.time_step);
  g.set_attribute("simulated_time", s.simulated_time);
  g.set_attribute("wall_seconds", s.wall_seconds);
  g.set_attribute("cell_updates_per_second", s.cell_updates_per_second);
  g.set_attribute("stop_reason", s.stop_reason);
  g.set_attribute("final_energy_fraction", s.final_energy_fraction);
  if (!s.divergence.empty()) g.set_attribute("divergence", s.divergence);
}

void write_grid(const h5::File& file, const solver::RunResults& r) {
  const h5::Group g = file.create_group("grid");
  g.set_attribute("description", "node coordinates (cell edges) per axis");
  with_units(g.write("x", r.grid_x), "m");
  with_units(g.write("y", r.grid_y), "m");
  with_units(g.write("z", r.grid_z), "m");
}

void write_materials(const h5::File& file, const solver::RunResults& r) {
  const h5::Shape shape{cells(r.grid_z), cells(r.grid_y), cells(r.grid_x)};
  require(r.material_map.size() == shape[0] * shape[1] * shape[2],
          fmt::format("the material map has {} entries for a grid of {} x {} x {} cells", r.material_map.size(),
                      shape[2], shape[1], shape[0]));
  for (std::uint8_t index : r.material_map)
    require(index < r.material_names.size(),
            fmt::format("the material map holds index {} but only {} materials are named", int(index),
                        r.material_names.size()));
  const h5::Group g = file.create_group("materials");
  with_units(g.write_strings("names", r.material_names), "none");
  with_units(g.write("map", r.material_map, shape, compressed()), "none")
      .set_attribute("description", "index into names of the material at each cell centre, x fastest");
}

void write_sources(const h5::File& file, const solver::RunResults& r, const solver::Scene& scene) {
  const h5::Group g = file.create_group("sources");
  const hsize_t n_freq = r.source_omegas.size();
  const hsize_t n_dipoles = scene.dipoles.size();
  require(r.source_spectra.empty() || r.source_spectra.size() == n_dipoles,
          fmt::format("there are {} source spectra for {} dipoles", r.source_spectra.size(), n_dipoles));
  write_frequency_axes(g, r.source_omegas);

  std::vector<std::complex<double>> spectra;
  for (std::size_t d = 0; d < r.source_spectra.size(); ++d) {
    require(r.source_spectra[d].size() == n_freq, fmt::format("source spectrum {} has {} values for {} frequencies",
                                                              d, r.source_spectra[d].size(), n_freq));
    spectra.insert(spectra.end(), r.source_spectra[d].begin(), r.source_spectra[d].end());
  }
  const h5::ComplexDataset s = g.write_complex("spectrum", spectra, {r.source_spectra.size(), n_freq});
  for (const h5::Dataset* part : {&s.re, &s.im}) {
    part->set_attribute("units", "A m s");
    part->set_attribute("description", "DFT of each dipole's current moment I l(t), [dipole, frequency]");
  }

  std::vector<Vec3> positions, directions;
  std::vector<double> moments;
  for (const auto& d : scene.dipoles) {
    positions.push_back(d.position);
    directions.push_back(d.direction);
    moments.push_back(d.moment);
  }
  with_units(g.write("position", flatten(positions), {n_dipoles, 3}), "m");
  with_units(g.write("direction", flatten(directions), {n_dipoles, 3}), "1");
  with_units(g.write("moment", moments), "C m").set_attribute("description", "peak dipole moment");

  // Plane waves (TFSF boxes): the incident E at each box's centre, for normalising to intensity.
  std::vector<std::complex<double>> incident;
  for (const auto& spectrum : r.incident_spectra) {
    require(spectrum.size() == n_freq, fmt::format("an incident spectrum has {} values for {} frequencies",
                                                   spectrum.size(), n_freq));
    incident.insert(incident.end(), spectrum.begin(), spectrum.end());
  }
  const h5::ComplexDataset inc = g.write_complex("incident", incident, {r.incident_spectra.size(), n_freq});
  for (const h5::Dataset* part : {&inc.re, &inc.im}) {
    part->set_attribute("units", "V s/m");
    part->set_attribute("description", "DFT of each plane wave's incident E at its box centre, [plane wave, frequency]");
  }
}

void check_output_name(const h5::Group& outputs, const std::string& name) {
  require(!name.empty() && name.find('/') == std::string::npos && name != "." && name != "..",
          fmt::format("output name '{}' cannot be a group name (empty, '.', '..' or containing '/')", name));
  require(!outputs.contains(name), fmt::format("two outputs are named '{}'", name));
}

void write_probe(const h5::Group& outputs, const solver::ProbeResult& p, double time_step) {
  check_output_name(outputs, p.name);
  const std::size_t n_comp = p.components.size();
  require(p.values.size() == n_comp && p.sampled_at.size() == n_comp,
          fmt::format("probe '{}' has {} components, {} value series and {} sample positions", p.name, n_comp,
                      p.values.size(), p.sampled_at.size()));
  const h5::Group g = outputs.create_group(p.name);
  g.set_attribute("kind", "probe");
  g.set_attribute("position", std::vector<double>{p.position.x, p.position.y, p.position.z});
  g.set_attribute("components", names_of(p.components));
  with_units(g.write("time", p.time), "s").set_attribute("description", "sample times of the E components");
  with_units(g.write("sampled_at", flatten(p.sampled_at), {n_comp, 3}), "m")
      .set_attribute("description", "Yee location actually sampled, [component, xyz]");
  for (std::size_t c = 0; c < n_comp; ++c) {
    const Component comp = p.components[c];
    require(p.values[c].size() == p.time.size(), fmt::format("probe '{}' component {} has {} samples for {} times",
                                                             p.name, name_of(comp), p.values[c].size(), p.time.size()));
    const h5::Dataset d = with_units(g.write(name_of(comp), p.values[c]), is_electric(comp) ? "V/m" : "A/m");
    // H lives half a step before E in the leapfrog, so its samples are taken at time - dt/2.
    d.set_attribute("sample_time_offset", is_electric(comp) ? 0.0 : -0.5 * time_step);
  }
}

/// |E_inc(omega)|^2 of the run's plane wave at each of `omegas`, or empty when the run has no plane
/// wave, more than one (the enhancement would be ambiguous), or lacks one of the frequencies. In a
/// lossless homogeneous background a plane wave has the same |E| everywhere, so the value at the
/// TFSF box centre normalises every node of a map.
std::vector<double> incident_squared_at(const solver::RunResults& r, const std::vector<double>& omegas) {
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

void write_field_map(const h5::Group& outputs, const solver::FieldMapResult& m,
                     const std::vector<double>& incident_squared) {
  check_output_name(outputs, m.name);
  const hsize_t nf = m.omegas.size(), nx = m.x.size(), ny = m.y.size(), nz = m.z.size();
  const std::size_t nodes = nx * ny * nz;
  require(m.values.size() == nf, fmt::format("field map '{}' has values for {} frequencies, {} listed", m.name,
                                             m.values.size(), nf));
  for (std::size_t f = 0; f < nf; ++f) {
    require(m.values[f].size() == m.components.size(),
            fmt::format("field map '{}' frequency {} has {} components, {} listed", m.name, f, m.values[f].size(),
                        m.components.size()));
    for (std::size_t c = 0; c < m.components.size(); ++c)
      require(m.values[f][c].size() == nodes,
              fmt::format("field map '{}' {} at frequency {} has {} values for {} x {} x {} nodes", m.name,
                          name_of(m.components[c]), f, m.values[f][c].size(), nx, ny, nz));
  }
  const h5::Group g = outputs.create_group(m.name);
  g.set_attribute("kind", "field_map");
  g.set_attribute("components", names_of(m.components));
  with_units(g.write("x", m.x), "m");
  with_units(g.write("y", m.y), "m");
  with_units(g.write("z", m.z), "m");
  write_frequency_axes(g, m.omegas);

  const h5::Shape shape{nf, nz, ny, nx};
  // Written one frequency at a time, so memory beyond the results themselves stays at one slab.
  std::vector<std::string> electric;
  std::vector<std::vector<double>> e_squared(nf, std::vector<double>(nodes, 0.0));
  for (std::size_t c = 0; c < m.components.size(); ++c) {
    const Component comp = m.components[c];
    const h5::ComplexDataset d = g.create_complex(name_of(comp), shape, compressed());
    for (const h5::Dataset* part : {&d.re, &d.im}) {
      part->set_attribute("units", is_electric(comp) ? "V s/m" : "A s/m");
      part->set_attribute("description", "DFT sum_n f(t_n) exp(i omega t_n) dt, [frequency, z, y, x]");
    }
    for (std::size_t f = 0; f < nf; ++f) {
      d.write_slab(f, m.values[f][c]);
      if (is_electric(comp))
        for (std::size_t i = 0; i < nodes; ++i) e_squared[f][i] += std::norm(m.values[f][c][i]);
    }
    if (is_electric(comp)) electric.emplace_back(name_of(comp));
  }
  if (electric.empty()) return;
  const h5::Dataset e2 = with_units(g.create_dataset<double>("E_squared", shape, compressed()), "V^2 s^2/m^2");
  e2.set_attribute("description", "sum of |E_c|^2 over the E components listed in components");
  e2.set_attribute("components", electric);
  for (std::size_t f = 0; f < nf; ++f) e2.write_slab(f, std::span<const double>(e_squared[f]));
  // Near-field enhancement: only meaningful when all three E components went into the sum.
  if (incident_squared.size() != nf || electric.size() != 3) return;
  const h5::Dataset en = with_units(g.create_dataset<double>("E_enhancement", shape, compressed()), "1");
  en.set_attribute("description", "|E|^2 / |E_inc|^2: E_squared over the plane wave's incident |E|^2 at each frequency");
  for (std::size_t f = 0; f < nf; ++f) {
    for (double& v : e_squared[f]) v /= incident_squared[f];
    en.write_slab(f, std::span<const double>(e_squared[f]));
  }
}

void write_flux(const h5::Group& outputs, const solver::FluxResult& x) {
  check_output_name(outputs, x.name);
  require(x.power.size() == x.omegas.size(),
          fmt::format("flux '{}' has {} powers for {} frequencies", x.name, x.power.size(), x.omegas.size()));
  const h5::Group g = outputs.create_group(x.name);
  g.set_attribute("kind", "flux");
  g.set_attribute("closed", std::int32_t{x.closed ? 1 : 0});
  g.set_attribute("normal_axis", std::int32_t{x.normal_axis});
  write_frequency_axes(g, x.omegas);
  with_units(g.write("power", x.power), "W s^2")
      .set_attribute("description",
                     "0.5 Re of the surface integral of E x conj(H) from DFT spectra; outward for a closed box, "
                     "towards +normal_axis for a plane");
  if (!x.fraction.empty()) {
    require(x.fraction.size() == x.omegas.size(), fmt::format("flux '{}' has {} fractions for {} frequencies", x.name,
                                                              x.fraction.size(), x.omegas.size()));
    with_units(g.write("fraction", x.fraction), "1")
        .set_attribute("description", "power over the plane wave's incident power through the same area, positive "
                                      "along the incident direction");
  }
}

void write_reflectance(const h5::Group& outputs, const solver::ReflectanceResult& x) {
  check_output_name(outputs, x.name);
  const std::size_t n = x.omegas.size();
  require(x.angles.size() == n && x.k_parallel.size() == n && x.reflectance.size() == n && x.transmittance.size() == n &&
              x.absorptance.size() == n,
          fmt::format("reflectance '{}' has arrays that do not match its {} rows", x.name, n));
  const h5::Group g = outputs.create_group(x.name);
  g.set_attribute("kind", "reflectance");
  g.set_attribute("angle_scan", std::int32_t{x.angle_scan ? 1 : 0});
  g.set_attribute("polarization", x.p_polarized ? "p" : "s");
  g.set_attribute("incident_index", x.incident_index);
  write_frequency_axes(g, x.omegas);
  with_units(g.write("angle", x.angles), "rad")
      .set_attribute("description", "angle of incidence of each row, from the axis, in the incident medium");
  std::vector<double> deg;
  for (double a : x.angles) deg.push_back(a * 180 / constants::pi);
  with_units(g.write("angle_deg", deg), "deg").set_attribute("description", "the same in degrees");
  with_units(g.write("k_parallel", x.k_parallel), "rad/m")
      .set_attribute("description", "in-plane wavevector of each row's run (fixed within one run)");
  with_units(g.write("reflectance", x.reflectance), "1")
      .set_attribute("description", "reflected power over incident power");
  with_units(g.write("transmittance", x.transmittance), "1")
      .set_attribute("description", "power through the far side over incident power");
  with_units(g.write("absorptance", x.absorptance), "1").set_attribute("description", "1 - reflectance - transmittance");
}

void write_orders(const h5::Group& outputs, const solver::DiffractionOrdersResult& x) {
  check_output_name(outputs, x.name);
  const std::size_t rows = x.omegas.size(), n = x.row.size();
  require(x.incidence_angles.size() == rows && x.reflected_sum.size() == rows && x.transmitted_sum.size() == rows &&
              x.side.size() == n && x.order_b.size() == n && x.order_c.size() == n && x.direction.size() == n &&
              x.angle.size() == n && x.efficiency.size() == n,
          fmt::format("orders '{}' have arrays that do not match its {} rows and {} orders", x.name, rows, n));
  const h5::Group g = outputs.create_group(x.name);
  g.set_attribute("kind", "orders");
  g.set_attribute("angle_scan", std::int32_t{x.angle_scan ? 1 : 0});
  const int b = (x.axis + 1) % 3, c = (x.axis + 2) % 3;
  const char* axes = "xyz";
  g.set_attribute("axis", std::string(1, axes[x.axis]));
  g.set_attribute("lateral_axes", std::vector<std::string>{std::string(1, axes[b]), std::string(1, axes[c])});
  g.set_attribute("period", std::vector<double>{x.diffracting[0] ? x.period[0] : 0.0, x.diffracting[1] ? x.period[1] : 0.0});
  g.set_attribute("incident_index", x.incident_index);
  g.set_attribute("transmitted_index", x.transmitted_index);
  write_frequency_axes(g, x.omegas);
  with_units(g.write("incidence_angle", x.incidence_angles), "rad")
      .set_attribute("description", "angle of incidence of each row, as in the reflectance table");
  with_units(g.write("reflected_sum", x.reflected_sum), "1")
      .set_attribute("description", "sum of the reflected orders' efficiencies of each row");
  with_units(g.write("transmitted_sum", x.transmitted_sum), "1")
      .set_attribute("description", "sum of the transmitted orders' efficiencies of each row");
  std::vector<std::int32_t> row(x.row.begin(), x.row.end()), side(x.side.begin(), x.side.end());
  std::vector<std::int32_t> order(2 * n);
  std::vector<double> direction(3 * n), deg(n);
  for (std::size_t i = 0; i < n; ++i) {
    order[2 * i] = x.order_b[i], order[2 * i + 1] = x.order_c[i];
    for (int a = 0; a < 3; ++a) direction[3 * i + a] = x.direction[i][a];
    deg[i] = x.angle[i] * 180 / constants::pi;
  }
  with_units(g.write("row", row), "1").set_attribute("description", "the row (frequency or scan angle) of each order");
  with_units(g.write("side", side), "1").set_attribute("description", "-1 reflected, +1 transmitted");
  with_units(g.write("order", order, {n, 2}), "1").set_attribute("description", "order number along the lateral axes");
  with_units(g.write("direction", direction, {n, 3}), "1")
      .set_attribute("description", "unit vector of travel (x, y, z), away from the structure");
  with_units(g.write("angle", x.angle), "rad").set_attribute("description", "polar angle of travel from the axis");
  with_units(g.write("angle_deg", deg), "deg").set_attribute("description", "the same in degrees");
  with_units(g.write("efficiency", x.efficiency), "1").set_attribute("description", "order power over incident power");
}

void write_cross_sections(const h5::Group& outputs, const solver::CrossSectionResult& x) {
  check_output_name(outputs, x.name);
  const std::size_t n = x.omegas.size();
  require(x.scattering.size() == n && x.absorption.size() == n && x.extinction.size() == n &&
              x.incident_intensity.size() == n,
          fmt::format("cross sections '{}' have arrays that do not match its {} frequencies", x.name, n));
  const h5::Group g = outputs.create_group(x.name);
  g.set_attribute("kind", "cross_sections");
  g.set_attribute("per_unit_length", std::int32_t{x.per_unit_length ? 1 : 0});
  write_frequency_axes(g, x.omegas);
  const char* unit = x.per_unit_length ? "m" : "m^2";
  with_units(g.write("scattering", x.scattering), unit)
      .set_attribute("description", "outward flux of the scattered field around the plane-wave box over I0");
  with_units(g.write("absorption", x.absorption), unit)
      .set_attribute("description", "net inward flux of the total field inside the plane-wave box over I0");
  with_units(g.write("extinction", x.extinction), unit).set_attribute("description", "scattering + absorption");
  with_units(g.write("incident_intensity", x.incident_intensity), "W s^2/m^2")
      .set_attribute("description", "|E_inc(omega)|^2 / (2 eta) from DFT spectra");
}

void write_far_field(const h5::Group& outputs, const solver::FarFieldResult& x) {
  check_output_name(outputs, x.name);
  const std::size_t nf = x.omegas.size(), nd = x.theta.size();
  require(x.phi.size() == nd && x.power.size() == nf && x.surface_power.size() == nf && x.e_theta.size() == nf &&
              x.e_phi.size() == nf && x.intensity.size() == nf && x.directivity.size() == nf &&
              (x.collected.empty() || x.collected.size() == nf),
          fmt::format("far field '{}' has arrays that do not match its {} frequencies and {} directions", x.name, nf, nd));
  require(x.theta_count == 0 || static_cast<std::size_t>(x.theta_count) * x.phi_count == nd,
          fmt::format("far field '{}' has {} directions for a {} x {} grid", x.name, nd, x.theta_count, x.phi_count));
  std::vector<std::complex<double>> et, ep;
  std::vector<double> in, di;
  for (std::size_t q = 0; q < nf; ++q) {
    require(x.e_theta[q].size() == nd && x.e_phi[q].size() == nd && x.intensity[q].size() == nd &&
                x.directivity[q].size() == nd,
            fmt::format("far field '{}' frequency {} does not have {} directions", x.name, q, nd));
    et.insert(et.end(), x.e_theta[q].begin(), x.e_theta[q].end());
    ep.insert(ep.end(), x.e_phi[q].begin(), x.e_phi[q].end());
    in.insert(in.end(), x.intensity[q].begin(), x.intensity[q].end());
    di.insert(di.end(), x.directivity[q].begin(), x.directivity[q].end());
  }
  const h5::Group g = outputs.create_group(x.name);
  g.set_attribute("kind", "far_field");
  g.set_attribute("theta_count", std::int32_t{x.theta_count});
  g.set_attribute("phi_count", std::int32_t{x.phi_count});
  g.set_attribute("index", x.index);
  g.set_attribute("box_from", std::vector<double>{x.box.lo.x, x.box.lo.y, x.box.lo.z});
  g.set_attribute("box_to", std::vector<double>{x.box.hi.x, x.box.hi.y, x.box.hi.z});
  g.set_attribute("numerical_aperture", x.numerical_aperture);
  g.set_attribute("collection_axis", std::vector<double>{x.collection_axis.x, x.collection_axis.y, x.collection_axis.z});
  write_frequency_axes(g, x.omegas);
  with_units(g.write("theta", x.theta), "rad").set_attribute("description", "polar angle from +z of each direction");
  with_units(g.write("phi", x.phi), "rad").set_attribute("description", "azimuth from +x of each direction");
  const h5::Shape shape{nf, nd};
  for (const auto& [name, values] : {std::pair{"E_theta", &et}, std::pair{"E_phi", &ep}}) {
    const h5::ComplexDataset d = g.write_complex(name, *values, shape);
    for (const h5::Dataset* part : {&d.re, &d.im}) {
      part->set_attribute("units", "V s");
      part->set_attribute("description", "r exp(-i k r) E at large r from DFT spectra, [frequency, direction]");
    }
  }
  with_units(g.write("intensity", in, shape), "W s^2/sr")
      .set_attribute("description", "radiated power per solid angle dP/dOmega, [frequency, direction]");
  with_units(g.write("directivity", di, shape), "1")
      .set_attribute("description", "4 pi (dP/dOmega) / power, [frequency, direction]");
  with_units(g.write("power", x.power), "W s^2")
      .set_attribute("description", "radiated power: dP/dOmega integrated over the whole sphere");
  with_units(g.write("surface_power", x.surface_power), "W s^2")
      .set_attribute("description", "outward Poynting flux through the box the transform used (a check on power)");
  if (!x.collected.empty())
    with_units(g.write("collected", x.collected), "W s^2")
        .set_attribute("description", "power into the cone of numerical_aperture about collection_axis");
}

void write_decay_rate(const h5::Group& outputs, const solver::DecayRateResult& x) {
  check_output_name(outputs, x.name);
  const std::size_t n = x.omegas.size();
  require(x.total.size() == n && x.box_power.size() == n && x.alone_power.size() == n &&
              x.radiative.size() == x.efficiency.size() && (x.radiative.empty() || x.radiative.size() == n),
          fmt::format("decay rate '{}' has arrays that do not match its {} frequencies", x.name, n));
  const h5::Group g = outputs.create_group(x.name);
  g.set_attribute("kind", "decay_rate");
  g.set_attribute("dipole", std::int32_t{x.dipole});
  g.set_attribute("index", x.index);
  g.set_attribute("radiated", x.radiated);
  write_frequency_axes(g, x.omegas);
  with_units(g.write("total", x.total), "1")
      .set_attribute("description", "total decay-rate enhancement: power out of the box around the dipole / alone_power");
  if (!x.radiative.empty()) {
    with_units(g.write("radiative", x.radiative), "1")
        .set_attribute("description", "radiated power (from the output named by 'radiated') / alone_power");
    with_units(g.write("efficiency", x.efficiency), "1")
        .set_attribute("description", "quantum efficiency of an ideal emitter: radiative / total");
  }
  with_units(g.write("box_power", x.box_power), "W s^2")
      .set_attribute("description", "outward flux through the small box around the dipole");
  with_units(g.write("alone_power", x.alone_power), "W s^2")
      .set_attribute("description", "n eta0 k0^2 |I l(omega)|^2 / (12 pi): the dipole alone in the medium around it");
}

// The tunnelling gaps found on the grid: one row per body pair.
void write_tunnelling_gaps(const h5::File& file, const std::vector<solver::TunnellingGap>& gaps) {
  const h5::Group g = file.create_group("tunnelling");
  std::vector<std::int32_t> pairs, quantum;
  std::vector<std::int64_t> cells;
  std::vector<double> smallest, cutoff;
  for (const auto& x : gaps) {
    pairs.push_back(x.pair[0]);
    pairs.push_back(x.pair[1]);
    cells.push_back(x.cells);
    smallest.push_back(x.smallest_width);
    cutoff.push_back(x.cutoff);
    quantum.push_back(x.quantum ? 1 : 0);
  }
  with_units(g.write("pairs", pairs, {gaps.size(), 2}), "none").set_attribute("description", "body indices, scene order");
  with_units(g.write("cells", cells), "1").set_attribute("description", "E locations in the gap below the cut-off");
  with_units(g.write("smallest_width", smallest), "m").set_attribute("description", "smallest d_A + d_B among them");
  with_units(g.write("cutoff", cutoff), "m").set_attribute("description", "widths below this are gap medium");
  with_units(g.write("quantum_corrected", quantum), "1")
      .set_attribute("description", "1: gap cells hold the tunnelling medium; 0: classical, background kept");
}

void write_layout(const h5::File& file, const solver::RunResults& r, const solver::Scene& scene,
                  const WriteInfo& info) {
  file.set_attribute("format", results_format);
  file.set_attribute("format_version", std::int32_t{results_format_version});
  write_scene(file, scene);
  write_program(file, info);
  write_summary(file, r.summary);
  write_grid(file, r);
  write_materials(file, r);
  write_sources(file, r, scene);
  if (!r.tunnelling_gaps.empty()) write_tunnelling_gaps(file, r.tunnelling_gaps);
  const h5::Group outputs = file.create_group("outputs");
  for (const auto& p : r.probes) write_probe(outputs, p, r.summary.time_step);
  for (const auto& m : r.field_maps) write_field_map(outputs, m, incident_squared_at(r, m.omegas));
  for (const auto& x : r.fluxes) write_flux(outputs, x);
  for (const auto& x : r.cross_sections) write_cross_sections(outputs, x);
  for (const auto& x : r.far_fields) write_far_field(outputs, x);
  for (const auto& x : r.decay_rates) write_decay_rate(outputs, x);
  for (const auto& x : r.sensors) write_sensor(outputs, x);
  for (const auto& x : r.reflectance) write_reflectance(outputs, x);
  for (const auto& x : r.orders) write_orders(outputs, x);
}

}  // namespace

void check_writable(const std::string& path) {
  const auto refuse = [&](const std::string& why) {
    throw std::runtime_error(fmt::format("cannot write results file '{}': {}", path, why));
  };
  if (path.empty()) refuse("the path is empty");
  const fs::path target(path);
  const fs::path dir = target.has_parent_path() ? target.parent_path() : fs::path(".");
  std::error_code ec;
  const fs::file_status dir_status = fs::status(dir, ec);
  if (!fs::exists(dir_status)) refuse(fmt::format("directory '{}' does not exist", dir.string()));
  if (!fs::is_directory(dir_status)) refuse(fmt::format("'{}' is not a directory", dir.string()));
  if (fs::is_directory(fs::status(target, ec))) refuse("a directory of that name exists");

  // Try for real: permission bits do not show root's rights, read-only mounts or full quotas.
  const std::string probe = fmt::format("{}.write-check-{}", path, ::getpid());
  std::FILE* f = std::fopen(probe.c_str(), "wb");
  if (f == nullptr) refuse(fmt::format("directory '{}' is not writable: {}", dir.string(), std::strerror(errno)));
  std::fclose(f);
  fs::remove(probe, ec);
}

void write_results(const std::string& path, const solver::RunResults& results, const solver::Scene& scene,
                   const WriteInfo& info) {
  const std::string partial = partial_path(path);
  bool partial_is_ours = false;  // never remove something of that name that we did not create
  try {
    {
      h5::File file = h5::File::create(partial);
      partial_is_ours = true;
      write_layout(file, results, scene, info);
      file.close();  // every group and dataset above is closed by now, as File::close requires
    }
    commit_file(partial, path);
    partial_is_ours = false;
  } catch (const std::exception& e) {
    if (partial_is_ours) {
      std::error_code ec;
      fs::remove(partial, ec);
    }
    throw std::runtime_error(fmt::format("cannot write results file '{}': {}", path, e.what()));
  }
}

}  // namespace yeegap::io
