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
#include "io/results/record_writer.h"
#include "solver/outputs/result_records.h"

namespace yeegap::io {

namespace fs = std::filesystem;

namespace {

// Big arrays (the material map) are chunked and compressed; the shuffle filter groups the
// bytes of doubles by significance, which is what lets smooth fields compress at all.
h5::Storage compressed() { return {.chunk = {}, .deflate_level = 1, .shuffle = true}; }

void require(bool ok, const std::string& message) {
  if (!ok) throw std::invalid_argument(message);
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
  for (const auto& record : solver::records_of(r, scene)) write_record(outputs, record);
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
