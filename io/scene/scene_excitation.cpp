// The `excitation` list: the sources of a run. Each item holds one source; this version knows the
// point dipole, driven by a pulse over a band or by a continuous wave with a smooth turn-on, the
// tfsf box, and the plane wave of a Bloch cell (scene_plane_wave.cpp).
#include <cmath>
#include <tuple>

#include <fmt/format.h>

#include "base/constants.h"
#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"

namespace yeegap::io {
namespace {

// A continuous wave with no 'ramp' turns on over this many periods. Common practice: a turn-on of
// several periods keeps the source's spectrum narrow around its frequency.
constexpr double default_ramp_periods = 10.0;
// Default peak moment, the value scene.h uses: about 0.006 e nm, an order of a molecular dipole.
// Its size only scales the fields, since everything is linear.
constexpr double default_moment = 1e-30;  // C m

solver::Waveform read_waveform(const Node& block) {
  solver::Waveform w;
  const bool band = block.has("band"), cw = block.has("frequency");
  if (band && cw)
    block.fail_key("frequency", fmt::format("{}: give either 'band' (a pulse) or 'frequency' (a continuous wave), "
                                            "not both", block.path()));
  if (!band && !cw)
    block.fail("missing key 'band' (a pulse, e.g. 'band: {from: 500 nm, to: 800 nm}') or 'frequency' "
               "(a continuous wave, e.g. 'frequency: 600 nm')");
  if (band) {
    if (block.has("ramp"))
      block.fail_key("ramp", fmt::format("{}: 'ramp' applies to a continuous wave ('frequency'), not to a pulse "
                                         "over a band", block.path()));
    w.kind = solver::Waveform::Kind::pulse;
    std::tie(w.omega_min, w.omega_max) = read_band(*block.get("band"));
    return w;
  }
  w.kind = solver::Waveform::Kind::continuous;
  w.omega_min = w.omega_max = read_omega(*block.get("frequency"));
  const double period = 2.0 * constants::pi / w.omega_min;
  w.ramp_time = default_ramp_periods * period;
  if (auto ramp = block.get("ramp")) w.ramp_time = read_positive_time(*ramp);
  return w;
}

solver::DipoleSpec read_dipole(const Node& block, const solver::DomainSpec& domain) {
  block.allow({"position", "direction", "moment", "band", "frequency", "ramp"});
  if (!block.is_map()) block.fail("must be a block with position, direction and band or frequency");
  solver::DipoleSpec d;
  d.where = block.where();
  const Node position = block.require("position");
  d.position = read_position(position);
  check_inside_domain(position, d.position, domain);
  d.direction = read_direction(block.require("direction"));
  d.moment = default_moment;
  if (auto moment = block.get("moment")) d.moment = read_dipole_moment(*moment);
  d.waveform = read_waveform(block);
  block.done();
  return d;
}

// A box lit by a plane wave travelling along a grid axis; the incident field has unit amplitude
// (1 V/m scale: everything is linear, and cross sections are normalised by the incident intensity).
solver::PlaneWaveSpec read_tfsf(const Node& block, const solver::DomainSpec& domain) {
  block.allow({"box", "direction", "polarization", "band", "frequency", "ramp"});
  if (!block.is_map()) block.fail("must be a block with box, direction, polarization and band or frequency");
  solver::PlaneWaveSpec w;
  w.where = block.where();
  w.box = read_corners(block.require("box"), domain, /*closed=*/true);
  const Node direction = block.require("direction");
  const Vec3 dir = read_direction(direction);
  w.axis = -1;
  for (int a = 0; a < 3; ++a)
    if (std::abs(std::abs(dir[a]) - 1.0) < 1e-12) w.axis = a, w.sign = dir[a] > 0 ? 1 : -1;
  if (w.axis < 0)
    direction.fail(fmt::format("this version sends plane waves along a grid axis only: x, -x, y, -y, z or -z, got {}",
                               direction.found()));
  const Node pol = block.require("polarization");
  w.polarization = read_direction(pol);
  if (std::abs(w.polarization[w.axis]) > 1e-9)
    pol.fail(fmt::format("the electric field must be perpendicular to the direction of travel ({}), got {}",
                         direction.found(), pol.found()));
  w.waveform = read_waveform(block);
  block.done();
  return w;
}

// The box's incident wave travels on a 1D line of the background's eps_inf alone: in a medium with
// poles or a conductivity the wave in the box would not be the line's, and an empty box would
// "scatter" (6 nm^2 at 500 nm in library water, against 1e-10 for a constant index). Refused, with
// the constant index that stands in for it at the band's centre.
void refuse_dispersive_background(const Node& tfsf, const solver::Scene& scene) {
  const solver::MaterialSpec& bg = scene.materials.at(static_cast<std::size_t>(scene.domain.background));
  if (!bg.poles.dispersive() && bg.poles.conductivity == 0) return;
  const solver::Waveform& w = scene.plane_waves.back().waveform;
  const double omega = 0.5 * (w.omega_min + w.omega_max);  // a continuous wave: both are its frequency
  const double n = std::sqrt(materials::permittivity(bg.poles, omega)).real();
  tfsf.fail(fmt::format("the background '{}' (domain.background) has {}: a tfsf box feeds its plane wave for a plain "
                        "medium, so the wave would not match it. Give the background a constant index, e.g. "
                        "'{}: {{index: {:.4g}}}' (its index at {:.4g} nm, the band's centre), or use a dipole",
                        bg.name, bg.poles.dispersive() ? "poles (a dispersive model)" : "a conductivity", bg.name, n,
                        2 * constants::pi * constants::c0 / omega * 1e9));
}

}  // namespace

void read_excitation(const Node& list, solver::Scene& scene) {
  const std::vector<Node> items = list.items_or_single();
  if (items.empty()) list.fail("needs at least one source, e.g. '- dipole: {position: ..., direction: z, band: ...}'");
  for (const Node& item : items) {
    item.allow({"dipole", "tfsf", "plane_wave"}, /*planned=*/{"beam"});
    if (!item.is_map() || item.entries().size() != 1)
      item.fail(fmt::format("each item holds exactly one source, e.g. '- dipole: {{...}}', got {}", item.found()));
    if (item.has("dipole")) scene.dipoles.push_back(read_dipole(item.require("dipole"), scene.domain));
    else if (item.has("tfsf")) {
      scene.plane_waves.push_back(read_tfsf(item.require("tfsf"), scene.domain));
      refuse_dispersive_background(item.require("tfsf"), scene);
    }
    else {
      if (!scene.bloch_waves.empty())
        item.fail_key("plane_wave", "a run takes one plane_wave; for several angles use 'angles' in one block");
      scene.bloch_waves.push_back(read_plane_wave(item.require("plane_wave"), scene));
    }
    item.done();
  }
}

}  // namespace yeegap::io
