// Bloch run: preparation, lock-step time loop of the parts, and R, T, A (see bloch_run.h).
// Per step, halos first (they read the interiors of both parts, which are complete):
//   Bloch E halos -> real.step_h, imag.step_h -> incident problem step_h
//   Bloch H halos -> real.step_e, imag.step_e -> incident problem step_e
// The entry plane's H correction reads the incident E at step n and its E correction the incident
// H at n+1/2, which is why the incident problem advances each half step after the main one.
#include "solver/runs/bloch_run.h"

#include <algorithm>
#include <cmath>
#include <complex>
#include <set>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "materials/pole_set.h"
#include "solver/engine/bloch_halos.h"
#include "solver/outputs/diffraction_orders.h"
#include "solver/media/material_map.h"
#include "solver/engine/mesh_plan.h"
#include "solver/outputs/recorders.h"
#include "solver/engine/growth_watch.h"
#include "solver/engine/time_loop.h"

namespace yeegap::solver {

namespace {

// Widest band (half-width over the centre) a one-frequency run uses: a shorter pulse than this
// gains little, since the run's length is then set by the structure's ring-down.
constexpr double widest_relative_half_width = 0.1;

// Materials that fill the two ends of the domain along the wave's axis (the absorbers), sampled on
// a 5 x 5 lateral grid of each end plane: the media a wave can leave the cell through.
std::set<int> end_media(const Scene& s, int axis) {
  std::set<int> out;
  const DomainSpec& d = s.domain;
  const int b = (axis + 1) % 3, c = (axis + 2) % 3;
  for (int side : {-1, 1})
    for (int i = 0; i < 5; ++i)
      for (int j = 0; j < 5; ++j) {
        Vec3 p = d.center;
        p[axis] += side * 0.4999 * d.size[axis];
        p[b] += ((i + 0.5) / 5 - 0.5) * d.size[b];
        p[c] += ((j + 0.5) / 5 - 0.5) * d.size[c];
        out.insert(material_at(s, p));
      }
  return out;
}

// Band of the pulse of a one-frequency run. With k_par fixed, frequency omega_m = c k_par / n_m
// runs at grazing incidence in a lossless medium m (physics.md 3.7). Where m fills an end of the
// domain such a wave runs along the absorber, never leaves the cell, and the absorber barely takes
// it, so it must carry no power. Keeping every such omega_m at least two half-widths from the centre
// puts it where the Gaussian spectrum holds 1e-8 of its peak power (the band edges hold 1e-2,
// waveform.h). Media only between the ends (films, layers) are left out: there omega_m is not the
// edge of a continuum that reaches the absorbers (a 5 nm layer of n = 1.45 on a gold film in water
// at 72 deg would otherwise narrow the pulse 8-fold). Nearly lossless dispersive media (a library
// water) count with their index at the centre frequency.
void narrow_band(BlochWaveSpec& w, const Scene& s, double k_par) {
  const double w0 = w.reference_omega;
  double half = widest_relative_half_width * w0;
  for (int index : end_media(s, w.axis)) {
    const MaterialSpec& m = s.materials[static_cast<std::size_t>(index)];
    if (m.perfect_conductor) continue;
    const std::complex<double> n = materials::refractive_index(m.poles, w0);
    if (!(n.real() > 0) || n.imag() > 1e-3 * n.real()) continue;  // metals and lossy media: waves die there
    const double grazing = constants::c0 * k_par / n.real();
    if (grazing > 0) half = std::min(half, 0.5 * std::abs(grazing - w0));
  }
  if (!(half > 1e-4 * w0))
    throw RunError(fmt::format("{}: at {:.4g} deg the wave runs along one of the media (grazing) at the requested "
                               "frequency itself; pick another angle", w.where.location(), w.angle * 180 / constants::pi));
  w.waveform.kind = Waveform::Kind::pulse;
  w.waveform.omega_min = w0 - half;
  w.waveform.omega_max = w0 + half;
}

void fill_halos(Simulation* re, Simulation* im, bool electric) {
  if (im) fill_bloch_halos(re->fields(), im->fields(), re->grid(), re->scene().domain, electric);
}

FluxSpec plane_at(const std::string& name, const Grid& g, int axis, int node, const std::vector<double>& omegas) {
  FluxSpec f;
  f.name = name;
  for (int a = 0; a < 3; ++a) {
    f.region.lo[a] = a == axis ? g.nodes[a][node] : g.nodes[a].front();
    f.region.hi[a] = a == axis ? g.nodes[a][node] : g.nodes[a].back();
  }
  f.omegas = omegas;
  return f;
}

// Lateral area (m^2) of a flux plane normal to `axis`, as the flux recorder integrates it.
double plane_area(const Grid& g, const FluxSpec& f, int axis) {
  double area = 1;
  for (int a = 0; a < 3; ++a) {
    if (a == axis) continue;
    const auto r = node_range(g, a, f.region.lo[a], f.region.hi[a]);
    area *= g.nodes[a][r[1]] - g.nodes[a][r[0]];
  }
  return area;
}

// Cells the incident problem keeps beyond its entry plane before its own absorber: it only needs
// the wave's values at the plane, and a few clear cells keep the absorber's tiny reflection away.
constexpr int incident_margin = 4;

// Node coordinates of the incident problem along the axis: the main grid's from its absorber on the
// entry side to a few cells past the entry plane, then an absorber of the same cells (its own
// spacing repeated). Sets p.aux_offset (main index - incident index).
std::vector<double> incident_nodes(const Scene& main, const Grid& g, BlochWavePlan& p) {
  const auto& v = g.nodes[p.axis];
  const int n = g.n[p.axis], cells = main.domain.cpml.cells;
  std::vector<double> out;
  if (p.sign > 0) {
    const int last = std::min(n, p.entry + incident_margin);
    out.assign(v.begin(), v.begin() + last + 1);
    const double h = v[last] - v[last - 1];
    for (int i = 1; i <= cells; ++i) out.push_back(v[last] + i * h);
    p.aux_offset = 0;
  } else {
    const int first = std::max(0, p.entry - incident_margin);
    const double h = v[first + 1] - v[first];
    for (int i = cells; i >= 1; --i) out.push_back(v[first] - i * h);
    out.insert(out.end(), v.begin() + first, v.end());
    p.aux_offset = first - cells;
  }
  return out;
}

// The incident problem: one lateral cell of the main grid's lateral spacing, the main grid's
// nodes along the axis around the entry plane, the incident medium only, the same time step and
// absorber, and the Bloch phase per cell of the main grid (on an axis of several cells that phase
// is k h, which a one-cell axis reproduces with the wavevector 2 sin(k h / 2) / h: bloch_phase()).
Scene incident_scene(const Scene& main, const Grid& g, BlochWavePlan& p, const std::vector<double>& omegas,
                     double dt) {
  Scene s;
  s.file = main.file;
  s.title = "incident wave";
  DomainSpec& d = s.domain;
  d = main.domain;
  d.refine.clear();
  d.gap_cells = 0;
  d.time_step = dt;
  d.background = 0;
  for (int a = 0; a < 3; ++a) {
    if (a == p.axis) {
      d.nodes[a] = incident_nodes(main, g, p);
      d.size[a] = d.nodes[a].back() - d.nodes[a].front();
      d.center[a] = 0.5 * (d.nodes[a].back() + d.nodes[a].front());
      continue;
    }
    const double h = g.primal(a, 0);
    d.nodes[a] = {0.0, h};
    d.size[a] = h, d.center[a] = 0.5 * h, d.step[a] = h;
    const double k = main.domain.bloch_wavevector[a];
    d.bloch_wavevector[a] = g.n[a] > 1 ? 2 * std::sin(0.5 * k * h) / h : k;
  }
  MaterialSpec m = main.materials[p.material];
  s.materials = {m};
  // Not run by this problem (the sheet is its source), but they give its absorber the band, and so
  // the angle, to design for (absorber_angle.h): the fed wave must not carry the layer's echo.
  s.bloch_waves = main.bloch_waves;
  s.fluxes = {plane_at("incident", Grid::from_nodes(d.nodes, d), p.axis, p.entry - p.aux_offset, omegas)};
  s.stop = main.stop;
  return s;
}

// The names of the field maps an `orders` output adds on the reflected and transmitted planes (a
// space keeps them apart from any name a scene may give).
constexpr const char* orders_reflected_map = "orders reflected";
constexpr const char* orders_transmitted_map = "orders transmitted";

// The material filling a plane normal to the wave's axis at `node`, or -1 when the lateral cells do
// not all hold the same one (the structure reaches the plane).
int plane_material(const Scene& s, const Grid& g, const BlochWavePlan& p, int node) {
  Vec3 point;
  point[p.axis] = g.nodes[p.axis][node];
  int found = -1;
  for (int j = 0; j < g.n[p.lateral_c]; ++j)
    for (int i = 0; i < g.n[p.lateral_b]; ++i) {
      point[p.lateral_b] = 0.5 * (g.nodes[p.lateral_b][i] + g.nodes[p.lateral_b][i + 1]);
      point[p.lateral_c] = 0.5 * (g.nodes[p.lateral_c][j] + g.nodes[p.lateral_c][j + 1]);
      const int m = material_at(s, point);
      if (found >= 0 && m != found) return -1;
      found = m;
    }
  return found;
}

bool lossless(const MaterialSpec& m) {
  return !m.perfect_conductor && !m.poles.dispersive() && m.poles.conductivity == 0 && m.poles.eps_inf > 0;
}

// Index of the transmitted orders' medium; 0 when it absorbs (no transmitted orders then).
// Throws RunError when either plane is not in one homogeneous medium.
double orders_transmitted_index(const Scene& s, const Grid& g, const BlochWavePlan& p) {
  const OrdersSpec& o = s.orders.front();
  for (int node : {p.reflected, p.transmitted})
    if (plane_material(s, g, p, node) < 0)
      throw RunError(fmt::format("{}: diffraction orders need a homogeneous medium on the {} plane ({} = {:.6g} nm), "
                                 "but the structure reaches it; leave a few cells of one medium there",
                                 o.where.location(), node == p.reflected ? "reflected" : "transmitted", "xyz"[p.axis],
                                 g.nodes[p.axis][node] * 1e9));
  const MaterialSpec& m = s.materials[plane_material(s, g, p, p.transmitted)];
  return lossless(m) ? std::sqrt(m.poles.eps_inf) : 0.0;
}

FieldMapSpec order_map(const char* name, const Grid& g, const BlochWavePlan& p, int node,
                       const std::vector<double>& omegas) {
  FieldMapSpec m;
  m.name = name;
  m.region = plane_at(name, g, p.axis, node, omegas).region;
  m.omegas = omegas;
  const auto c = order_components(p.axis);
  m.components.assign(c.begin(), c.end());
  return m;
}

// The run's own outputs on the reflected and transmitted planes: the power through each, and the
// tangential fields the diffraction orders are computed from. Parts of the run, not of the scene.
struct WaveOutputs {
  std::vector<FluxSpec> planes;          // reflected, transmitted
  std::vector<FieldMapSpec> order_maps;  // reflected, and transmitted where that medium is lossless
};

WaveOutputs wave_outputs(const Scene& s, const Grid& g, const BlochWavePlan& p) {
  const BlochWaveSpec& w = s.bloch_waves.front();
  WaveOutputs o;
  o.planes = {plane_at("reflected", g, p.axis, p.reflected, w.omegas),
              plane_at("transmitted", g, p.axis, p.transmitted, w.omegas)};
  if (!s.orders.empty()) {
    o.order_maps.push_back(order_map(orders_reflected_map, g, p, p.reflected, w.omegas));
    if (orders_transmitted_index(s, g, p) > 0)
      o.order_maps.push_back(order_map(orders_transmitted_map, g, p, p.transmitted, w.omegas));
  }
  return o;
}

}  // namespace

Scene BlochRun::prepare(const Scene& original) {
  Scene s = original;
  if (s.bloch_waves.size() > 1) throw RunError(s.file + ": at most one plane_wave per run");
  if (!s.bloch_waves.empty()) {
    BlochWaveSpec& w = s.bloch_waves.front();
    if (!w.scan_angles.empty()) throw RunError(s.file + ": an angle scan runs through run_angle_scan(), not BlochRun");
    if (!s.plane_waves.empty())
      throw RunError(fmt::format("{}: a plane_wave (Bloch cell) and a tfsf box cannot share a run", w.where.location()));
    const Grid g = plan_mesh(s).grid;
    const BlochWavePlan p = plan_bloch_wave(w, s, g);
    s.domain.bloch_wavevector = p.k_parallel;
    if (w.single_frequency) narrow_band(w, s, norm(p.k_parallel));
    if (s.domain.cpml.alpha_max == 0)  // the CFS shift Simulation derives from its own sources
      s.domain.cpml.alpha_max = 0.1 * (w.waveform.omega_min > 0 ? w.waveform.omega_min : w.waveform.omega_max) *
                                    constants::eps0;
    if (s.orders.size() > 1) throw RunError(fmt::format("{}: at most one orders output", s.orders[1].where.location()));
    if (!s.orders.empty()) orders_transmitted_index(s, g, p);  // refuses planes the structure reaches
  } else if (!s.orders.empty()) {
    throw RunError(fmt::format("{}: diffraction orders need a plane_wave", s.orders.front().where.location()));
  }
  if (needs_imaginary_part(s.domain)) {
    if (!s.cross_sections.empty() || !s.far_fields.empty() || !s.decay_rates.empty() || !s.plane_waves.empty())
      throw RunError(fmt::format("{}: cross_sections, far_field, decay_rate and tfsf assume real fields; they cannot "
                                 "run in a Bloch cell with a non-zero wavevector", s.file));
    // The time step: the scene's own choice, lowered where the fixed lateral wavenumber needs it.
    const Grid g = plan_mesh(s).grid;
    const double limit = bloch_courant_limit(g, s.domain);
    const double own = Simulation::plan(s).time_step;
    if (s.domain.time_step > limit)
      throw RunError(fmt::format("{}: domain.time_step {:.6g} s is above the limit {:.6g} s with the Bloch wavevector",
                                 s.file, s.domain.time_step, limit));
    s.domain.time_step = std::min(own, s.domain.stability_fraction * limit);
  }
  return s;
}

BlochRun::BlochRun(const Scene& scene) : scene_(prepare(scene)) {
  re_ = std::make_unique<Simulation>(scene_);
  const bool complex = needs_imaginary_part(scene_.domain);
  if (complex) {
    Scene imag = scene_;
    imag.dipoles.clear();  // a real source drives the real part; the imaginary part follows by the halos
    im_ = std::make_unique<Simulation>(imag);
  }
  if (scene_.bloch_waves.empty()) return;
  wave_ = true;
  const BlochWaveSpec& w = scene_.bloch_waves.front();
  const Grid& g = re_->grid();
  plan_ = plan_bloch_wave(w, scene_, g);
  if (!scene_.orders.empty()) orders_index_ = orders_transmitted_index(scene_, g, plan_);
  const WaveOutputs own = wave_outputs(scene_, g, plan_);
  plane_specs_ = own.planes;
  for (int part = 0; part < (complex ? 2 : 1); ++part) {
    Simulation& m = part == 0 ? *re_ : *im_;
    for (const FluxSpec& f : own.planes)
      planes_[part].push_back(&static_cast<FluxRecorder&>(
          m.add_recorder(std::make_unique<FluxRecorder>(f, m.grid(), m.fields().layout))));
    for (const FieldMapSpec& o : own.order_maps)
      order_maps_[part].push_back(&static_cast<FieldMapRecorder&>(
          m.add_recorder(std::make_unique<FieldMapRecorder>(o, m.grid(), m.fields().layout))));
  }
  std::set<double> omegas(w.omegas.begin(), w.omegas.end());
  for (const FluxSpec& f : scene_.fluxes) omegas.insert(f.omegas.begin(), f.omegas.end());
  const Scene inc = incident_scene(scene_, g, plan_, {omegas.begin(), omegas.end()}, re_->dt());
  inc_re_ = std::make_unique<Simulation>(inc);
  if (complex) inc_im_ = std::make_unique<Simulation>(inc);
  BlochWavePlan aux = plan_;  // the same plane in the incident problem's own indices
  aux.material = 0;
  aux.entry -= plan_.aux_offset;
  aux.sheet -= plan_.aux_offset;
  aux.aux_offset = 0;
  for (int part = 0; part < (complex ? 2 : 1); ++part) {
    Simulation& a = part == 0 ? *inc_re_ : *inc_im_;
    a.add_stage(std::make_shared<BlochWaveSheet>(aux, a.grid(), a.fields().layout, a.curls(), a.e_update_coefficients(),
                                                 a.scene().domain, w.waveform, part));
    Simulation& m = part == 0 ? *re_ : *im_;
    m.add_stage(std::make_shared<BlochWaveEntry>(plan_, m.grid(), m.fields().layout, m.curls(), m.e_update_coefficients(),
                                                 m.material_index(), m.scene().domain, part, &inc_re_->fields(),
                                                 inc_im_ ? &inc_im_->fields() : nullptr));
  }
}

BlochRun::~BlochRun() = default;

void BlochRun::step() {
  Simulation* re = re_.get();
  Simulation* im = im_.get();
  fill_halos(re, im, true);
  re->step_h();
  if (im) im->step_h();
  if (inc_re_) {
    fill_halos(inc_re_.get(), inc_im_.get(), true);
    inc_re_->step_h();
    if (inc_im_) inc_im_->step_h();
  }
  fill_halos(re, im, false);
  re->step_e();
  if (im) im->step_e();
  if (inc_re_) {
    fill_halos(inc_re_.get(), inc_im_.get(), false);
    inc_re_->step_e();
    if (inc_im_) inc_im_->step_e();
  }
  ++n_;
}

double BlochRun::sources_end_time() const {
  double source_end = 0;
  for (const auto& d : scene_.dipoles) source_end = std::max(source_end, SourceTime(d.waveform).end_time());
  for (const auto& w : scene_.bloch_waves) source_end = std::max(source_end, SourceTime(w.waveform).end_time());
  return source_end;
}

RunResults BlochRun::run(const std::function<void(const Progress&)>& progress,
                         const std::function<bool()>& between_steps) {
  run_time_loop({scene_.stop, re_->dt(), sources_end_time(), plan(scene_).steps, re_->grid().cell_count(),
                 growth_window_steps(scene_, re_->dt())},
                {n_, peak_energy_, last_energy_, wall_seconds_, stop_reason_}, [&] { step(); },
                [&] { return re_->field_energy() + (im_ ? im_->field_energy() : 0.0); }, progress, between_steps);
  return results();
}

RunResults BlochRun::results() const {
  RunResults r = re_->results(im_.get());
  const double dt = re_->dt();
  r.summary.steps = n_;
  r.summary.simulated_time = n_ * dt;
  r.summary.wall_seconds = wall_seconds_;
  r.summary.cell_updates_per_second =
      wall_seconds_ > 0 ? n_ * static_cast<double>(re_->grid().cell_count()) * (im_ ? 2 : 1) / wall_seconds_ : 0;
  r.summary.stop_reason = stop_reason_;
  r.summary.final_energy_fraction = peak_energy_ > 0 ? last_energy_ / peak_energy_ : 0;
  r.summary.divergence = stop_reason_ == "diverged" ? re_->describe_largest_field() : "";
  r.summary.sources_end_time = sources_end_time();
  if (!wave_) return r;

  const Grid& g = re_->grid();
  const BlochWaveSpec& w = scene_.bloch_waves.front();
  // Incident intensity per frequency (W s^2 / m^2 in DFT units): the incident problem's power
  // through its entry plane over that plane's area, counted along the travel.
  const FluxResult inc = inc_re_->results(inc_im_.get()).fluxes.front();
  const double inc_area = plane_area(inc_re_->grid(), inc_re_->scene().fluxes.front(), plan_.axis);
  auto intensity = [&](double omega) {
    const auto it = std::find(inc.omegas.begin(), inc.omegas.end(), omega);
    YG_CHECK(it != inc.omegas.end(), "the incident problem records every output frequency");
    return plan_.sign * inc.power[it - inc.omegas.begin()] / inc_area;
  };
  for (std::size_t i = 0; i < r.fluxes.size(); ++i) {
    FluxResult& f = r.fluxes[i];
    if (f.closed || f.normal_axis != plan_.axis) continue;
    const double area = plane_area(g, scene_.fluxes[i], plan_.axis);
    for (std::size_t q = 0; q < f.omegas.size(); ++q)
      f.fraction.push_back(plan_.sign * f.power[q] / (intensity(f.omegas[q]) * area));
  }
  const FluxResult refl = planes_[0][0]->result(im_ ? planes_[1][0] : nullptr);
  const FluxResult trans = planes_[0][1]->result(im_ ? planes_[1][1] : nullptr);
  const double area = plane_area(g, plane_specs_[0], plan_.axis);
  ReflectanceResult out;
  out.name = "plane_wave";
  out.p_polarized = w.p_polarized;
  out.incident_index = plan_.index;
  const double k = norm(plan_.k_parallel);
  for (std::size_t q = 0; q < w.omegas.size(); ++q) {
    const double omega = w.omegas[q];
    const double p_inc = intensity(omega) * area;
    out.omegas.push_back(omega);
    out.angles.push_back(bloch_wave_angle(k, plan_.index, omega));
    out.k_parallel.push_back(k);
    const double R = -plan_.sign * refl.power[q] / p_inc, T = plan_.sign * trans.power[q] / p_inc;
    out.reflectance.push_back(R);
    out.transmittance.push_back(T);
    out.absorptance.push_back(1 - R - T);
  }
  if (!scene_.orders.empty()) r.orders.push_back(orders(intensity));
  r.reflectance.push_back(std::move(out));
  return r;
}

DiffractionOrdersResult BlochRun::orders(const std::function<double(double)>& intensity) const {
  const Grid& g = re_->grid();
  const BlochWaveSpec& w = scene_.bloch_waves.front();
  OrderLattice lattice;
  lattice.axis = plan_.axis;
  lattice.lateral = {plan_.lateral_b, plan_.lateral_c};
  for (int q = 0; q < 2; ++q) {
    lattice.cells[q] = g.n[lattice.lateral[q]];
    lattice.step[q] = g.primal(lattice.lateral[q], 0);
  }
  lattice.k_parallel = plan_.k_parallel;
  DiffractionOrdersResult out;
  out.name = scene_.orders.front().name;
  out.axis = plan_.axis;
  out.period = lattice.period();
  out.diffracting = {lattice.cells[0] > 1, lattice.cells[1] > 1};
  out.incident_index = plan_.index;
  out.transmitted_index = orders_index_;
  const double k = norm(plan_.k_parallel);
  // Reflected orders travel against the incident wave, transmitted ones with it.
  std::array<double, 3> phases{};
  for (int a = 0; a < 3; ++a) phases[a] = im_ ? bloch_phase(g, scene_.domain, a) : 0.0;
  std::vector<FieldMapResult> planes;
  for (std::size_t i = 0; i < order_maps_[0].size(); ++i)
    planes.push_back(order_maps_[0][i]->result(im_ ? order_maps_[1][i] : nullptr, phases));
  const FieldMapResult* maps[2] = {&planes.at(0), planes.size() > 1 ? &planes[1] : nullptr};
  for (std::size_t q = 0; q < w.omegas.size(); ++q) {
    const double omega = w.omegas[q], incident = intensity(omega);
    out.omegas.push_back(omega);
    out.incidence_angles.push_back(bloch_wave_angle(k, plan_.index, omega));
    double sums[2] = {0, 0};
    for (int side = 0; side < 2; ++side) {
      if (!maps[side]) continue;
      const int travel = side == 0 ? -plan_.sign : plan_.sign;
      for (const OrderPower& o : plane_orders(*maps[side], q, lattice, side == 0 ? plan_.index : orders_index_, travel)) {
        out.row.push_back(static_cast<int>(q));
        out.side.push_back(side == 0 ? -1 : +1);
        out.order_b.push_back(o.m_b);
        out.order_c.push_back(o.m_c);
        out.direction.push_back(o.direction);
        out.angle.push_back(o.angle);
        out.efficiency.push_back(o.intensity / incident);
        sums[side] += o.intensity / incident;
      }
    }
    out.reflected_sum.push_back(sums[0]);
    out.transmitted_sum.push_back(sums[1]);
  }
  return out;
}

ModelSummary BlochRun::plan(const Scene& scene) {
  const Scene s = prepare(scene);
  Scene with_own = s;  // the run's own planes count in the memory estimate
  if (!s.bloch_waves.empty()) {
    const Grid g = plan_mesh(s).grid;
    WaveOutputs own = wave_outputs(s, g, plan_bloch_wave(s.bloch_waves.front(), s, g));
    with_own.fluxes.insert(with_own.fluxes.end(), own.planes.begin(), own.planes.end());
    with_own.field_maps.insert(with_own.field_maps.end(), own.order_maps.begin(), own.order_maps.end());
  }
  ModelSummary m = Simulation::plan(with_own);
  const bool complex = needs_imaginary_part(s.domain);
  if (complex) {
    m.memory_bytes *= 2;
    m.mesh_notes.push_back(fmt::format("complex fields (Bloch wavevector ({:.6g}, {:.6g}, {:.6g}) rad/um): real and "
                                       "imaginary parts, twice the memory and time",
                                       s.domain.bloch_wavevector.x * 1e-6, s.domain.bloch_wavevector.y * 1e-6,
                                       s.domain.bloch_wavevector.z * 1e-6));
  }
  if (!s.bloch_waves.empty()) {
    const BlochWaveSpec& w = s.bloch_waves.front();
    const Grid g = plan_mesh(s).grid;
    const BlochWavePlan p = plan_bloch_wave(w, s, g);
    if (m.steps_estimated) m.steps += static_cast<long>(std::ceil(SourceTime(w.waveform).end_time() / m.time_step));
    BlochWavePlan q = p;
    const std::size_t aux_cells = incident_nodes(s, g, q).size() - 1;
    m.mesh_notes.push_back(fmt::format("plane wave from the {} side along {} in '{}' (n = {:.4g}) at {:.4g} deg, "
                                       "entry plane at node {}; incident wave from an auxiliary 1 x 1 x {} problem",
                                       w.sign > 0 ? "low" : "high", "xyz"[w.axis], s.materials[p.material].name, p.index,
                                       w.angle * 180 / constants::pi, p.entry, aux_cells));
  }
  return m;
}

}  // namespace yeegap::solver
