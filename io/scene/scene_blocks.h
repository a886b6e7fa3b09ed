// The readers of the scene's top-level blocks, one file each (scene_*.cpp), called in this order by
// read_scene_text: scene, materials, domain, bodies, excitation, outputs, stop. Later blocks use
// earlier ones (material names, the domain's bounds), so the order matters.
#pragma once

#include <string>
#include <vector>

#include "io/scene/scene_notes.h"
#include "io/yaml_node.h"
#include "materials/pole_set.h"
#include "solver/scene.h"

namespace yeegap::io {

/// The built-in material (permittivity 1) used as background when the scene names none; it is
/// appended to scene.materials on first use unless the scene defines a material of that name.
inline constexpr const char* builtin_vacuum = "vacuum";

/// `scene: {version, title}`.
void read_scene_block(const Node& block, solver::Scene& scene);
/// `materials: {name: {...}, ...}` -> scene.materials, in file order. A `table` material is fitted
/// here, and the fit's error goes to `notes`.
void read_materials(const Node& block, solver::Scene& scene, const NoteSink& notes);
/// The model of a material `block` holding `table: FILE` (scene_table.cpp): the file, relative to
/// the scene file, fitted with poles, and recorded with its hash in scene.input_files. `model_keys`
/// are the material keys, all refused beside `table` except the pole counts `poles` and `drude`.
materials::PoleSet read_table_material(const Node& block, const std::vector<std::string>& model_keys,
                                       solver::Scene& scene, const NoteSink& notes);
/// Index into scene.materials of the material named by `ref`; the built-in vacuum is added on first
/// use. An unknown name is an error suggesting the closest defined one.
int material_index(const Node& ref, solver::Scene& scene);
/// Index of a material by name, adding the built-in vacuum if that is the name and it is missing.
int builtin_or_defined(const std::string& name, solver::Scene& scene);
/// `domain: {...}`, after the materials (for `background`).
void read_domain(const Node& block, solver::Scene& scene);
/// `bodies: [...]`.
void read_bodies(const Node& list, solver::Scene& scene);
/// `tunnelling: {...}`, after the bodies (pairs name them).
void read_tunnelling(const Node& block, solver::Scene& scene);
/// `excitation: [...]`, after the domain (sources must lie inside it).
void read_excitation(const Node& list, solver::Scene& scene);
/// `plane_wave: {...}` in the excitation list (scene_plane_wave.cpp): a plane wave in a Bloch cell.
solver::BlochWaveSpec read_plane_wave(const Node& block, const solver::Scene& scene);
/// After the excitation: a warning through `notes` for each library material that a body or the
/// background uses whose fitted wavelength range the sources' band leaves (scene_library_range.cpp).
void warn_outside_library_ranges(const solver::Scene& scene, const NoteSink& notes);
/// `outputs: [...]`, after the domain.
void read_outputs(const Node& list, solver::Scene& scene);
/// `stop: {...}`.
void read_stop(const Node& block, solver::Scene& scene);

/// A region {from, to} between two corners inside the domain; `closed` asks for a box with positive
/// extent along every axis.
solver::Region read_corners(const Node& block, const solver::DomainSpec& domain, bool closed);
/// The domain's corners, m.
solver::Region domain_bounds(const solver::DomainSpec& domain);
/// Refuses a point outside the domain (a small rounding slack allowed), naming `v` in the message.
void check_inside_domain(const Node& v, const Vec3& p, const solver::DomainSpec& domain);

}  // namespace yeegap::io
