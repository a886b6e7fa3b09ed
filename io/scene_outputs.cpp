// The `outputs` list: what a run records. Each item is one recorder with a unique name: a probe
// (time series at a point), a field_map (frequency-domain fields on a plane or in a region) or a
// flux (power through a plane, or out of a closed box).
#include <algorithm>
#include <cctype>
#include <map>

#include <fmt/format.h>

#include "io/read_values.h"
#include "io/scene_blocks.h"
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

}  // namespace

void read_outputs(const Node& list, solver::Scene& scene) {
  std::map<std::string, Where> used;  // output name -> where it was first given
  for (const Node& item : list.items_or_single()) {
    item.allow({"probe", "field_map", "flux", "cross_sections"},
               /*planned=*/{"far_field", "decay_rate", "resonances", "orders"});
    if (!item.is_map() || item.entries().size() != 1)
      item.fail(fmt::format("each item holds exactly one output, e.g. '- probe: {{...}}', got {}",
                            item.is_map() ? fmt::format("{} keys", item.entries().size()) : item.found()));
    if (auto b = item.get("probe")) scene.probes.push_back(read_probe(*b, scene.domain, used));
    if (auto b = item.get("field_map")) scene.field_maps.push_back(read_field_map(*b, scene.domain, used));
    if (auto b = item.get("flux")) scene.fluxes.push_back(read_flux(*b, scene.domain, used));
    if (auto b = item.get("cross_sections")) scene.cross_sections.push_back(read_cross_sections(*b, scene, used));
  }
}

}  // namespace yeegap::io
