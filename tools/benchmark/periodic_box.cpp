// Periodic box for the update rates (see periodic_box.h), its scene built in a few lines like a
// test's: a cube of `cells` cells of 10 nm (an invented demo size: any spacing runs at the same
// speed), periodic on all faces, one short dipole pulse at the centre.
#include "tools/benchmark/periodic_box.h"

#include <chrono>
#include <cmath>

#include "base/constants.h"
#include "materials/library.h"
#include "solver/engine/simulation.h"
#include "solver/outputs/recorders.h"
#include "tools/benchmark/fingerprint.h"
#include "tools/benchmark/timing.h"

namespace yeegap::benchmark {

namespace {

using solver::Component;
using solver::EdgeKind;

constexpr double cell_size = 10e-9;          // m
constexpr double wave_amplitude = 1.0;       // V/m of each initial plane wave
constexpr double pulse_wavelength_lo = 0.6e-6, pulse_wavelength_hi = 1.2e-6;  // m, the dipole's band

solver::Scene periodic_box(int cells, BoxFill fill) {
  solver::Scene s;
  s.file = "benchmark";
  s.title = "periodic box for the update-rate benchmark";
  s.domain.step = {cell_size, cell_size, cell_size};
  s.domain.size = {cells * cell_size, cells * cell_size, cells * cell_size};
  s.domain.edges.fill(EdgeKind::periodic);
  solver::MaterialSpec medium;
  medium.name = fill == BoxFill::gold ? "Au" : "vacuum";
  if (fill == BoxFill::gold) medium.poles = materials::find_material("Au")->poles;
  s.materials.push_back(medium);
  solver::DipoleSpec d;
  d.position = s.domain.center + Vec3{0.3 * cell_size, 0.2 * cell_size, 0.1 * cell_size};  // off the nodes: 8 taps
  d.direction = {0, 0, 1};
  d.waveform.omega_min = 2 * constants::pi * constants::c0 / pulse_wavelength_hi;
  d.waveform.omega_max = 2 * constants::pi * constants::c0 / pulse_wavelength_lo;
  s.dipoles.push_back(d);
  s.stop.max_steps = 1;  // run() is not used; step() is called directly
  return s;
}

// Three plane waves, one along each axis with a different polarization (z: Ex Hy, x: Ey Hz,
// y: Ez Hx), one wavelength per domain so they are periodic. Only approximately staggered in
// time; the benchmark needs non-zero, bounded fields, not a pure travelling wave.
void fill_plane_waves(solver::Fields& f, int cells) {
  const solver::BlockLayout& L = f.layout;
  const double kw = 2 * constants::pi / cells;  // per cell
  const double e = wave_amplitude, h = wave_amplitude / constants::eta0;
#pragma omp parallel for schedule(static)
  for (int k = 0; k < L.n[2]; ++k)
    for (int j = 0; j < L.n[1]; ++j)
      for (int i = 0; i < L.n[0]; ++i) {
        const std::ptrdiff_t o = L.at(i, j, k);
        f[Component::Ex][o] = static_cast<solver::real>(e * std::cos(kw * k));
        f[Component::Hy][o] = static_cast<solver::real>(h * std::cos(kw * (k + 0.5)));
        f[Component::Ey][o] = static_cast<solver::real>(e * std::cos(kw * i));
        f[Component::Hz][o] = static_cast<solver::real>(h * std::cos(kw * (i + 0.5)));
        f[Component::Ez][o] = static_cast<solver::real>(e * std::cos(kw * j));
        f[Component::Hx][o] = static_cast<solver::real>(h * std::cos(kw * (j + 0.5)));
      }
}

std::uint64_t hash_of(const solver::Fields& f) {
  std::uint64_t h = fingerprint_start;
  for (const auto& comp : f.c) h = fingerprint(h, comp.data(), comp.size() * sizeof(solver::real));
  return h;
}

// The field map of field_map_seconds_per_step(): the centre plane, the dipole's band.
solver::FieldMapSpec centre_plane_map(const solver::Scene& s) {
  solver::FieldMapSpec map;
  map.name = "centre plane";
  map.region.lo = {-0.5 * s.domain.size.x, -0.5 * s.domain.size.y, 0.0};
  map.region.hi = {0.5 * s.domain.size.x, 0.5 * s.domain.size.y, 0.0};
  const solver::Waveform& w = s.dipoles.front().waveform;
  for (int q = 0; q < field_map_frequencies; ++q)
    map.omegas.push_back(w.omega_min + (w.omega_max - w.omega_min) * q / (field_map_frequencies - 1));
  map.components = {Component::Ex, Component::Ey, Component::Ez, Component::Hx, Component::Hy, Component::Hz};
  return map;
}

}  // namespace

PeriodicBox::PeriodicBox(int cells, BoxFill fill)
    : sim_(std::make_unique<solver::Simulation>(periodic_box(cells, fill))) {
  fill_plane_waves(sim_->fields(), cells);
}

PeriodicBox::~PeriodicBox() = default;

void PeriodicBox::warm_up(int steps) {
  for (int s = 0; s < steps; ++s) sim_->step();
}

double PeriodicBox::timed_mcells_per_second(int steps) {
  const auto t0 = std::chrono::steady_clock::now();
  for (int s = 0; s < steps; ++s) sim_->step();
  return static_cast<double>(sim_->grid().cell_count()) * steps / seconds_since(t0) * 1e-6;
}

double PeriodicBox::field_map_seconds_per_step(int steps) {
  if (!map_)
    map_ = std::make_unique<solver::FieldMapRecorder>(centre_plane_map(sim_->scene()), sim_->grid(), sim_->fields().layout);
  // As the step samples: a DFT term every dft_sample_stride() steps, with that many steps' weight.
  const double dt = sim_->dt();
  const long stride = sim_->dft_sample_stride();
  const auto t0 = std::chrono::steady_clock::now();
  for (int n = 0; n < steps; ++n) {
    const bool now = n % stride == 0;
    map_->sample(sim_->fields(), false, {(n + 0.5) * dt, now, stride * dt});
    map_->sample(sim_->fields(), true, {(n + 1.0) * dt, now, stride * dt});
  }
  return seconds_since(t0) / steps;
}

std::uint64_t PeriodicBox::field_hash() const { return hash_of(sim_->fields()); }

}  // namespace yeegap::benchmark
