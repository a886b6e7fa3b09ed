// The summaries of output_summaries.h: one function per kind of output, then the catalog.
// Wavelengths on the terminal in nm; JSON values in SI unless the key names a unit.
#include "output_summaries.h"

#include <algorithm>
#include <cmath>
#include <cstdio>

#include <fmt/format.h>

#include "base/constants.h"
#include "sensor_report.h"
#include "solver/engine/grid.h"

namespace yeegap::cli {

void SummarySink::line(const std::string& text) { std::fprintf(stderr, "%s\n", text.c_str()); }

std::string SummarySink::shown(double v, const char* spec) {
  if (std::isfinite(v)) return fmt::format(fmt::runtime(spec), v);
  undefined_shown_ = true;
  return "undefined";
}

namespace {

double wavelength_nm(double omega) { return 2 * constants::pi * constants::c0 / omega * 1e9; }

// Power a dipole of current moment |I l| radiates in a lossless background of index n:
// P0 = n eta0 k0^2 |I l|^2 / (12 pi) (Jackson 1999, eq. 9.24, with eta = eta0/n and k = n k0).
double dipole_power_in_background(double omega, double il, double n) {
  const double k0 = omega / constants::c0;
  return n * constants::eta0 * k0 * k0 * il * il / (12 * constants::pi);
}

double background_index(const solver::Scene& scene) {
  return std::sqrt(scene.materials[scene.domain.background].poles.eps_inf);
}

// A power relative to the run's one dipole alone in the background (at the same frequency).
double relative_to_dipole(const solver::RunResults& r, double omega, double power, double n_bg) {
  const auto it = std::find(r.source_omegas.begin(), r.source_omegas.end(), omega);
  const double il = std::abs(r.source_spectra[0][it - r.source_omegas.begin()]);
  return power / dipole_power_in_background(omega, il, n_bg);
}

void fluxes(const solver::RunResults& r, const solver::Scene& scene, SummarySink& out) {
  for (const auto& f : r.fluxes) {
    std::vector<std::string> rows;
    out.line(fmt::format("  flux {}:", f.name));
    for (std::size_t q = 0; q < f.omegas.size(); ++q) {
      JsonObject row;
      const double lambda = wavelength_nm(f.omegas[q]);
      row.number("wavelength_nm", lambda).number("power", f.power[q]);
      std::string rel;
      if (r.source_spectra.size() == 1) {
        // Normalised to the same dipole alone in the background: for a box around the dipole this
        // is the total decay-rate enhancement; for a box around everything, the radiative one.
        const double rel_power = relative_to_dipole(r, f.omegas[q], f.power[q], background_index(scene));
        row.number("relative_to_dipole_alone", rel_power);
        rel = fmt::format("  ({} x the dipole alone)", out.shown(rel_power, "{:.4f}"));
      }
      if (!f.fraction.empty()) {
        row.number("fraction_of_incident", f.fraction[q]);
        rel += fmt::format("  ({} of the incident power)", out.shown(f.fraction[q], "{:.5f}"));
      }
      out.line(fmt::format("    {:8.2f} nm  {}{}", lambda, out.shown(f.power[q]), rel));
      rows.push_back(row.str());
    }
    out.json(f.name, json_array(rows));
  }
}

void reflectance(const solver::RunResults& r, const solver::Scene&, SummarySink& out) {
  for (const auto& t : r.reflectance) {
    std::vector<std::string> rows;
    out.line(fmt::format("  {} ({}, incident index {:.4g}){}: wavelength, angle, R, T, A", t.name,
                         t.p_polarized ? "p" : "s", t.incident_index,
                         t.angle_scan ? ", angle scan" : ", each frequency at its own angle"));
    for (std::size_t q = 0; q < t.omegas.size(); ++q) {
      const double lambda = wavelength_nm(t.omegas[q]);
      const double angle_deg = t.angles[q] * 180 / constants::pi;
      JsonObject row;
      row.number("wavelength_nm", lambda).number("angle_deg", angle_deg).number("R", t.reflectance[q])
          .number("T", t.transmittance[q]).number("A", t.absorptance[q]);
      rows.push_back(row.str());
      out.line(fmt::format("    {:8.2f} nm  {:7.3f} deg  {}  {}  {}", lambda, angle_deg,
                           out.shown(t.reflectance[q], "{:.5f}"), out.shown(t.transmittance[q], "{:.5f}"),
                           out.shown(t.absorptance[q], "{:.5f}")));
    }
    out.json(t.name, json_array(rows));
  }
}

void orders(const solver::RunResults& r, const solver::Scene&, SummarySink& out) {
  for (const auto& o : r.orders) {
    std::vector<std::string> rows;
    out.line(fmt::format("  {}: wavelength, reflected (r) and transmitted (t) orders m: efficiency at angle", o.name));
    for (std::size_t q = 0; q < o.omegas.size(); ++q) {
      const double lambda = wavelength_nm(o.omegas[q]);
      std::string line;
      for (std::size_t e = 0; e < o.row.size(); ++e) {
        if (o.row[e] != static_cast<int>(q)) continue;
        const double angle_deg = o.angle[e] * 180 / constants::pi;
        const std::string order = o.diffracting[1] ? fmt::format("{},{}", o.order_b[e], o.order_c[e])
                                                   : fmt::format("{:+d}", o.order_b[e]);
        line += fmt::format("  {}{}: {} at {:.1f} deg", o.side[e] < 0 ? "r" : "t", order,
                            out.shown(o.efficiency[e], "{:.4f}"), angle_deg);
        JsonObject row;
        row.number("wavelength_nm", lambda).number("side", o.side[e]).number("order_0", o.order_b[e])
            .number("order_1", o.order_c[e]).number("angle_deg", angle_deg).number("efficiency", o.efficiency[e]);
        rows.push_back(row.str());
      }
      out.line(fmt::format("    {:8.2f} nm{}", lambda, line));
    }
    out.json(o.name, json_array(rows));
  }
}

void tunnelling_gaps(const solver::RunResults& r, const solver::Scene& scene, SummarySink& out) {
  const auto body_name = [&](int i) {
    return scene.bodies[i].name.empty() ? fmt::format("body {}", i) : scene.bodies[i].name;
  };
  for (const auto& g : r.tunnelling_gaps)
    out.line(fmt::format("  gap {} - {}: {} cells below {:.3g} nm, narrowest {:.3g} nm ({})", body_name(g.pair[0]),
                         body_name(g.pair[1]), g.cells, g.cutoff * 1e9, g.smallest_width * 1e9,
                         g.quantum ? "quantum-corrected" : "classical"));
}

void cross_sections(const solver::RunResults& r, const solver::Scene&, SummarySink& out) {
  for (const auto& c : r.cross_sections) {
    std::vector<std::string> rows;
    const char* unit = c.per_unit_length ? "nm" : "nm^2";
    const double scale = c.per_unit_length ? 1e9 : 1e18;
    out.line(fmt::format("  cross sections {} ({}): wavelength, extinction, scattering, absorption", c.name, unit));
    for (std::size_t q = 0; q < c.omegas.size(); ++q) {
      const double lambda = wavelength_nm(c.omegas[q]);
      JsonObject row;
      row.number("wavelength_nm", lambda).number("extinction", c.extinction[q]).number("scattering", c.scattering[q])
          .number("absorption", c.absorption[q]);
      rows.push_back(row.str());
      out.line(fmt::format("    {:8.2f} nm  {}  {}  {}", lambda, out.shown(c.extinction[q] * scale),
                           out.shown(c.scattering[q] * scale), out.shown(c.absorption[q] * scale)));
    }
    out.json(c.name, json_array(rows));
  }
}

void far_fields(const solver::RunResults& r, const solver::Scene& scene, SummarySink& out) {
  for (const auto& f : r.far_fields) {
    std::vector<std::string> rows;
    out.line(fmt::format("  far field {}: wavelength, radiated power{}, peak directivity{}", f.name,
                         r.source_spectra.size() == 1 ? " (x the dipole alone)" : "",
                         f.collected.empty() ? "" : ", fraction collected"));
    for (std::size_t q = 0; q < f.omegas.size(); ++q) {
      const double lambda = wavelength_nm(f.omegas[q]);
      const double peak = f.directivity[q].empty() ? 0.0 : std::max(0.0, *std::max_element(f.directivity[q].begin(),
                                                                                           f.directivity[q].end()));
      JsonObject row;
      row.number("wavelength_nm", lambda).number("power", f.power[q]).number("peak_directivity", peak);
      double value = f.power[q];
      if (r.source_spectra.size() == 1) {
        value = relative_to_dipole(r, f.omegas[q], f.power[q], background_index(scene));
        row.number("relative_to_dipole_alone", value);
      }
      std::string collected;
      if (!f.collected.empty()) {
        row.number("collected_fraction", f.collected[q] / f.power[q]);
        collected = "  " + out.shown(f.collected[q] / f.power[q], "{:.4f}");
      }
      out.line(fmt::format("    {:8.2f} nm  {}  {}{}", lambda, out.shown(value), out.shown(peak, "{:.3f}"), collected));
      rows.push_back(row.str());
    }
    out.json(f.name, json_array(rows));
  }
}

void decay_rates(const solver::RunResults& r, const solver::Scene&, SummarySink& out) {
  for (const auto& d : r.decay_rates) {
    std::vector<std::string> rows;
    out.line(fmt::format("  decay rate {} (dipole {}): wavelength, total enhancement{}", d.name, d.dipole,
                         d.radiative.empty() ? "" : ", radiative, quantum efficiency"));
    for (std::size_t q = 0; q < d.omegas.size(); ++q) {
      const double lambda = wavelength_nm(d.omegas[q]);
      JsonObject row;
      row.number("wavelength_nm", lambda).number("total", d.total[q]);
      std::string more;
      if (!d.radiative.empty()) {
        row.number("radiative", d.radiative[q]).number("efficiency", d.efficiency[q]);
        more = "  " + out.shown(d.radiative[q]) + "  " + out.shown(d.efficiency[q], "{:.4f}");
      }
      out.line(fmt::format("    {:8.2f} nm  {}{}", lambda, out.shown(d.total[q]), more));
      rows.push_back(row.str());
    }
    out.json(d.name, json_array(rows));
  }
}

// The largest |E|^2 on the map at frequency q.
double peak_e_squared(const solver::FieldMapResult& m, std::size_t q) {
  double peak = 0;
  const std::size_t points = m.components.empty() ? 0 : m.values[q][0].size();
  for (std::size_t p = 0; p < points; ++p) {
    double e2 = 0;
    for (std::size_t c = 0; c < m.components.size(); ++c)
      if (solver::is_electric(m.components[c])) e2 += std::norm(m.values[q][c][p]);
    peak = std::max(peak, e2);
  }
  return peak;
}

void field_maps(const solver::RunResults& r, const solver::Scene&, SummarySink& out) {
  for (const auto& m : r.field_maps) {
    std::vector<std::string> rows;
    for (std::size_t q = 0; q < m.omegas.size(); ++q) {
      JsonObject row;
      row.number("wavelength_nm", wavelength_nm(m.omegas[q])).number("peak_E_squared", peak_e_squared(m, q));
      rows.push_back(row.str());
    }
    out.line(fmt::format("  field map {}: {} x {} x {} nodes, {} frequencies", m.name, m.x.size(), m.y.size(), m.z.size(),
                         m.omegas.size()));
    out.json(m.name, json_array(rows));
  }
}

void probes(const solver::RunResults& r, const solver::Scene&, SummarySink& out) {
  for (const auto& p : r.probes) {
    std::vector<std::string> rows;
    for (std::size_t c = 0; c < p.components.size(); ++c) {
      double peak = 0;
      for (double v : p.values[c]) peak = std::max(peak, std::abs(v));
      JsonObject row;
      row.text("component", solver::component_names[static_cast<int>(p.components[c])]).number("peak", peak);
      rows.push_back(row.str());
    }
    out.line(fmt::format("  probe {}: {} samples", p.name, p.time.size()));
    out.json(p.name, json_array(rows));
  }
}

void sensors(const solver::RunResults& r, const solver::Scene&, SummarySink& out) {
  for (const auto& x : r.sensors) out.json(x.name, report_sensor(x));
}

}  // namespace

const std::vector<SummaryEntry>& summary_catalog() {
  static const std::vector<SummaryEntry> catalog = {
      {"flux", fluxes},           {"plane_wave", reflectance},       {"orders", orders},
      {"tunnelling", tunnelling_gaps},       {"cross_sections", cross_sections}, {"far_field", far_fields},
      {"decay_rate", decay_rates}, {"field_map", field_maps},          {"probe", probes},
      {"sensor", sensors},
  };
  return catalog;
}

std::string summarise_outputs(const solver::RunResults& results, const solver::Scene& scene) {
  SummarySink out;
  for (const SummaryEntry& e : summary_catalog()) e.summarise(results, scene, out);
  if (out.undefined_shown())
    out.line("yeegap: note: 'undefined' values are normalised by light or a source spectrum that was not recorded yet: "
             "the run stopped before the pulse reached them (see stop in docs/scene.md)");
  return out.json_object();
}

}  // namespace yeegap::cli
