// The `tunnelling` block: which pairs of bodies may conduct across their gap, and how — the
// quantum-corrected model of Esteban et al., Nat. Commun. 3, 825 (2012) or the classical picture
// (the gap keeps the background), so one scene runs both ways. The barrier and metal numbers come
// from the materials/ presets (yeegap tunnelling --metal NAME prints the resulting table).
#include <fmt/format.h>

#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"
#include "io/suggest.h"
#include "materials/tunnelling_model.h"
#include "materials/tunnelling_metals.h"

namespace yeegap::io {
namespace {

int body_index(const Node& v, const solver::Scene& scene) {
  const std::string name = read_text(v);
  std::vector<std::string> names;
  for (std::size_t i = 0; i < scene.bodies.size(); ++i) {
    if (scene.bodies[i].name == name) return static_cast<int>(i);
    if (!scene.bodies[i].name.empty()) names.push_back(scene.bodies[i].name);
  }
  if (names.empty())
    v.fail(fmt::format("no body is named '{}': give the bodies names (a 'name' key) and list them here", name));
  v.fail(fmt::format("no body is named '{}'{}", name, suggestion(name, names)));
  return -1;
}

}  // namespace

void read_tunnelling(const Node& block, solver::Scene& scene) {
  block.allow({"pairs", "model", "metal", "work_function", "fermi_energy", "plasma_frequency", "damping", "barrier",
               "join", "gap_medium", "cutoff"});
  if (!block.is_map()) block.fail(fmt::format("must be a block with pairs and model, got {}", block.found()));
  solver::TunnellingSpec t;
  t.where = block.where();
  const Node pairs = block.require("pairs");
  if (!pairs.is_list()) pairs.fail("must be a list of pairs of body names, e.g. [[left, right]]");
  for (const Node& pair : pairs.items()) {
    const std::vector<Node> two = pair.items();
    if (!pair.is_list() || two.size() != 2) pair.fail(fmt::format("a pair is two body names, e.g. [left, right], got {}", pair.found()));
    const int a = body_index(two[0], scene), b = body_index(two[1], scene);
    if (a == b) two[1].fail("a body cannot tunnel to itself");
    t.pairs.push_back({a, b});
  }
  if (t.pairs.empty()) pairs.fail("needs at least one pair of body names");
  t.quantum = read_word(block.require("model"), {"quantum_corrected", "classical"}) == "quantum_corrected";
  std::vector<std::string> metals;
  for (const auto& m : materials::tunnelling_metals()) metals.push_back(m.name);
  const Node metal_node = block.require("metal");
  const materials::TunnellingMetal* metal = materials::find_tunnelling_metal(read_text(metal_node));
  if (!metal) metal_node.fail(fmt::format("no tunnelling preset '{}'{}", read_text(metal_node),
                                          suggestion(read_text(metal_node), metals)));
  // A paper's own numbers in place of the preset's (docs/scene.md, tunnelling).
  materials::TunnellingMetalChanges changes;
  if (auto w = block.get("work_function")) changes.work_function = read_energy(*w);
  if (auto e = block.get("fermi_energy")) changes.fermi_energy = read_energy(*e);
  if (auto wp = block.get("plasma_frequency")) changes.plasma_frequency = read_omega(*wp);
  if (auto g = block.get("damping")) changes.damping = read_omega(*g);
  const materials::TunnellingMetal given = materials::with_changes(*metal, changes);
  materials::BarrierKind barrier = materials::BarrierKind::rectangular;
  if (auto b = block.get("barrier")) {
    const std::string w = read_word(*b, {"rectangular", "image_rounded", "exponential_fit"});
    barrier = w == "image_rounded" ? materials::BarrierKind::image_rounded
                                   : (w == "exponential_fit" ? materials::BarrierKind::exponential_fit
                                                             : materials::BarrierKind::rectangular);
  }
  materials::TunnellingOptions options;
  if (auto eb = block.get("gap_medium")) options.background = read_positive_number(*eb);
  if (auto j = block.get("join")) {
    if (j->is_scalar() && j->text() == "none") {
      options.join_transmission = 0;
    } else {
      const double t_join = read_number(*j);
      if (!(t_join > 0 && t_join < 1))
        j->fail(fmt::format("must be a transmission T(E_F) between 0 and 1 (exclusive), or none, got '{}'", j->text()));
      options.join_transmission = t_join;
    }
    if (barrier == materials::BarrierKind::exponential_fit)
      j->fail("the exponential_fit barrier has no join (it is the exponential at every width); leave join out");
  }
  t.model = materials::make_tunnelling_model(given, barrier, options);
  if (auto cutoff = block.get("cutoff")) t.cutoff = read_positive_length(*cutoff);
  block.done();
  scene.tunnelling.push_back(t);
}

}  // namespace yeegap::io
