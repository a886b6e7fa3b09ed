// Decay-rate recorder (see decay_rate.h). The discrete Poynting theorem holds exactly for DFT fields in
// a lossless medium, so any box from one cell around the dipole gives its emitted power; that differs
// from the continuum P0 only by the grid's dispersion (+0.5 % at 20 cells per wavelength), so P0 in
// closed form is a fair normalisation (docs/scene.md, decay_rate).
#include "solver/outputs/decay_rate.h"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "base/units.h"
#include "solver/outputs/result_records.h"
#include "solver/media/material_map.h"

namespace yeegap::solver {

namespace {

// Cells of the box beyond the cell holding the dipole on each side: the source's trilinear taps
// lie within half a cell of it (dipole_source.h), so one cell keeps every tap off the box faces.
constexpr int min_half_cells = 1;

std::size_t index_of(const std::vector<double>& list, double w) {
  return static_cast<std::size_t>(std::find(list.begin(), list.end(), w) - list.begin());
}

}  // namespace

DecayRateRecorder::DecayRateRecorder(const DecayRateSpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L,
                                     const MaterialIndex& mi)
    : spec_(spec), omegas_(spec.omegas) {
  const std::string who = fmt::format("{}: decay_rate '{}'", spec.where.location(), spec.name);
  if (spec.dipole < 0 || spec.dipole >= static_cast<int>(scene.dipoles.size()))
    throw RunError(fmt::format("{}: dipole {} does not exist; the scene has {} dipole(s), counted from 0", who,
                               spec.dipole, scene.dipoles.size()));
  for (int a = 0; a < 3; ++a)
    if (g.invariant(a))
      throw RunError(fmt::format("{}: the domain is invariant along {} (2D), where a point dipole is a line source; "
                                 "the decay rate needs a 3D domain", who, "xyz"[a]));

  // The output that gives the radiated power, and the frequencies.
  if (!spec.radiated.empty()) {
    const std::vector<double>* listed = nullptr;
    for (const FarFieldSpec& f : scene.far_fields)
      if (f.name == spec.radiated) listed = &f.omegas;
    for (const FluxSpec& f : scene.fluxes)
      if (f.name == spec.radiated) {
        for (int a = 0; a < 3; ++a)
          if (!(f.region.hi[a] > f.region.lo[a]))
            throw RunError(fmt::format("{}: the flux '{}' is a plane; the radiated power needs a closed box around "
                                       "everything", who, f.name));
        listed = &f.omegas;
      }
    if (!listed)
      throw RunError(fmt::format("{}: 'radiated' names '{}', which is not a far_field or flux output of the scene", who,
                                 spec.radiated));
    if (omegas_.empty()) omegas_ = *listed;
    for (double w : omegas_)
      if (index_of(*listed, w) == listed->size())
        throw RunError(fmt::format("{}: the frequency {:.6g} rad/s is not one of the output '{}'; give both outputs "
                                   "the same frequencies", who, w, spec.radiated));
  }
  if (omegas_.empty())
    throw RunError(fmt::format("{}: no frequencies (give 'frequencies', or 'radiated' to take that output's)", who));

  // The box: whole cells around the cell holding the dipole, at least one on each side.
  const DipoleSpec& dip = scene.dipoles[spec.dipole];
  FluxSpec box{spec.name + "_box", {}, omegas_, spec.where};
  std::array<bool, 3> on_mirror{};
  for (int a = 0; a < 3; ++a) {
    const int cell = g.cell_of(a, dip.position[a]);
    int lo = cell - min_half_cells, hi = cell + 1 + min_half_cells;
    if (spec.box_size > 0) {
      lo = std::min(lo, g.nearest_node(a, dip.position[a] - 0.5 * spec.box_size));
      hi = std::max(hi, g.nearest_node(a, dip.position[a] + 0.5 * spec.box_size));
    }
    // A dipole on a symmetry plane is its own image: its box starts on the plane, and the flux
    // recorder reports the power of the whole structure (recorders.cpp), i.e. of the one dipole.
    const double from_plane = std::abs(dip.position[a] - g.nodes[a][0]);
    on_mirror[a] = is_mirror(scene.domain.edges[2 * a]) && from_plane < 1e-6 * g.primal(a, 0);
    if (on_mirror[a]) lo = 0;
    // Free cells: one beyond the absorbing layer (the flux faces average H over half a cell either
    // side), or one from a metal or periodic face.
    const int cells = scene.domain.cpml.cells;
    const int room_lo = on_mirror[a] ? 0 : (scene.domain.edges[2 * a] == EdgeKind::cpml ? cells + 1 : 1);
    const int room_hi = g.n[a] - (scene.domain.edges[2 * a + 1] == EdgeKind::cpml ? cells + 1 : 1);
    if (lo < room_lo || hi > room_hi)
      throw RunError(fmt::format("{}: the box around the dipole (nodes {} to {} along {}) leaves the free cells {} "
                                 "to {} of the domain; move the dipole away from the face or give a smaller box_size",
                                 who, lo, hi, "xyz"[a], room_lo, room_hi));
    box.region.lo[a] = g.nodes[a][lo];
    box.region.hi[a] = g.nodes[a][hi];
  }

  // One lossless medium in the whole box, as the grid sees it.
  const int medium = material_at(scene, dip.position);
  const MaterialSpec& m = scene.materials[medium];
  if (m.perfect_conductor || m.poles.dispersive() || m.poles.conductivity != 0)
    throw RunError(fmt::format("{}: the dipole sits in '{}', which is lossy or has poles; the dipole-alone power is "
                               "known in closed form only in a lossless medium without poles", who, m.name));
  index_ = std::sqrt(m.poles.eps_inf);
  for (int comp = 0; comp < 3; ++comp) {
    std::array<std::array<int, 2>, 3> r;
    for (int a = 0; a < 3; ++a) {
      const int lo = g.nearest_node(a, box.region.lo[a]), hi = g.nearest_node(a, box.region.hi[a]);
      r[a] = a == comp ? std::array<int, 2>{lo, hi - 1} : std::array<int, 2>{lo, hi};
    }
    for (int k = r[2][0]; k <= r[2][1]; ++k)
      for (int j = r[1][0]; j <= r[1][1]; ++j)
        for (int i = r[0][0]; i <= r[0][1]; ++i) {
          // An odd mirror plane holds its tangential E at zero, like a wall: not a second medium.
          const std::array<int, 3> idx{i, j, k};
          bool on_plane = false;
          for (int a = 0; a < 3; ++a) on_plane = on_plane || (a != comp && on_mirror[a] && idx[a] == 0);
          if (!on_plane && mi.e[comp][L.at(i, j, k)] != medium)
            throw RunError(fmt::format("{}: the box around the dipole ({} nm across) holds more than the medium '{}' "
                                       "the dipole sits in; give a smaller box_size or move the dipole", who,
                                       (box.region.hi.x - box.region.lo.x) * 1e9, m.name));
        }
  }
  box_ = std::make_unique<FluxRecorder>(box, g, L);
}

DecayRateResult DecayRateRecorder::result(const RunResults& r) const {
  DecayRateResult out;
  out.name = spec_.name;
  out.omegas = omegas_;
  out.dipole = spec_.dipole;
  out.index = index_;
  out.radiated = spec_.radiated;
  const FluxResult box = box_->result();
  const FarFieldResult* far = nullptr;
  const FluxResult* flux = nullptr;
  for (const FarFieldResult& f : r.far_fields)
    if (f.name == spec_.radiated) far = &f;
  for (const FluxResult& f : r.fluxes)
    if (f.name == spec_.radiated) flux = &f;
  YG_CHECK(spec_.radiated.empty() || far || flux, "the radiated output was checked to exist when the run was built");
  for (std::size_t q = 0; q < omegas_.size(); ++q) {
    const double w = omegas_[q];
    const std::size_t s = index_of(r.source_omegas, w);
    YG_CHECK(s < r.source_omegas.size(), "every output frequency is in the source spectra");
    const double il = std::abs(r.source_spectra[spec_.dipole][s]);
    const double k0 = w / constants::c0;
    const double alone = index_ * constants::eta0 * k0 * k0 * il * il / (12 * constants::pi);
    out.alone_power.push_back(alone);
    out.box_power.push_back(box.power[q]);
    out.total.push_back(box.power[q] / alone);
    if (far || flux) {
      const double radiated = far ? far->power[index_of(far->omegas, w)] : flux->power[index_of(flux->omegas, w)];
      out.radiative.push_back(radiated / alone);
      out.efficiency.push_back(radiated / box.power[q]);
    }
  }
  return out;
}

Record record_of(const DecayRateResult& x) {
  Record r("decay_rate", x.name);
  const std::size_t n = x.omegas.size();
  require_rows(r, n, {x.total.size(), x.box_power.size(), x.alone_power.size()}, "frequencies");
  if (!x.radiative.empty() || !x.efficiency.empty())
    require_rows(r, n, {x.radiative.size(), x.efficiency.size()}, "frequencies");
  r.set("dipole", std::int32_t{x.dipole});
  r.set("index", x.index);
  r.set("radiated", x.radiated);
  add_frequency_axes(r, x.omegas);
  r.add("total", "1", x.total,
        "total decay-rate enhancement: power out of the box around the dipole / alone_power");
  if (!x.radiative.empty()) {
    r.add("radiative", "1", x.radiative, "radiated power (from the output named by 'radiated') / alone_power");
    r.add("efficiency", "1", x.efficiency, "quantum efficiency of an ideal emitter: radiative / total");
  }
  r.add("box_power", "W s^2", x.box_power, "outward flux through the small box around the dipole");
  r.add("alone_power", "W s^2", x.alone_power,
        "n eta0 k0^2 |I l(omega)|^2 / (12 pi): the dipole alone in the medium around it");
  add_peak_headlines(r, "total", x.omegas, x.total, "1");
  r.summary.heading = fmt::format("  decay rate {} (dipole {}): wavelength, total enhancement{}", x.name, x.dipole,
                                  x.radiative.empty() ? "" : ", radiative, quantum efficiency");
  for (std::size_t q = 0; q < n; ++q) {
    SummaryRow row({wavelength_cell(x.omegas[q]),
                             Cell("total", x.total[q])});
    if (!x.radiative.empty()) {
      row.cells.push_back(Cell("radiative", x.radiative[q]));
      row.cells.push_back(Cell("efficiency", x.efficiency[q], "{:.4f}"));
    }
    r.summary.rows.push_back(std::move(row));
  }
  return r;
}

}  // namespace yeegap::solver
