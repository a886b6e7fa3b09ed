// The readers of the scene's top-level blocks, one file each (scene_*.cpp), called in this order by
// read_scene_text: scene, materials, domain, bodies, excitation, outputs, stop. Later blocks use
// earlier ones (material names, the domain's bounds), so the order matters.
#pragma once

#include "io/yaml_node.h"
#include "solver/scene.h"

namespace yeegap::io {

/// The built-in material (permittivity 1) used as background when the scene names none; it is
/// appended to scene.materials on first use unless the scene defines a material of that name.
inline constexpr const char* builtin_vacuum = "vacuum";

/// `scene: {version, title}`.
void read_scene_block(const Node& block, solver::Scene& scene);
/// `materials: {name: {...}, ...}` -> scene.materials, in file order.
void read_materials(const Node& block, solver::Scene& scene);
/// Index into scene.materials of the material named by `ref`; the built-in vacuum is added on first
/// use. An unknown name is an error suggesting the closest defined one.
int material_index(const Node& ref, solver::Scene& scene);
/// Index of a material by name, adding the built-in vacuum if that is the name and it is missing.
int builtin_or_defined(const std::string& name, solver::Scene& scene);
/// `domain: {...}`, after the materials (for `background`).
void read_domain(const Node& block, solver::Scene& scene);
/// `bodies: [...]`.
void read_bodies(const Node& list, solver::Scene& scene);
/// `excitation: [...]`, after the domain (sources must lie inside it).
void read_excitation(const Node& list, solver::Scene& scene);
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
