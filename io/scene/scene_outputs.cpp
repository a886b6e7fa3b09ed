// The `outputs` list: what a run records, one uniquely named recorder per item: a probe, field_map,
// flux, cross sections, far_field, decay_rate, the diffraction orders of a Bloch plane wave, a
// sensor (the figures of an angle scan's dip, docs/sensor.md) or the energy in a box. Keys:
// docs/scene.md, `outputs`.
#include <algorithm>
#include <cctype>
#include <cmath>
#include <map>

#include <fmt/format.h>

#include "base/constants.h"
#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"
#include "io/suggest.h"

namespace yeegap::io {
namespace {

const char* const axis_names[] = {"x", "y", "z"};
// Components recorded when an output names none: the electric field, which is what near-field
// questions ask for and half the cost of all six.
const std::vector<solver::Component> default_components = {solver::Component::Ex, solver::Component::Ey,
                                                           solver::Component::Ez};

std::vector<solver::Component> read_components(const Node& v) {
  const std::vector<std::string> names(solver::component_names.begin(), solver::component_names.end());
  std::vector<Node> words = v.is_scalar() ? std::vector<Node>{v} : v.items();
  if (words.empty()) v.fail("must name at least one field component (Ex, Ey, Ez, Hx, Hy, Hz)");
  std::vector<solver::Component> out;
  for (const Node& w : words) {
    const std::string name = read_word(w, names);
    const auto c = static_cast<solver::Component>(std::find(names.begin(), names.end(), name) - names.begin());
    if (std::find(out.begin(), out.end(), c) != out.end()) w.fail(fmt::format("'{}' is listed twice", name));
    out.push_back(c);
  }
  return out;
}

std::string read_name(const Node& block, std::map<std::string, Where>& used) {
  const Node v = block.require("name");
  const std::string name = read_text(v);
  const bool ok = !name.empty() && std::all_of(name.begin(), name.end(), [](char c) {
    return std::isalnum(static_cast<unsigned char>(c)) || c == '_' || c == '-';
  });
  if (!ok) v.fail(fmt::format("an output name holds letters, digits, '_' and '-' only, got '{}'", name));
  if (auto it = used.find(name); it != used.end())
    v.fail(fmt::format("the output name '{}' is already used by {}{}", name, it->second.key_path,
                       it->second.line > 0 ? fmt::format(" (line {})", it->second.line) : ""));
  used.emplace(name, block.where());
  return name;
}

/// A plane {axis, at} across the whole domain.
solver::Region read_plane(const Node& block, const solver::DomainSpec& domain) {
  block.allow({"axis", "at"});
  if (!block.is_map()) block.fail(fmt::format("must be a block {{axis: z, at: 0 nm}}, got {}", block.found()));
  const int axis = read_axis(block.require("axis"));
  const Node at = block.require("at");
  solver::Region r = domain_bounds(domain);
  Vec3 point = domain.center;
  point[axis] = read_length(at);
  check_inside_domain(at, point, domain);
  r.lo[axis] = r.hi[axis] = point[axis];
  block.done();
  return r;
}

}  // namespace

/// A region {from, to} between two corners inside the domain; `closed` asks for a box with positive
/// extent along every axis.
solver::Region read_corners(const Node& block, const solver::DomainSpec& domain, bool closed) {
  block.allow({"from", "to"});
  if (!block.is_map()) block.fail(fmt::format("must be a block {{from: [x, y, z], to: [x, y, z]}}, got {}", block.found()));
  const Node from = block.require("from"), to = block.require("to");
  const solver::Region r{read_position(from), read_position(to)};
  check_inside_domain(from, r.lo, domain);
  check_inside_domain(to, r.hi, domain);
  for (int a = 0; a < 3; ++a) {
    if (r.hi[a] < r.lo[a] || (closed && !(r.hi[a] > r.lo[a])))
      to.fail(fmt::format("must lie {} 'from' along {} ({} vs {}){}", closed ? "above" : "at or above", axis_names[a],
                          format_length(r.hi[a]), format_length(r.lo[a]),
                          closed ? "; a box needs a positive extent on every axis" : ""));
  }
  block.done();
  return r;
}

namespace {

solver::ProbeSpec read_probe(const Node& block, const solver::DomainSpec& domain, std::map<std::string, Where>& used) {
  block.allow({"name", "position", "components"});
  solver::ProbeSpec p;
  p.where = block.where();
  p.name = read_name(block, used);
  const Node position = block.require("position");
  p.position = read_position(position);
  check_inside_domain(position, p.position, domain);
  p.components = default_components;
  if (auto c = block.get("components")) p.components = read_components(*c);
  block.done();
  return p;
}

/// Exactly one of two keys that say where an output lies.
void require_one_of(const Node& block, const char* a, const char* b) {
  if (block.has(a) && block.has(b))
    block.fail_key(b, fmt::format("{}: give either '{}' or '{}', not both", block.path(), a, b));
  if (!block.has(a) && !block.has(b)) block.fail(fmt::format("missing key '{}' or '{}'", a, b));
}

solver::FieldMapSpec read_field_map(const Node& block, const solver::DomainSpec& domain,
                                    std::map<std::string, Where>& used) {
  block.allow({"name", "plane", "region", "frequencies", "components"});
  solver::FieldMapSpec m;
  m.where = block.where();
  m.name = read_name(block, used);
  require_one_of(block, "plane", "region");
  if (auto plane = block.get("plane")) m.region = read_plane(*plane, domain);
  if (auto region = block.get("region")) m.region = read_corners(*region, domain, /*closed=*/false);
  m.omegas = read_frequencies(block.require("frequencies"));
  m.components = default_components;
  if (auto c = block.get("components")) m.components = read_components(*c);
  block.done();
  return m;
}

solver::FluxSpec read_flux(const Node& block, const solver::DomainSpec& domain, std::map<std::string, Where>& used) {
  block.allow({"name", "plane", "box", "frequencies"});
  solver::FluxSpec f;
  f.where = block.where();
  f.name = read_name(block, used);
  require_one_of(block, "plane", "box");
  if (auto plane = block.get("plane")) f.region = read_plane(*plane, domain);
  if (auto box = block.get("box")) f.region = read_corners(*box, domain, /*closed=*/true);
  f.omegas = read_frequencies(block.require("frequencies"));
  block.done();
  return f;
}

// Cross sections of what the plane-wave box holds; the boxes they integrate over follow from the
// box, so only the frequencies are asked for.
solver::CrossSectionSpec read_cross_sections(const Node& block, const solver::Scene& scene,
                                             std::map<std::string, Where>& used) {
  block.allow({"name", "frequencies"});
  solver::CrossSectionSpec c;
  c.where = block.where();
  c.name = read_name(block, used);
  if (scene.plane_waves.empty())
    block.fail("cross sections need a plane-wave box: add an excitation '- tfsf: {box: ..., direction: ..., "
               "polarization: ..., band: ...}'");
  c.omegas = read_frequencies(block.require("frequencies"));
  block.done();
  return c;
}

// ---- far_field and decay_rate ----

// Directions reported when a far_field names none: every 10 degrees in theta and phi.
constexpr long default_theta_count = 19, default_phi_count = 36;

solver::FarFieldSpec read_far_field(const Node& block, const solver::Scene& scene, std::map<std::string, Where>& used) {
  block.allow({"name", "box", "frequencies", "angles", "directions", "collection"});
  solver::FarFieldSpec f;
  f.where = block.where();
  f.name = read_name(block, used);
  if (auto box = block.get("box")) {
    f.box = read_corners(*box, scene.domain, /*closed=*/true);
    f.box_given = true;
  }
  f.omegas = read_frequencies(block.require("frequencies"));
  if (block.has("angles") && block.has("directions"))
    block.fail_key("directions", fmt::format("{}: give either 'angles' (a grid) or 'directions' (a list), not both",
                                             block.path()));
  if (auto d = block.get("directions")) {
    const std::vector<Node> pairs = d->items();
    if (pairs.empty()) d->fail("must list at least one direction [theta, phi]");
    for (const Node& p : pairs) {
      const std::vector<Node> two = p.is_list() ? p.items() : std::vector<Node>{};
      if (two.size() != 2) p.fail(fmt::format("must be a pair [theta, phi] like [30 deg, 0 deg], got {}", p.found()));
      f.theta.push_back(read_angle(two[0]));
      f.phi.push_back(read_angle(two[1]));
    }
  } else {
    long n_theta = default_theta_count, n_phi = default_phi_count;
    if (auto a = block.get("angles")) {
      a->allow({"theta_count", "phi_count"});
      if (!a->is_map()) a->fail(fmt::format("must be a block {{theta_count: 19, phi_count: 36}}, got {}", a->found()));
      if (auto t = a->get("theta_count")) n_theta = read_whole_number(*t, 2);
      if (auto p = a->get("phi_count")) n_phi = read_whole_number(*p, 1);
      a->done();
    }
    f.theta_count = static_cast<int>(n_theta);
    f.phi_count = static_cast<int>(n_phi);
    // theta from 0 to 180 degrees inclusive, phi from 0 up to 360 degrees exclusive; phi fastest.
    for (long i = 0; i < n_theta; ++i)
      for (long j = 0; j < n_phi; ++j) {
        f.theta.push_back(constants::pi * i / (n_theta - 1));
        f.phi.push_back(2 * constants::pi * j / n_phi);
      }
  }
  if (auto c = block.get("collection")) {
    c->allow({"direction", "numerical_aperture"});
    if (!c->is_map())
      c->fail(fmt::format("must be a block {{direction: z, numerical_aperture: 0.9}}, got {}", c->found()));
    if (auto d = c->get("direction")) f.collection_axis = read_direction(*d);
    const Node na = c->require("numerical_aperture");
    f.numerical_aperture = read_positive_number(na);
    const double n_bg = std::sqrt(scene.materials[scene.domain.background].poles.eps_inf);
    if (f.numerical_aperture > n_bg * (1 + 1e-12))
      na.fail(fmt::format("cannot exceed the background's refractive index {:.4g}, got {}", n_bg, na.text()));
    c->done();
  }
  block.done();
  return f;
}

solver::DecayRateSpec read_decay_rate(const Node& block, const solver::Scene& scene, std::map<std::string, Where>& used) {
  block.allow({"name", "dipole", "frequencies", "box_size", "radiated"});
  solver::DecayRateSpec d;
  d.where = block.where();
  d.name = read_name(block, used);
  const long dipoles = static_cast<long>(scene.dipoles.size());
  if (dipoles == 0) block.fail("a decay rate needs a dipole: add an excitation '- dipole: {...}'");
  if (auto v = block.get("dipole")) {
    const long i = read_whole_number(*v, 0);
    if (i >= dipoles)
      v->fail(fmt::format("the scene has {} dipole(s), counted from 0 in the excitation list; got {}", dipoles, i));
    d.dipole = static_cast<int>(i);
  } else if (dipoles > 1) {
    block.fail(fmt::format("the scene has {} dipoles: say which with 'dipole: N', counted from 0", dipoles));
  }
  if (auto v = block.get("box_size")) d.box_size = read_positive_length(*v);
  if (auto v = block.get("radiated")) d.radiated = read_text(*v);
  if (auto v = block.get("frequencies")) d.omegas = read_frequencies(*v);
  else if (d.radiated.empty())
    block.fail("missing key 'frequencies' (or 'radiated', to take the frequencies of that output)");
  block.done();
  return d;
}

// Largest delta_n: the sensitivity is a derivative; beyond a few 1e-2 the dip moves by a good
// fraction of its width and the forward difference stops meaning dtheta/dn (docs/sensor.md).
constexpr double max_delta_n = 0.1;

solver::SensorSpec read_sensor(const Node& block, solver::Scene& scene, std::map<std::string, Where>& used) {
  block.allow({"name", "medium", "delta_n", "binding"});
  solver::SensorSpec s;
  s.where = block.where();
  s.name = read_name(block, used);
  if (!scene.sensors.empty()) block.fail("only one sensor output per scene (it repeats the whole scan)");
  // The excitation block is read before the outputs, so the plane wave is known here.
  if (scene.bloch_waves.empty() || scene.bloch_waves.front().scan_angles.empty())
    block.fail(fmt::format("a sensor output repeats an angle scan: it needs a plane_wave excitation with 'angles' "
                           "(e.g. 'angles: {{from: 60 deg, to: 85 deg, count: 126}}') and a 'wavelength', got {}",
                           scene.bloch_waves.empty() ? "no plane_wave" : "a plane_wave with one 'angle'"));
  const Node medium = block.require("medium");
  s.medium = material_index(medium, scene);
  const solver::MaterialSpec& m = scene.materials[static_cast<std::size_t>(s.medium)];
  if (m.perfect_conductor)
    medium.fail(fmt::format("'{}' is a perfect conductor; the sensing medium needs a refractive index to raise", m.name));
  bool fills = scene.domain.background == s.medium;
  for (const auto& b : scene.bodies) fills = fills || b.material == s.medium;
  if (!fills)
    medium.fail(fmt::format("'{}' fills nothing: no body and not the background (domain.background) is made of it, "
                            "so raising its index would change nothing", m.name));
  if (auto v = block.get("delta_n")) {
    s.delta_n = read_positive_number(*v);
    if (s.delta_n > max_delta_n)
      v->fail(fmt::format("delta_n must be at most {} (the sensitivity is a derivative; 1e-3 is usual), got {}",
                          max_delta_n, s.delta_n));
  }
  if (auto v = block.get("binding")) {
    s.binding = material_index(*v, scene);
    const solver::MaterialSpec& b = scene.materials[static_cast<std::size_t>(s.binding)];
    if (s.binding == s.medium)
      v->fail(fmt::format("the binding material must differ from the sensing medium '{}' (before binding, the layer's "
                          "place is filled with the sensing medium)", m.name));
    bool body = false;
    for (const auto& x : scene.bodies) body = body || x.material == s.binding;
    if (!body || scene.domain.background == s.binding)
      v->fail(fmt::format("'{}' must be the material of a body (the bound layer) and not the background, so that the "
                          "layer can be taken away for the scan before binding", b.name));
  }
  block.done();
  return s;
}

/// `radiated` must name a far_field or a closed flux box of the scene; outputs may come in any
/// order, so this runs once all are read.
void check_radiated(const Node& block, const solver::DecayRateSpec& d, const solver::Scene& scene) {
  if (d.radiated.empty()) return;
  for (const auto& f : scene.far_fields)
    if (f.name == d.radiated) return;
  std::vector<std::string> names;
  for (const auto& f : scene.far_fields) names.push_back(f.name);
  for (const auto& f : scene.fluxes) {
    if (f.name != d.radiated) {
      names.push_back(f.name);
      continue;
    }
    for (int a = 0; a < 3; ++a)
      if (!(f.region.hi[a] > f.region.lo[a]))
        block.fail_key("radiated", fmt::format("{}.radiated: the flux '{}' is a plane; the radiated power needs a "
                                               "closed box around everything, or a far_field", block.path(), f.name));
    return;
  }
  block.fail_key("radiated", fmt::format("{}.radiated: '{}' is not a far_field or flux output of this scene{}",
                                         block.path(), d.radiated,
                                         names.empty() ? std::string()
                                                       : fmt::format(" (there are: {})", fmt::join(names, ", "))));
}

// Diffraction orders of the plane_wave: the planes and frequencies are the plane wave's own.
solver::OrdersSpec read_orders(const Node& block, const solver::Scene& scene, std::map<std::string, Where>& used) {
  block.allow({"name"});
  solver::OrdersSpec o;
  o.where = block.where();
  o.name = read_name(block, used);
  if (scene.bloch_waves.empty())
    block.fail("diffraction orders need a plane wave in a Bloch cell: add an excitation '- plane_wave: {from: low, "
               "polarization: p, band: ...}'");
  if (!scene.orders.empty()) block.fail("the scene already has an orders output; one is enough (it lists every order)");
  if (!scene.bloch_waves.front().scan_angles.empty())
    block.fail("diffraction orders are reported for a run at one angle (a band, or one wavelength), not for an angle "
               "scan ('angles'): run one angle per scene, or a band at a fixed angle");
  block.done();
  return o;
}

solver::EnergySpec read_energy(const Node& block, const solver::DomainSpec& domain, std::map<std::string, Where>& used) {
  block.allow({"name", "box"});
  solver::EnergySpec e;
  e.where = block.where();
  e.name = read_name(block, used);
  e.region = read_corners(block.require("box"), domain, /*closed=*/true);
  block.done();
  return e;
}

}  // namespace

void read_outputs(const Node& list, solver::Scene& scene) {
  std::map<std::string, Where> used;  // output name -> where it was first given
  std::vector<Node> decay_blocks;     // the decay_rate blocks, for checking 'radiated' at the end
  for (const Node& item : list.items_or_single()) {
    item.allow({"probe", "field_map", "flux", "cross_sections", "far_field", "decay_rate", "orders", "sensor",
                "energy"},
               /*planned=*/{"resonances"});
    if (!item.is_map() || item.entries().size() != 1)
      item.fail(fmt::format("each item holds exactly one output, e.g. '- probe: {{...}}', got {}",
                            item.is_map() ? fmt::format("{} keys", item.entries().size()) : item.found()));
    if (auto b = item.get("probe")) scene.probes.push_back(read_probe(*b, scene.domain, used));
    if (auto b = item.get("field_map")) scene.field_maps.push_back(read_field_map(*b, scene.domain, used));
    if (auto b = item.get("flux")) scene.fluxes.push_back(read_flux(*b, scene.domain, used));
    if (auto b = item.get("cross_sections")) scene.cross_sections.push_back(read_cross_sections(*b, scene, used));
    if (auto b = item.get("far_field")) scene.far_fields.push_back(read_far_field(*b, scene, used));
    if (auto b = item.get("orders")) scene.orders.push_back(read_orders(*b, scene, used));
    if (auto b = item.get("decay_rate")) {
      scene.decay_rates.push_back(read_decay_rate(*b, scene, used));
      decay_blocks.push_back(*b);
    }
    if (auto b = item.get("sensor")) scene.sensors.push_back(read_sensor(*b, scene, used));
    if (auto b = item.get("energy")) scene.energies.push_back(read_energy(*b, scene.domain, used));
  }
  for (std::size_t i = 0; i < decay_blocks.size(); ++i) check_radiated(decay_blocks[i], scene.decay_rates[i], scene);
}

}  // namespace yeegap::io
