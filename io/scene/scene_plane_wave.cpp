// The `plane_wave` excitation: a plane wave lighting a Bloch-periodic cell (a film stack, a
// grating) at any angle, one way only, from the low or high side of one axis; s or p; a band (a
// table of R, T, A per frequency, each at its own angle: physics.md 3.7) or one wavelength, with
// an optional list of angles (an angle scan, one short run per angle).
#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"
#include "io/written_units.h"

namespace yeegap::io {
namespace {

// Rows of the R, T, A table across a band when the scene gives no 'frequencies'.
constexpr long default_band_rows = 51;
// Angles of incidence at or beyond this many degrees are refused: the wave would run along the
// film and never leave the cell (physics.md 3.7: the method degrades at grazing incidence).
constexpr double largest_angle_deg = 89.0;

double read_incidence_angle(const Node& v) {
  const double a = read_angle(v);
  if (!(a >= 0 && a < largest_angle_deg * constants::pi / 180))
    v.fail(fmt::format("must be an angle of incidence from 0 up to {} deg (from the axis), got '{}'", largest_angle_deg,
                       v.text()));
  return a;
}

std::vector<double> read_angles(const Node& v) {
  std::vector<double> out;
  if (v.is_list()) {
    for (const Node& item : v.items()) out.push_back(read_incidence_angle(item));
    if (out.empty()) v.fail("must hold at least one angle");
    return out;
  }
  if (!v.is_map()) v.fail(fmt::format("must be a list of angles or {{from, to, count}}, got {}", v.found()));
  v.allow({"from", "to", "count"});
  const double a = read_incidence_angle(v.require("from"));
  const Node to_node = v.require("to");
  const double b = read_incidence_angle(to_node);
  if (a == b) to_node.fail(fmt::format("must differ from 'from' for a range, got '{}'", to_node.text()));
  const Node count_node = v.require("count");
  const long count = read_whole_number(count_node, 2);
  if (count > 100000) count_node.fail(fmt::format("must be at most 100000, got '{}'", count_node.text()));
  for (long i = 0; i < count; ++i) out.push_back(a + (b - a) * static_cast<double>(i) / static_cast<double>(count - 1));
  v.done();
  return out;
}

}  // namespace

solver::BlochWaveSpec read_plane_wave(const Node& block, const solver::Scene& scene) {
  block.allow({"axis", "from", "angle", "angles", "azimuth", "polarization", "band", "frequencies", "wavelength",
               "reference", "position"});
  if (!block.is_map())
    block.fail("must be a block with polarization, angle (or angles) and band or wavelength, e.g. "
               "'{from: low, angle: 45 deg, polarization: p, wavelength: 633 nm}'");
  solver::BlochWaveSpec w;
  w.where = block.where();
  if (auto axis = block.get("axis")) w.axis = read_axis(*axis);
  if (auto from = block.get("from")) w.sign = read_word(*from, {"low", "high"}) == "low" ? +1 : -1;
  const Node pol = block.require("polarization");
  w.p_polarized = read_word(pol, {"p", "s"}) == "p";
  if (auto az = block.get("azimuth")) w.azimuth = read_angle(*az);

  const bool band = block.has("band"), single = block.has("wavelength");
  if (band == single)
    block.fail(band ? "give either 'band' (a pulse and a table of R, T, A over it) or 'wavelength' (one wavelength), "
                      "not both"
                    : "missing key 'band' (e.g. 'band: {from: 500 nm, to: 800 nm}') or 'wavelength' (e.g. "
                      "'wavelength: 633 nm')");
  const bool scan = block.has("angles");
  if (scan && block.has("angle"))
    block.fail_key("angles", "give either 'angle' (one run) or 'angles' (a scan), not both");
  if (scan && !single)
    block.fail_key("angles", "an angle scan runs at one 'wavelength' (each angle is its own short run); a 'band' "
                             "belongs to a single angle");
  if (scan) w.scan_angles = read_angles(*block.get("angles"));
  else if (auto a = block.get("angle")) w.angle = read_incidence_angle(*a);
  if (scan) w.angle = w.scan_angles.front();

  w.waveform.kind = solver::Waveform::Kind::pulse;
  if (band) {
    std::tie(w.waveform.omega_min, w.waveform.omega_max) = read_band(*block.get("band"));
    if (auto f = block.get("frequencies")) {
      w.omegas = read_frequencies(*f);
      for (const double o : w.omegas)
        if (o < w.waveform.omega_min * (1 - 1e-9) || o > w.waveform.omega_max * (1 + 1e-9))
          f->fail("every frequency of the table must lie inside the band");
    } else {
      for (long i = 0; i < default_band_rows; ++i)
        w.omegas.push_back(w.waveform.omega_min + (w.waveform.omega_max - w.waveform.omega_min) * static_cast<double>(i) /
                                                      static_cast<double>(default_band_rows - 1));
    }
    w.reference_omega = 0.5 * (w.waveform.omega_min + w.waveform.omega_max);
    if (auto r = block.get("reference")) w.reference_omega = read_omega(*r);
  } else {
    if (block.has("frequencies"))
      block.fail_key("frequencies", "'frequencies' goes with a 'band'; with 'wavelength' the table has that one row");
    if (block.has("reference"))
      block.fail_key("reference", "with 'wavelength' the angle holds at that wavelength; 'reference' goes with a band");
    w.reference_omega = read_omega(*block.get("wavelength"));
    w.omegas = {w.reference_omega};
    w.single_frequency = true;  // the solver chooses the pulse's band from the angle
    w.waveform.omega_min = 0.95 * w.reference_omega;
    w.waveform.omega_max = 1.05 * w.reference_omega;
  }
  if (auto pos = block.get("position")) {
    w.position = read_length(*pos);
    w.position_given = true;
    const solver::Region box = domain_bounds(scene.domain);
    if (w.position <= box.lo[w.axis] || w.position >= box.hi[w.axis])
      pos->fail(fmt::format("the entry plane {} = {} lies outside the domain", "xyz"[w.axis], format_length(w.position)));
  }
  block.done();
  return w;
}

}  // namespace yeegap::io
