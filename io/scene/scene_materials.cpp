// The `materials` block: named media as a constant index or permittivity, optional static
// conductivity, explicit Drude/Lorentz/critical-point poles (materials/pole_set.h), an entry of the
// built-in library (materials/library.h), a table of n, k fitted on load (scene_table.cpp), or a
// perfect conductor; and the lookup of material names used by bodies and the domain background.
#include <algorithm>
#include <cctype>
#include <cmath>

#include <fmt/format.h>

#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"
#include "base/constants.h"
#include "io/suggest.h"
#include "io/written_units.h"
#include "materials/library.h"

namespace yeegap::io {
namespace {

bool valid_name(const std::string& name) {
  if (name.empty() || !std::isalpha(static_cast<unsigned char>(name[0]))) return false;
  for (char c : name)
    if (!std::isalnum(static_cast<unsigned char>(c)) && c != '_' && c != '-') return false;
  return true;
}

void read_poles(const Node& block, materials::PoleSet& poles) {
  block.allow({"eps_inf", "drude", "lorentz", "critical_points"});
  if (!block.is_map())
    block.fail(fmt::format("must be a block with eps_inf, drude, lorentz and/or critical_points, got {}{}", block.found(),
                           block.is_scalar() ? " (a number of poles to fit goes with 'table')" : ""));
  if (auto eps_inf = block.get("eps_inf")) poles.eps_inf = read_positive_number(*eps_inf);
  if (auto drude = block.get("drude")) {
    for (const Node& p : drude->items_or_single()) {
      p.allow({"plasma_frequency", "damping"});
      if (!p.is_map()) p.fail(fmt::format("must be a block {{plasma_frequency, damping}}, got {}", p.found()));
      materials::DrudePole pole;
      pole.omega_p = read_omega(p.require("plasma_frequency"));
      pole.gamma = read_omega(p.require("damping"), /*allow_zero=*/true);
      poles.drude.push_back(pole);
      p.done();
    }
  }
  if (auto lorentz = block.get("lorentz")) {
    for (const Node& p : lorentz->items_or_single()) {
      p.allow({"strength", "resonance", "damping"});
      if (!p.is_map()) p.fail(fmt::format("must be a block {{strength, resonance, damping}}, got {}", p.found()));
      materials::LorentzPole pole;
      pole.delta_eps = read_positive_number(p.require("strength"));
      pole.omega_0 = read_omega(p.require("resonance"));
      pole.gamma = read_omega(p.require("damping"), /*allow_zero=*/true);
      poles.lorentz.push_back(pole);
      p.done();
    }
  }
  if (auto critical = block.get("critical_points")) {
    // Etchegoin, Le Ru, Meyer, J. Chem. Phys. 125, 164705 (2006): A Omega [e^{i phi}/(Omega - omega -
    // i Gamma) + e^{-i phi}/(Omega + omega + i Gamma)]. A single term may have Im eps < 0 somewhere; only
    // the whole model must be passive, so terms are not checked one by one.
    for (const Node& p : critical->items_or_single()) {
      p.allow({"amplitude", "phase", "resonance", "damping"});
      if (!p.is_map())
        p.fail(fmt::format("must be a block {{amplitude, phase, resonance, damping}}, got {}", p.found()));
      materials::CriticalPoint term;
      const Node amplitude = p.require("amplitude");
      term.amplitude = read_number(amplitude);
      if (!std::isfinite(term.amplitude) || term.amplitude == 0)
        amplitude.fail(fmt::format("must be a non-zero number (a negative one is the same as phase + 180 deg), "
                                   "got '{}'", amplitude.text()));
      // A bare number is refused: -45 and -0.785 (degrees or radians) are both plausible phases.
      term.phase = read_angle(p.require("phase"), "an angle with its unit, e.g. '-45 deg' or '-0.785 rad'");
      term.omega = read_omega(p.require("resonance"));
      term.gamma = read_omega(p.require("damping"), /*allow_zero=*/true);
      poles.critical_points.push_back(term);
      p.done();
    }
  }
  block.done();
}

// `library: NAME`: the whole model (eps_inf, conductivity, every pole) from the built-in library.
// The entry's published fit range (LibraryEntry::wavelength_min/max) is where a later warning about
// sources outside it would hook in; the reader does not know the excitation band yet at this point.
void read_library_material(const Node& block, const std::vector<std::string>& keys, solver::MaterialSpec& m) {
  for (const std::string& k : keys)
    if (k != "library" && block.has(k))
      block.fail_key(k, fmt::format("{}: a library material takes its whole model from the library, found '{}' "
                                    "beside it (define the material with 'poles' to change it)", block.path(), k));
  const Node v = *block.get("library");
  const std::string word = read_text(v);
  const materials::LibraryEntry* entry = materials::find_material(word);
  if (!entry) v.fail(fmt::format("unknown library material '{}'{}", word, suggestion(word, materials::material_names())));
  m.poles = entry->poles;
  m.library = entry->name;  // the entry's own spelling, for the range check after the excitation
}

solver::MaterialSpec read_material(const std::string& name, const Node& block, solver::Scene& scene,
                                   const NoteSink& notes) {
  const std::vector<std::string> keys = {"index", "permittivity", "conductivity", "perfect_conductor", "poles",
                                         "library", "table", "drude"};
  block.allow(keys);
  solver::MaterialSpec m;
  m.name = name;
  m.where = block.where();
  if (!block.is_map())
    block.fail("needs one of: index, permittivity, poles, library, table or 'perfect_conductor: true'");

  const bool pec = block.has("perfect_conductor") && read_flag(*block.get("perfect_conductor"));
  if (pec) {
    for (const std::string& k : keys)
      if (k != "perfect_conductor" && block.has(k))
        block.fail_key(k, fmt::format("{}: a perfect conductor takes no other keys, found '{}'", block.path(), k));
    m.perfect_conductor = true;
    block.done();
    return m;
  }
  if (block.has("library")) {
    read_library_material(block, keys, m);
    block.done();
    return m;
  }
  if (block.has("table")) {
    m.poles = read_table_material(block, keys, scene, notes);
    block.done();
    return m;
  }
  if (block.has("drude"))
    block.fail_key("drude", fmt::format("{}: 'drude' beside the model keys is the number of Drude poles to fit to a "
                                        "'table'; explicit Drude poles go inside 'poles'", block.path()));
  if (block.has("index") && block.has("permittivity"))
    block.fail_key("permittivity", fmt::format("{}: give either 'index' or 'permittivity', not both "
                                               "(permittivity = index^2)", block.path()));
  for (const char* k : {"index", "permittivity"})
    if (block.has("poles") && block.has(k))
      block.fail_key(k, fmt::format("{}: with 'poles', give the high-frequency permittivity as poles.eps_inf "
                                    "instead of '{}'", block.path(), k));
  if (!block.has("index") && !block.has("permittivity") && !block.has("poles") && !block.has("conductivity"))
    block.fail("needs one of: index, permittivity, poles, library, table, conductivity or 'perfect_conductor: true'");

  if (auto index = block.get("index")) {
    const double n = read_positive_number(*index);
    m.poles.eps_inf = n * n;
  }
  if (auto eps = block.get("permittivity")) {
    const double e = read_number(*eps);
    if (!(e > 0))
      eps->fail(fmt::format("must be a positive number (a negative permittivity needs 'poles'), got '{}'", eps->text()));
    m.poles.eps_inf = e;
  }
  if (auto poles = block.get("poles")) read_poles(*poles, m.poles);
  if (auto sigma = block.get("conductivity")) m.poles.conductivity = read_conductivity(*sigma);
  block.done();
  return m;
}

}  // namespace

void read_materials(const Node& block, solver::Scene& scene, const NoteSink& notes) {
  for (const auto& [name, body] : block.entries()) {
    if (!valid_name(name))
      body.fail(fmt::format("'{}' is not a usable material name: start with a letter, then letters, digits, "
                            "'_' or '-'", name));
    scene.materials.push_back(read_material(name, body, scene, notes));
  }
}

int builtin_or_defined(const std::string& name, solver::Scene& scene) {
  for (std::size_t i = 0; i < scene.materials.size(); ++i)
    if (scene.materials[i].name == name) return static_cast<int>(i);
  if (name != builtin_vacuum) return -1;
  solver::MaterialSpec vacuum;
  vacuum.name = builtin_vacuum;
  vacuum.where = Where{scene.file, 0, 0, "(built-in material)"};
  scene.materials.push_back(vacuum);  // PoleSet defaults: eps_inf 1, no loss, no poles
  return static_cast<int>(scene.materials.size() - 1);
}

int material_index(const Node& ref, solver::Scene& scene) {
  const std::string name = read_text(ref);
  const int i = builtin_or_defined(name, scene);
  if (i >= 0) return i;
  std::vector<std::string> names;
  for (const auto& m : scene.materials) names.push_back(m.name);
  if (std::find(names.begin(), names.end(), builtin_vacuum) == names.end()) names.emplace_back(builtin_vacuum);
  ref.fail(fmt::format("unknown material '{}'{}", name, suggestion(name, names)));
}

}  // namespace yeegap::io
