// Cross-section recorder (see cross_sections.h).
#include "solver/outputs/cross_sections.h"

#include <algorithm>

#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "base/units.h"
#include "solver/outputs/result_records.h"

namespace yeegap::solver {

namespace {
// Flux boxes sit this many cells from the TFSF surface: the H values a flux face averages lie half
// a cell either side of it, so two cells keep both wholly on one side.
constexpr int flux_offset_cells = 2;
}  // namespace

CrossSectionRecorder::CrossSectionRecorder(const CrossSectionSpec& spec, const Scene& scene, const Grid& g,
                                           const BlockLayout& L)
    : spec_(spec) {
  if (spec.plane_wave < 0 || spec.plane_wave >= static_cast<int>(scene.plane_waves.size()))
    throw RunError(fmt::format("{}: cross sections need a plane-wave box (a 'tfsf' excitation)", spec.where.location()));
  const PlaneWaveSpec& w = scene.plane_waves[spec.plane_wave];
  eta_ = constants::eta0 / std::sqrt(scene.materials[scene.domain.background].poles.eps_inf);
  FluxSpec inner{spec.name + "_inner", w.box, spec.omegas, spec.where};
  FluxSpec outer{spec.name + "_outer", w.box, spec.omegas, spec.where};
  for (int a = 0; a < 3; ++a) {
    if (g.invariant(a)) {
      length_ = g.primal(a, 0);
      per_length_ = true;
      continue;
    }
    const int lo = g.nearest_node(a, w.box.lo[a]), hi = g.nearest_node(a, w.box.hi[a]);
    if (hi - lo <= 2 * flux_offset_cells)
      throw RunError(fmt::format("{}: the plane-wave box must be more than {} cells across for cross sections",
                                 spec.where.location(), 2 * flux_offset_cells));
    const int margin_lo = scene.domain.edges[2 * a] == EdgeKind::cpml ? scene.domain.cpml.cells : 0;
    const int margin_hi = scene.domain.edges[2 * a + 1] == EdgeKind::cpml ? scene.domain.cpml.cells : 0;
    if ((lo - flux_offset_cells - 1 < margin_lo && !(g.mirror_low[a] && lo == 0)) ||
        hi + flux_offset_cells + 1 > g.n[a] - margin_hi)
      throw RunError(fmt::format("{}: cross sections need {} free cells between the plane-wave box and the absorber "
                                 "(axis {})", spec.where.location(), flux_offset_cells + 1, "xyz"[a]));
    // A box starting on a symmetry plane keeps its flux boxes on the plane (no face there).
    const bool mirrored = g.mirror_low[a] && lo == 0;
    inner.region.lo[a] = g.nodes[a][mirrored ? 0 : lo + flux_offset_cells];
    inner.region.hi[a] = g.nodes[a][hi - flux_offset_cells];
    outer.region.lo[a] = g.nodes[a][mirrored ? 0 : lo - flux_offset_cells];
    outer.region.hi[a] = g.nodes[a][hi + flux_offset_cells];
  }
  inner_ = std::make_unique<FluxRecorder>(inner, g, L);
  outer_ = std::make_unique<FluxRecorder>(outer, g, L);
}

void CrossSectionRecorder::record(const Fields& f, bool electric, const std::vector<Complex>& phase) {
  inner_->record(f, electric, phase);
  outer_->record(f, electric, phase);
}

void CrossSectionRecorder::add_result(RunResults& r, const ResultInputs& in, const Recorder*) const {
  std::vector<Complex> incident;
  for (double w : spec_.omegas) {
    const auto at = std::lower_bound(in.all_omegas.begin(), in.all_omegas.end(), w);
    incident.push_back(in.incident_dft.at(spec_.plane_wave)[at - in.all_omegas.begin()]);
  }
  r.cross_sections.push_back(result(incident));
}

CrossSectionResult CrossSectionRecorder::result(const std::vector<Complex>& incident) const {
  CrossSectionResult r;
  r.name = spec_.name;
  r.omegas = spec_.omegas;
  r.per_unit_length = per_length_;
  const FluxResult in = inner_->result(), out = outer_->result();
  for (std::size_t q = 0; q < r.omegas.size(); ++q) {
    const double i0 = std::norm(incident[q]) / (2 * eta_);
    r.incident_intensity.push_back(i0);
    // A 2D domain's flux is through one cell of the invariant axis: divide to get per metre.
    const double sca = out.power[q] / i0 / length_, abs = -in.power[q] / i0 / length_;
    r.scattering.push_back(sca);
    r.absorption.push_back(abs);
    r.extinction.push_back(sca + abs);
  }
  return r;
}

Record record_of(const CrossSectionResult& x) {
  Record r("cross_sections", x.name);
  require_rows(r, x.omegas.size(),
               {x.scattering.size(), x.absorption.size(), x.extinction.size(), x.incident_intensity.size()},
               "frequencies");
  r.set("per_unit_length", std::int32_t{x.per_unit_length ? 1 : 0});
  add_frequency_axes(r, x.omegas);
  const char* unit = x.per_unit_length ? "m" : "m^2";
  r.add("scattering", unit, x.scattering, "outward flux of the scattered field around the plane-wave box over I0");
  r.add("absorption", unit, x.absorption, "net inward flux of the total field inside the plane-wave box over I0");
  r.add("extinction", unit, x.extinction, "scattering + absorption");
  r.add("incident_intensity", "W s^2/m^2", x.incident_intensity, "|E_inc(omega)|^2 / (2 eta) from DFT spectra");
  add_peak_headlines(r, "extinction", x.omegas, x.extinction, unit);
  add_peak_headlines(r, "scattering", x.omegas, x.scattering, unit);
  add_peak_headlines(r, "absorption", x.omegas, x.absorption, unit);
  // The terminal in nm^2 (nm per unit length), --json in SI.
  const double scale = x.per_unit_length ? 1e9 : 1e18;
  r.summary.heading = fmt::format("  cross sections {} ({}): wavelength, extinction, scattering, absorption", x.name,
                                  x.per_unit_length ? "nm" : "nm^2");
  for (std::size_t q = 0; q < x.omegas.size(); ++q)
    r.summary.rows.push_back(SummaryRow({wavelength_cell(x.omegas[q]),
                                        {"extinction", x.extinction[q], "{:.5g}", scale},
                                        {"scattering", x.scattering[q], "{:.5g}", scale},
                                        {"absorption", x.absorption[q], "{:.5g}", scale}}));
  return r;
}

}  // namespace yeegap::solver
