// Model building and the time loop (see simulation.h).
#include "solver/engine/simulation.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <set>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "solver/engine/absorber_angle.h"
#include "solver/engine/bloch_halos.h"
#include "solver/media/dispersive_stability.h"
#include "solver/media/material_map.h"
#include "solver/engine/mesh_plan.h"
#include "solver/engine/placement_notes.h"
#include "solver/engine/growth_watch.h"
#include "solver/engine/time_loop.h"
#include "solver/outputs/cross_sections.h"
#include "solver/outputs/decay_rate.h"
#include "solver/outputs/energy_in_box.h"
#include "solver/outputs/far_field.h"
#include "solver/outputs/recorders.h"

namespace yeegap::solver {

namespace {

// The sources and recorders of a scene on its grid. The run keeps them; `check` builds them only for
// the errors their constructors throw (a box outside the domain, a dipole in a conductor). One list
// for both, so a new kind of output cannot be checked by one and forgotten by the other.
struct Parts {
  std::vector<DipoleSource> dipoles;
  std::vector<PlaneWaveSource> plane_waves;
  std::vector<std::unique_ptr<Recorder>> recorders;
};

Parts build_parts(const Scene& s, const Grid& g, const BlockLayout& L, const CurlCoefficients& curls,
                  const ECoefficients& ec, const MaterialIndex& mi, double dt) {
  Parts p;
  for (const auto& d : s.dipoles) p.dipoles.emplace_back(d, g, L, s.domain.edges);
  for (const auto& w : s.plane_waves) p.plane_waves.emplace_back(w, s, g, L, curls, ec, mi, dt);
  // Decay rates last: their results read the fluxes and far fields.
  auto& r = p.recorders;
  for (const auto& x : s.probes) r.push_back(std::make_unique<ProbeRecorder>(x, g, L));
  for (const auto& m : s.field_maps) r.push_back(std::make_unique<FieldMapRecorder>(m, g, L));
  for (const auto& f : s.fluxes) r.push_back(std::make_unique<FluxRecorder>(f, g, L));
  for (const auto& c : s.cross_sections) r.push_back(std::make_unique<CrossSectionRecorder>(c, s, g, L));
  for (const auto& f : s.far_fields) r.push_back(std::make_unique<FarFieldRecorder>(f, s, g, L, mi));
  for (const auto& d : s.decay_rates) r.push_back(std::make_unique<DecayRateRecorder>(d, s, g, L, mi));
  for (const auto& e : s.energies) r.push_back(std::make_unique<EnergyRecorder>(e, s, g, L, mi));
  return p;
}

double choose_time_step(const Scene& s, const Grid& g) {
  const double limit = g.courant_limit();
  if (s.domain.time_step > 0) {
    if (s.domain.time_step > limit)
      throw RunError(fmt::format(
          "{}: domain.time_step {:.6g} s is above the Courant limit {:.6g} s of the smallest cell; the run would "
          "grow without bound. Use at most {:.6g} s or leave time_step out.",
          s.file, s.domain.time_step, limit, limit));
    return s.domain.time_step;
  }
  if (!(s.domain.stability_fraction > 0 && s.domain.stability_fraction <= 1))
    throw RunError(fmt::format("{}: domain.stability_fraction must lie in (0, 1], got {}", s.file, s.domain.stability_fraction));
  // Dispersive media tighten the bound a little (dispersive_stability.h): the courant fraction is
  // applied to the tighter of the two limits, so a default scene with metals runs as written.
  return s.domain.stability_fraction * stable_time_step(s.materials, limit);
}

void check_scene(const Scene& s, const Grid& g) {
  for (int a = 0; a < 3; ++a) {
    if (is_mirror(s.domain.edges[2 * a + 1]))
      throw RunError(fmt::format("{}: a mirror plane goes on a low face ({}_low); move the domain so the symmetry "
                                 "plane is its low {} face", s.file, "xyz"[a], "xyz"[a]));
    const bool lo_p = s.domain.edges[2 * a] == EdgeKind::periodic, hi_p = s.domain.edges[2 * a + 1] == EdgeKind::periodic;
    if (lo_p != hi_p) throw RunError(fmt::format("{}: periodic edges must come in pairs (axis {})", s.file, "xyz"[a]));
    if (g.n[a] < 2 && !lo_p)
      throw RunError(fmt::format("{}: axis {} has {} cell; a bounded axis needs at least 2 (use periodic edges for an "
                                 "invariant direction)", s.file, "xyz"[a], g.n[a]));
    for (int side = 0; side < 2; ++side)
      if (s.domain.edges[2 * a + side] == EdgeKind::cpml && 2 * s.domain.cpml.cells + 2 > g.n[a])
        throw RunError(fmt::format("{}: axis {} has {} cells, too few for two absorbing layers of {} cells", s.file,
                                   "xyz"[a], g.n[a], s.domain.cpml.cells));
  }
  if (s.materials.empty()) throw RunError(s.file + ": no materials");
  for (const PlaneWaveSpec& p : s.plane_waves) check_plane_wave_box(p, s, g);
  // Poles resolved by the time step and the Courant bound tightened by the explicit poles.
  check_dispersive_stability(s, choose_time_step(s, g), g.courant_limit());
}

CurlCoefficients plain_curls(const Grid& g, double dt) {
  CurlCoefficients c;
  for (int a = 0; a < 3; ++a) {
    c.h[a].resize(g.n[a]);
    c.e[a].resize(g.n[a]);
    for (int i = 0; i < g.n[a]; ++i) {
      c.h[a][i] = static_cast<real>(dt / (constants::mu0 * g.primal(a, i)));
      c.e[a][i] = static_cast<real>(1.0 / g.dual(a, i));
    }
  }
  return c;
}

// The refined gaps with the number of cells across each, counted along the axis the gap spans most.
// Dispersive currents: per E location of a dispersive material its field offset, the previous E, the
// sum of the currents and two numbers per pole (dispersive.cpp). Counted over each dispersive body's
// box clipped to the grid (exact for slabs, about 1.9x a sphere): an upper bound, so a memory check
// errs on the safe side.
std::size_t dispersive_bytes_bound(const Scene& s, const Grid& g) {
  auto per_location = [&](int material) -> std::size_t {
    const materials::PoleSet& p = s.materials.at(static_cast<std::size_t>(material)).poles;
    const std::size_t poles = p.drude.size() + p.lorentz.size() + p.critical_points.size();
    return poles == 0 ? 0 : sizeof(std::ptrdiff_t) + 2 * sizeof(real) + 2 * sizeof(real) * poles;
  };
  double bytes = 3.0 * static_cast<double>(g.cell_count()) * static_cast<double>(per_location(s.domain.background));
  for (const BodySpec& b : s.bodies) {
    const std::size_t each = per_location(b.material);
    if (each == 0) continue;
    const geometry::Aabb box = b.shape->bounds();
    double locations = 3;
    for (int a = 0; a < 3; ++a) {
      const double lo = std::clamp(box.lo[a], g.nodes[a].front(), g.nodes[a].back());
      const double hi = std::clamp(box.hi[a], g.nodes[a].front(), g.nodes[a].back());
      const auto r = node_range(g, a, lo, hi);
      locations *= std::max(1, r[1] - r[0] + 1);
    }
    bytes += locations * static_cast<double>(each);
  }
  return static_cast<std::size_t>(std::min(bytes, 1e18));
}

std::vector<ModelSummary::RefinedGap> refined_gaps(const MeshPlan& mesh) {
  std::vector<ModelSummary::RefinedGap> out;
  for (const geometry::Gap& gap : mesh.gaps) {
    int axis = 0;
    for (int a = 1; a < 3; ++a)
      if (std::abs(gap.point_b[a] - gap.point_a[a]) > std::abs(gap.point_b[axis] - gap.point_a[axis])) axis = a;
    const double lo = std::min(gap.point_a[axis], gap.point_b[axis]), hi = std::max(gap.point_a[axis], gap.point_b[axis]);
    const double tol = 1e-6 * gap.width;
    const auto& v = mesh.grid.nodes[axis];
    const int inner = static_cast<int>(std::count_if(v.begin(), v.end(), [&](double x) { return x > lo + tol && x < hi - tol; }));
    out.push_back({gap.body_a, gap.body_b, gap.width, gap.middle(), inner + 1});
  }
  return out;
}

double lowest_source_omega(const Scene& s) {
  double w = std::numeric_limits<double>::infinity();
  for (const auto& d : s.dipoles) w = std::min(w, d.waveform.omega_min > 0 ? d.waveform.omega_min : d.waveform.omega_max);
  for (const auto& p : s.plane_waves) w = std::min(w, p.waveform.omega_min > 0 ? p.waveform.omega_min : p.waveform.omega_max);
  return std::isfinite(w) ? w : 0.0;
}

// Steps between running-DFT samples. The sources' spectra end well inside a known band (a pulse
// carries 1e-8 of its peak power half a band beyond its edges; a continuous wave is one line), and
// the scheme is linear, so the fields hold nothing above it. Sampling ten times per period of the
// highest such frequency puts the first alias (Poisson summation) beyond 9 times that frequency,
// where the spectra are empty, and the subsampled sum equals the every-step sum to round-off.
long dft_stride(const Scene& s, const std::vector<double>& outputs, double dt) {
  double top = outputs.empty() ? 0.0 : outputs.back();
  auto extend = [&](const Waveform& w) {
    top = std::max(top, w.kind == Waveform::Kind::pulse ? w.omega_max + 0.5 * (w.omega_max - w.omega_min)
                                                        : 1.5 * w.omega_max);
  };
  for (const auto& d : s.dipoles) extend(d.waveform);
  for (const auto& p : s.plane_waves) extend(p.waveform);
  if (!(top > 0)) return 1;
  constexpr double samples_per_period = 10.0;
  return std::max(1L, static_cast<long>(std::floor(2 * constants::pi / (top * dt * samples_per_period))));
}

}  // namespace

Simulation::Simulation(const Scene& scene)
    : scene_(with_tunnelling_material(scene)),
      grid_(plan_mesh(scene).grid),
      dt_(choose_time_step(scene_, grid_)),
      fields_(BlockLayout::of(grid_.n)) {
  check_scene(scene_, grid_);
  curls_ = plain_curls(grid_, dt_);
  ecoef_ = e_coefficients(scene_, dt_);
  fill_material_index(scene_, grid_, fields_.layout, mindex_);
  const TunnellingCells tunnelling_cells(scene_, grid_, fields_.layout, mindex_);
  if (scene_.domain.averaging) {
    subcell_ = std::make_unique<SubcellAverage>(scene_, grid_, fields_.layout, mindex_, ecoef_, dt_);
    if (subcell_->empty()) subcell_.reset();
  }
  // Mixed locations carry their own polarization currents (subcell_average.h).
  dispersive_ = std::make_unique<DispersiveCurrents>(
      scene_, fields_.layout,
      subcell_ ? subcell_->without_mixed(mindex_, static_cast<int>(scene_.materials.size())) : mindex_, ecoef_, dt_);
  tunnelling_cells.set_damping(*dispersive_);
  tunnelling_gaps_ = tunnelling_cells.report();

  std::array<bool, 6> absorbing{};
  for (int f = 0; f < 6; ++f) absorbing[f] = scene_.domain.edges[f] == EdgeKind::cpml;
  if (std::any_of(absorbing.begin(), absorbing.end(), [](bool b) { return b; })) {
    const CpmlSpec& a = scene_.domain.cpml;
    const double n_bg = std::sqrt(scene_.materials[scene_.domain.background].poles.eps_inf);
    CpmlProfile p;
    p.cells = a.cells;
    p.order = a.grading_order;
    // The thinnest absorbing layer's actual thickness sets sigma_max (on a graded grid a layer's
    // cells may be smaller than the base step, see mesh_plan.h).
    double thickness = std::numeric_limits<double>::infinity();
    for (int f = 0; f < 6; ++f)
      if (absorbing[f]) thickness = std::min(thickness, absorber_thickness(grid_, f, a.cells));
    // In a Bloch cell each face is made to reach the target reflection for the waves that arrive
    // there, at an angle or evanescent (absorber_angle.h); elsewhere every face gets the
    // normal-incidence design.
    for (int f = 0; f < 6; ++f)
      if (absorbing[f]) {
        const FaceDesign face = absorber_face_design(scene_, grid_, f, thickness);
        p.sigma_max[f] = cpml_sigma_max(p.order, a.reflection, thickness, n_bg) * face.sigma_factor;
        p.kappa_max[f] = face.kappa_max;
      }
    // CFS shift: alpha/eps0 a tenth of the lowest source frequency keeps propagating waves absorbed
    // over the band while damping the late-time low-frequency tail (common practice).
    p.alpha_max = a.alpha_max > 0 ? a.alpha_max : 0.1 * lowest_source_omega(scene_) * constants::eps0;
    cpml_ = std::make_unique<Cpml>(grid_, absorbing, p, dt_, curls_);
  }

  // After the absorber: the plane-wave box reads the curl coefficients the CPML has set.
  Parts parts = build_parts(scene_, grid_, fields_.layout, curls_, ecoef_, mindex_, dt_);
  dipoles_ = std::move(parts.dipoles);
  plane_waves_ = std::move(parts.plane_waves);
  recorders_ = std::move(parts.recorders);
  plan_spectra();
}

void Simulation::plan_spectra() {
  std::set<double> omegas;
  for_each_recorder([&](const Recorder& r) { omegas.insert(r.result_omegas().begin(), r.result_omegas().end()); });
  all_omegas_.assign(omegas.begin(), omegas.end());
  dft_stride_ = dft_stride(scene_, all_omegas_, dt_);
  source_dft_.assign(dipoles_.size(), std::vector<Complex>(all_omegas_.size()));
  incident_dft_.assign(plane_waves_.size(), std::vector<Complex>(all_omegas_.size()));
}

Recorder& Simulation::add_recorder(std::unique_ptr<Recorder> r) {
  YG_CHECK(n_ == 0, "outputs are added before the first step");
  run_recorders_.push_back(std::move(r));
  plan_spectra();
  return *run_recorders_.back();
}

Simulation::~Simulation() = default;

ModelSummary Simulation::plan(const Scene& original) {
  const Scene scene = with_tunnelling_material(original);
  const MeshPlan mesh = plan_mesh(scene);
  const Grid& g = mesh.grid;
  const double dt = choose_time_step(scene, g);
  check_scene(scene, g);
  ModelSummary m;
  m.cells = g.n;
  m.cell_count = g.cell_count();
  m.time_step = dt;
  m.courant_limit = g.courant_limit();
  m.smallest_cell = std::min({g.min_spacing(0), g.min_spacing(1), g.min_spacing(2)});
  for (int a = 0; a < 3; ++a)
    for (int i = 0; i < g.n[a]; ++i) m.largest_cell = std::max(m.largest_cell, g.primal(a, i));
  for (int a = 0; a < 3; ++a) {
    m.min_cell[a] = g.min_spacing(a);
    for (int i = 0; i < g.n[a]; ++i) m.max_cell[a] = std::max(m.max_cell[a], g.primal(a, i));
  }
  m.gaps = refined_gaps(mesh);
  m.mesh_notes = mesh.notes;
  for (std::string& note : placement_notes(scene, g)) m.mesh_notes.push_back(std::move(note));
  const BlockLayout L = BlockLayout::of(g.n);
  std::size_t bytes = 6 * L.total * sizeof(real) + 3 * L.total;
  // CPML: four psi arrays per absorbing face over its slab.
  for (int a = 0; a < 3; ++a)
    for (int side = 0; side < 2; ++side)
      if (scene.domain.edges[2 * a + side] == EdgeKind::cpml)
        bytes += 4 * sizeof(real) * static_cast<std::size_t>(scene.domain.cpml.cells) * (L.total / (g.n[a] + 2));
  // Recorders: complex double per sampled point and frequency.
  for (const auto& f : scene.field_maps) {
    std::size_t pts = 1;
    for (int a = 0; a < 3; ++a) {
      const auto r = node_range(g, a, f.region.lo[a], f.region.hi[a]);
      pts *= static_cast<std::size_t>(r[1] - r[0] + 2);
    }
    bytes += pts * f.components.size() * f.omegas.size() * sizeof(Complex);
  }
  for (const auto& f : scene.fluxes) {
    std::size_t area = 0;
    std::array<std::size_t, 3> ext{};
    for (int a = 0; a < 3; ++a) {
      const auto r = node_range(g, a, f.region.lo[a], f.region.hi[a]);
      ext[a] = static_cast<std::size_t>(r[1] - r[0] + 2);
    }
    area = 2 * (ext[0] * ext[1] + ext[1] * ext[2] + ext[0] * ext[2]);
    bytes += 4 * area * f.omegas.size() * sizeof(Complex);
  }
  bytes += dispersive_bytes_bound(scene, g);
  m.memory_bytes = bytes;
  const StopSpec& st = scene.stop;
  double source_end = 0;
  for (const auto& d : scene.dipoles) source_end = std::max(source_end, SourceTime(d.waveform).end_time());
  for (const auto& p : scene.plane_waves) source_end = std::max(source_end, SourceTime(p.waveform).end_time());
  if (st.after > 0) {
    m.steps = static_cast<long>(std::min<double>(static_cast<double>(st.max_steps), std::ceil(st.after / dt)));
  } else {
    double longest = 0;
    for (int a = 0; a < 3; ++a) longest = std::max(longest, g.nodes[a].back() - g.nodes[a].front());
    const double t = std::min(source_end, 1e300) + 10.0 * longest / constants::c0;
    m.steps = static_cast<long>(std::min<double>(static_cast<double>(st.max_steps), std::ceil(t / dt)));
    m.steps_estimated = true;
  }
  for (std::string& w : placement_warnings(scene, g)) m.warnings.push_back(std::move(w));
  // The cap stops a run that needs more steps; say so now, with what sets the step.
  const double span = st.after > 0 ? st.after : source_end, needed = std::ceil(span / dt);
  if (std::isfinite(span) && needed >= static_cast<double>(st.max_steps))
    m.warnings.push_back(fmt::format("{} {:.4g} steps of {:.4g} fs, beyond the cap of {} steps: the run would stop "
                                     "early. The smallest cell ({:.4g} nm) sets the step; coarser gap cells "
                                     "(domain.gap_cells) or a wider gap would help",
                                     st.after > 0 ? "stop.after asks for" : "the sources alone last", needed, dt * 1e15,
                                     st.max_steps, m.smallest_cell * 1e9));
  return m;
}

void Simulation::check_placements(const Scene& original) {
  const Scene scene = with_tunnelling_material(original);
  const Grid g = plan_mesh(original).grid;
  const double dt = choose_time_step(scene, g);
  check_scene(scene, g);
  const BlockLayout L = BlockLayout::of(g.n);
  MaterialIndex mi;
  fill_material_index(scene, g, L, mi);
  const TunnellingCells tunnelling_cells(scene, g, L, mi);
  const CurlCoefficients curls = plain_curls(g, dt);
  const ECoefficients ec = e_coefficients(scene, dt);
  // Each constructor throws what the run would; the parts are dropped at once.
  [[maybe_unused]] const Parts parts = build_parts(scene, g, L, curls, ec, mi, dt);
}

double Simulation::sources_end_time() const {
  double t = 0;
  for (const auto& d : dipoles_) t = std::max(t, d.time().end_time());
  for (const auto& w : plane_waves_) t = std::max(t, w.end_time());
  return t;
}

ModelSummary Simulation::summary() const {
  ModelSummary m = plan(scene_);
  // Measured memory of what was actually built replaces the estimate.
  std::size_t bytes = 6 * fields_.layout.total * sizeof(real) + 3 * fields_.layout.total;
  if (cpml_) bytes += cpml_->memory_bytes();
  bytes += dispersive_->memory_bytes();
  if (subcell_) bytes += subcell_->memory_bytes();
  m.mixed_cells = subcell_ ? static_cast<long long>(subcell_->size()) : 0;
  for_each_recorder([&](const Recorder& r) { bytes += r.memory_bytes(); });
  m.memory_bytes = bytes;
  return m;
}

void Simulation::fill_periodic_halos(bool electric) {
  // E is read at index n by the H update; H at index -1 by the E update.
  const BlockLayout& L = fields_.layout;
  const int first = electric ? 0 : 3;
  for (int a = 0; a < 3; ++a) {
    // An even mirror plane at the low face (a magnetic wall): the image of the tangential H half a
    // cell above the plane is its negative half a cell below, read by the E update of the
    // tangential E on the plane. Normal H and the other fields need no image.
    const bool even_mirror = !electric && scene_.domain.edges[2 * a] == EdgeKind::mirror_even;
    if (!grid_.periodic[a] && !even_mirror) continue;
    if (carries_bloch_phase(scene_.domain, a)) continue;  // copied with its phase by fill_bloch_halos
    const int n = L.n[a];
    const int from = electric ? 0 : (even_mirror ? 0 : n - 1), to = electric ? n : -1;
    const real sign = even_mirror ? real(-1) : real(1);
    // The inner loop runs along x whenever x is one of the plane's two axes (contiguous memory).
    const int b = a == 0 ? 1 : 0, c = 3 - a - b;
    for (int comp = first; comp < first + 3; ++comp) {
      if (even_mirror && comp == 3 + a) continue;  // normal H: not read across the plane
      real* d = fields_.c[comp].data();
      // Copy the whole plane including the other axes' halos, so corners stay consistent.
      // Offsets are formed once per row: on a 2D grid (one periodic cell along z) this plane is the
      // whole grid, and index arithmetic per element made the copy cost more than the update.
      const std::ptrdiff_t sa = L.stride(a), sb = L.stride(b), sc = L.stride(c);
      const std::ptrdiff_t shift = static_cast<std::ptrdiff_t>(to - from) * sa;
      const std::ptrdiff_t first_row = L.at(0, 0, 0) + from * sa - sc - sb;
      const int len = L.n[b] + 2, rows = L.n[c] + 2;
      // Rows of a thin grid are a few elements long: a plain loop with running pointers, no
      // OpenMP region (field.h, for_each_index) unless the plane is large.
      const auto copy_rows = [&](int q0, int q1) {
        real* src = d + first_row + q0 * sc;
        for (int q = q0; q < q1; ++q, src += sc) {
          real* dst = src + shift;
          if (sb == 1) {
            for (int p = 0; p < len; ++p) dst[p] = sign * src[p];
          } else {
            for (int p = 0; p < len; ++p) dst[p * sb] = sign * src[p * sb];
          }
        }
      };
      if (parallel_worth(L.n[b], L.n[c], 1)) {
        for_each_index(true, 0, rows, [&](int q) { copy_rows(q, q + 1); });
      } else {
        copy_rows(0, rows);
      }
    }
  }
}

void Simulation::step() {
  step_h();
  step_e();
}

void Simulation::step_h() {
  const double t_h = (n_ + 0.5) * dt_;
  // Running DFTs are summed every dft_stride_ steps with weight dft_stride_ dt (see dft_stride()).
  const bool dft_now = n_ % dft_stride_ == 0;
  const double dft_dt = dft_stride_ * dt_;

  fill_periodic_halos(true);
  update_h(fields_, curls_);
  if (cpml_) cpml_->apply_h(fields_, dt_);
  for (auto& w : plane_waves_) w.apply_h(fields_);
  for (auto& s : stages_) s->after_h(fields_);
  if (dft_now) {
    const auto phase = dft_phases(all_omegas_, t_h, dft_dt);
    for (std::size_t d = 0; d < dipoles_.size(); ++d) {
      const double il = dipoles_[d].current_moment(t_h);
      for (std::size_t q = 0; q < phase.size(); ++q) source_dft_[d][q] += il * phase[q];
    }
  }
  for_each_recorder([&](Recorder& r) { r.sample(fields_, false, {t_h, dft_now, dft_dt}); });
}

void Simulation::step_e() {
  const double t_h = (n_ + 0.5) * dt_, t_e = (n_ + 1.0) * dt_;
  const bool dft_now = n_ % dft_stride_ == 0;
  const double dft_dt = dft_stride_ * dt_;

  fill_periodic_halos(false);
  if (!dispersive_->empty()) dispersive_->advance(fields_);
  if (subcell_) subcell_->keep(fields_);
  update_e(fields_, curls_, ecoef_, mindex_);
  if (cpml_) cpml_->apply_e(fields_, ecoef_, mindex_);
  for (const auto& d : dipoles_) d.apply_e(fields_, ecoef_, mindex_, t_h);
  for (auto& w : plane_waves_) w.apply_e(fields_, t_h);
  for (auto& s : stages_) s->after_e(fields_, t_h);
  if (subcell_) subcell_->apply(fields_);
  if (!dispersive_->empty()) dispersive_->correct(fields_);
  if (dft_now) {
    if (!plane_waves_.empty()) {
      const auto phase = dft_phases(all_omegas_, t_e, dft_dt);
      for (std::size_t w = 0; w < plane_waves_.size(); ++w) {
        const double e = plane_waves_[w].reference_e();
        for (std::size_t q = 0; q < phase.size(); ++q) incident_dft_[w][q] += e * phase[q];
      }
    }
  }
  for_each_recorder([&](Recorder& r) { r.sample(fields_, true, {t_e, dft_now, dft_dt}); });
  ++n_;
}

double Simulation::field_energy() const {
  const BlockLayout& L = fields_.layout;
  std::vector<double> eps(ecoef_.ca.size(), 0.0);
  for (std::size_t m = 0; m < scene_.materials.size(); ++m) eps[m] = constants::eps0 * scene_.materials[m].poles.eps_inf;
  std::vector<double> per_plane(L.n[2], 0.0);
  for_each_index(parallel_worth(L.n[0], L.n[1], L.n[2]), 0, L.n[2], [&](int k) {
    double s = 0;
    for (int j = 0; j < L.n[1]; ++j)
      for (int i = 0; i < L.n[0]; ++i) {
        const std::ptrdiff_t o = L.at(i, j, k);
        const double v = grid_.primal(0, i) * grid_.primal(1, j) * grid_.primal(2, k);
        double e = 0, h = 0;
        for (int c = 0; c < 3; ++c) {
          const double ev = fields_.c[c][o], hv = fields_.c[3 + c][o];
          e += eps[mindex_.e[c][o]] * ev * ev;
          h += hv * hv;
        }
        s += 0.5 * v * (e + constants::mu0 * h);
      }
    per_plane[k] = s;
  });
  double total = 0;
  for (double s : per_plane) total += s;  // fixed order: the same sum for any thread count
  return total;
}

std::string Simulation::describe_largest_field() const {
  // Non-finite values spread one cell per step along each axis, so by the time the guard sees them
  // they fill a box around where they started: report the box and its centre. Finite runaway growth
  // peaks where it started: report the largest value.
  static constexpr const char* names[6] = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz"};
  const BlockLayout& L = fields_.layout;
  double largest = -1;
  int big_c = 0;
  std::array<int, 3> big{}, lo{L.n[0], L.n[1], L.n[2]}, hi{-1, -1, -1};
  std::array<int, 6> bad_count{};
  for (int c = 0; c < 6; ++c) {
    const double scale = c < 3 ? 1.0 : constants::eta0;  // H in the units of E
    for (int k = 0; k < L.n[2]; ++k)
      for (int j = 0; j < L.n[1]; ++j)
        for (int i = 0; i < L.n[0]; ++i) {
          const double v = fields_.c[c][L.at(i, j, k)];
          if (!std::isfinite(v)) {
            ++bad_count[c];
            const std::array<int, 3> idx{i, j, k};
            for (int a = 0; a < 3; ++a) lo[a] = std::min(lo[a], idx[a]), hi[a] = std::max(hi[a], idx[a]);
          } else if (std::abs(v) * scale > largest) {
            largest = std::abs(v) * scale, big_c = c, big = {i, j, k};
          }
        }
  }
  auto material_name = [&](const Vec3& at) { return scene_.materials[static_cast<std::size_t>(material_at(scene_, at))].name; };
  if (hi[0] >= 0) {
    const int first = static_cast<int>(std::find_if(bad_count.begin(), bad_count.end(), [](int n) { return n > 0; }) -
                                       bad_count.begin());
    std::array<int, 3> mid{};
    for (int a = 0; a < 3; ++a) mid[a] = (lo[a] + hi[a]) / 2;
    const Vec3 at = yee_position(grid_, static_cast<Component>(first), mid[0], mid[1], mid[2]);
    return fmt::format("non-finite fields ({} first) over cells ({}..{}, {}..{}, {}..{}), centred at cell ({}, {}, {}), "
                       "position ({:.4g}, {:.4g}, {:.4g}) nm, in '{}'",
                       names[first], lo[0], hi[0], lo[1], hi[1], lo[2], hi[2], mid[0], mid[1], mid[2], at[0] * 1e9,
                       at[1] * 1e9, at[2] * 1e9, material_name(at));
  }
  const Vec3 at = yee_position(grid_, static_cast<Component>(big_c), big[0], big[1], big[2]);
  // Growth inside the absorbing layers is the absorber's doing (docs/reliability.md row 50): say so.
  std::string layers;
  for (int a = 0; a < 3; ++a) {
    const int cells = scene_.domain.cpml.cells;
    const bool low = scene_.domain.edges[2 * a] == EdgeKind::cpml && big[a] < cells;
    const bool high = scene_.domain.edges[2 * a + 1] == EdgeKind::cpml && big[a] >= L.n[a] - cells;
    if (low || high) layers += std::string(layers.empty() ? "" : " and ") + "xyz"[a];
  }
  if (!layers.empty()) layers = ", inside the absorbing layers of " + layers;
  return fmt::format("largest field {} = {:.4g} at cell ({}, {}, {}), position ({:.4g}, {:.4g}, {:.4g}) nm, in '{}'{}",
                     names[big_c], fields_.c[big_c][L.at(big[0], big[1], big[2])], big[0], big[1], big[2], at[0] * 1e9,
                     at[1] * 1e9, at[2] * 1e9, material_name(at), layers);
}

RunResults Simulation::run(const std::function<void(const Progress&)>& progress,
                           const std::function<bool()>& between_steps) {
  run_time_loop({scene_.stop, dt_, sources_end_time(), summary().steps, grid_.cell_count(),
                 growth_window_steps(scene_, dt_)},
                {n_, peak_energy_, last_energy_, wall_seconds_, stop_reason_}, [&] { step(); },
                [&] { return field_energy(); }, progress, between_steps);
  return results();
}

RunResults Simulation::results() const { return results(nullptr); }

RunResults Simulation::results(const Simulation* imaginary) const {
  RunResults r;
  r.summary.steps = n_;
  r.summary.time_step = dt_;
  r.summary.simulated_time = n_ * dt_;
  r.summary.wall_seconds = wall_seconds_;
  r.summary.cell_updates_per_second = wall_seconds_ > 0 ? n_ * static_cast<double>(grid_.cell_count()) / wall_seconds_ : 0;
  r.summary.stop_reason = stop_reason_;
  r.summary.final_energy_fraction = peak_energy_ > 0 ? last_energy_ / peak_energy_ : 0;
  if (stop_reason_ == "diverged") r.summary.divergence = describe_largest_field();
  r.summary.sources_end_time = sources_end_time();
  r.grid_x = grid_.nodes[0];
  r.grid_y = grid_.nodes[1];
  r.grid_z = grid_.nodes[2];
  for (const auto& m : scene_.materials) r.material_names.push_back(m.name);
  r.material_map = cell_material_map(scene_, grid_);
  r.source_omegas = all_omegas_;
  r.source_spectra = source_dft_;
  r.incident_spectra = incident_dft_;
  r.tunnelling_gaps = tunnelling_gaps_;
  ResultInputs in{all_omegas_, incident_dft_, {}};
  for (int a = 0; a < 3; ++a) in.bloch_phases[a] = imaginary ? bloch_phase(grid_, scene_.domain, a) : 0.0;
  for (std::size_t i = 0; i < recorders_.size(); ++i)
    recorders_[i]->add_result(r, in, imaginary ? imaginary->recorders_.at(i).get() : nullptr);
  return r;
}

}  // namespace yeegap::solver
