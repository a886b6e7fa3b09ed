// The `bodies` list: each item is a shape word, its size keys and a material name, built with the
// factories of geometry/, then optionally cut (`minus`), turned, moved and repeated (`array`), in
// that order. Later bodies overwrite earlier ones where they overlap.
#include <algorithm>
#include <filesystem>
#include <map>

#include <fmt/format.h>

#include "base/constants.h"
#include "geometry/cone.h"
#include "geometry/ellipsoid.h"
#include "geometry/mesh_shape.h"
#include "io/file_hash.h"
#include "geometry/periodic_array.h"
#include "geometry/prism.h"
#include "geometry/rounded_box.h"
#include "geometry/rounded_cylinder.h"
#include "geometry/set_operations.h"
#include "geometry/shapes.h"
#include "geometry/transforms.h"
#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"

namespace yeegap::io {
namespace {

// The keys each shape takes besides 'shape', 'material' and the body keys.
const std::map<std::string, std::vector<std::string>> shape_keys = {
    {"sphere", {"center", "radius"}},
    {"box", {"center", "size", "rounding"}},
    {"slab", {"axis", "from", "to"}},
    {"cylinder", {"center", "axis", "radius", "length", "rounding"}},
    {"ellipsoid", {"center", "semi_axes"}},
    {"cone", {"base", "axis", "length", "radius", "tip_radius"}},
    {"prism", {"axis", "from", "to", "outline"}},
    {"mesh", {"file", "unit"}},
};
// Keys every body may carry; a `minus` item takes `move` and `turn` only.
const std::vector<std::string> body_keys = {"move", "turn", "minus", "array"};
const std::vector<std::string> cut_keys = {"move", "turn"};

std::vector<std::string> shape_words() {
  std::vector<std::string> w;
  for (const auto& [word, keys] : shape_keys) w.push_back(word);
  return w;
}

double read_rounding(const Node& v, double limit, const std::string& what) {
  const double r = read_length(v);
  if (!(r >= 0 && r <= limit * (1 + 1e-12)))
    v.fail(fmt::format("must lie between 0 and {} ({}), got '{}'", format_length(limit), what, v.text()));
  return std::min(r, limit);
}

std::vector<geometry::Point2> read_outline(const Node& v) {
  if (!v.is_list() || v.items().size() < 3)
    v.fail(fmt::format("must be a list of at least three points [u, v], got {}", v.found()));
  std::vector<geometry::Point2> out;
  for (const Node& p : v.items()) {
    if (!p.is_list() || p.items().size() != 2) p.fail(fmt::format("must be a point [u, v] of two lengths, got {}", p.found()));
    out.push_back({read_length(p.items()[0]), read_length(p.items()[1])});
  }
  const std::string problem = geometry::polygon_problem(out);
  if (!problem.empty()) v.fail(fmt::format("is not a simple outline: {} (points counted from 0)", problem));
  return out;
}

geometry::ShapePtr read_mesh(const Node& item, solver::Scene& scene) {
  const Node file = item.require("file");
  const std::string name = read_text(file);
  const Node unit = item.require("unit");
  const std::vector<std::string> length_units = units_of(Dimension::length);
  const std::string u = read_word(unit, length_units);
  const double metres = *to_si(Dimension::length, 1.0, u);
  // A relative path is relative to the scene file, so a scene and its meshes move together.
  std::filesystem::path path(name);
  if (path.is_relative()) path = std::filesystem::path(scene.file).parent_path() / path;
  geometry::ShapePtr shape = geometry::load_mesh_shape(path.string(), metres, file.where());
  // A checkpoint refuses to resume once the mesh has changed (io/results/checkpoint.h).
  scene.input_files.push_back({path.string(), file.path(), file_hash(path.string())});
  return shape;
}

geometry::ShapePtr read_shape(const std::string& shape, const Node& item, solver::Scene& scene) {
  if (shape == "sphere")
    return geometry::make_sphere(read_position(item.require("center")), read_positive_length(item.require("radius")));
  if (shape == "box") {
    const Vec3 center = read_position(item.require("center")), size = read_extent(item.require("size"));
    if (auto r = item.get("rounding"))
      return geometry::make_rounded_box(center, size,
                                        read_rounding(*r, 0.5 * std::min({size.x, size.y, size.z}), "half the shortest edge"));
    return geometry::make_box(center, size);
  }
  if (shape == "slab") {
    const int axis = read_axis(item.require("axis"));
    const double from = read_length(item.require("from"));
    const Node to = item.require("to");
    const double to_m = read_length(to);
    if (!(to_m > from))
      to.fail(fmt::format("must be above 'from' ({}), got '{}'", format_length(from), to.text()));
    return geometry::make_slab(axis, from, to_m);
  }
  if (shape == "cylinder") {
    const Vec3 center = read_position(item.require("center"));
    const Vec3 axis = read_direction(item.require("axis"));
    const double radius = read_positive_length(item.require("radius"));
    const double length = read_positive_length(item.require("length"));
    if (auto r = item.get("rounding"))
      return geometry::make_rounded_cylinder(center, axis, radius, length,
                                             read_rounding(*r, std::min(radius, 0.5 * length), "the radius and half the length"));
    return geometry::make_cylinder(center, axis, radius, length);
  }
  if (shape == "ellipsoid")
    return geometry::make_ellipsoid(read_position(item.require("center")), read_extent(item.require("semi_axes")));
  if (shape == "cone") {
    const Vec3 base = read_position(item.require("base"));
    const Vec3 axis = read_direction(item.require("axis"));
    const double length = read_positive_length(item.require("length"));
    const double radius = read_positive_length(item.require("radius"));
    double tip = 0;
    if (auto t = item.get("tip_radius")) {
      tip = read_length(*t);
      const std::string problem = geometry::cone_problem(length, radius, tip);
      if (!problem.empty()) t->fail(problem);
    }
    return geometry::make_cone(base, axis, length, radius, tip);
  }
  if (shape == "prism") {
    const int axis = read_axis(item.require("axis"));
    const double from = read_length(item.require("from"));
    const Node to = item.require("to");
    const double to_m = read_length(to);
    if (!(to_m > from))
      to.fail(fmt::format("must be above 'from' ({}), got '{}'", format_length(from), to.text()));
    return geometry::make_prism(axis, read_outline(item.require("outline")), from, to_m);
  }
  return read_mesh(item, scene);  // "mesh"
}

/// Checks a body block's keys: its shape's own keys plus `extra`; a key of another shape gets a
/// message that says so, rather than a far-fetched suggestion.
std::string check_keys(const Node& item, std::vector<std::string> keys, const std::vector<std::string>& extra) {
  if (!item.is_map())
    item.fail(fmt::format("must be a block with 'shape' and the shape's sizes, got {}", item.found()));
  if (!item.has("shape")) {
    // A misspelt 'shape' is better reported as that than as a missing key.
    std::vector<std::string> all = keys;
    for (const auto& [word, own] : shape_keys)
      for (const std::string& k : own)
        if (std::find(all.begin(), all.end(), k) == all.end()) all.push_back(k);
    all.insert(all.end(), extra.begin(), extra.end());
    item.allow(all);
  }
  const std::string shape = read_word(item.require("shape"), shape_words());
  const auto& own = shape_keys.at(shape);
  keys.insert(keys.end(), own.begin(), own.end());
  keys.insert(keys.end(), extra.begin(), extra.end());
  for (const auto& [other, other_keys] : shape_keys)
    for (const std::string& k : other_keys)
      if (item.has(k) && std::find(keys.begin(), keys.end(), k) == keys.end())
        item.fail_key(k, fmt::format("{}: {} {} takes no '{}'; its keys are {}", item.path(),
                                     std::string("aeiou").find(shape[0]) == std::string::npos ? "a" : "an", shape, k,
                                     fmt::join(keys, ", ")));
  item.allow(keys);
  return shape;
}

/// `turn: {axis, angle, about}` or a list of them, applied in order; `about` defaults to the centre
/// of the body's bounding box.
geometry::ShapePtr apply_turns(geometry::ShapePtr body, const Node& v) {
  for (const Node& t : v.items_or_single()) {
    if (!t.is_map()) t.fail(fmt::format("must be a block {{axis, angle, about}}, got {}", t.found()));
    t.allow({"axis", "angle", "about"});
    const Vec3 axis = read_direction(t.require("axis"));
    const double angle = read_angle(t.require("angle"));
    const Vec3 about = t.has("about") ? read_position(*t.get("about")) : geometry::bounds_center(body->bounds());
    t.done();
    body = geometry::make_turned(body, axis, angle, about);
  }
  return body;
}

geometry::ShapePtr apply_array(geometry::ShapePtr body, const Node& v) {
  if (!v.is_map()) v.fail(fmt::format("must be a block {{count: [nx, ny, nz], pitch: [px, py, pz]}}, got {}", v.found()));
  v.allow({"count", "pitch"});
  const Node count = v.require("count");
  if (!count.is_list() || count.items().size() != 3)
    count.fail(fmt::format("must be three whole numbers [nx, ny, nz], got {}", count.found()));
  std::array<int, 3> n{};
  for (int a = 0; a < 3; ++a) {
    const Node c = count.items()[static_cast<std::size_t>(a)];
    const long k = read_whole_number(c, 1);
    if (k > 100000) c.fail(fmt::format("is far too many copies, got '{}'", c.text()));
    n[a] = static_cast<int>(k);
  }
  const Node pitch = v.require("pitch");
  const Vec3 p = read_position(pitch);
  const geometry::Aabb box = body->bounds();
  for (int a = 0; a < 3; ++a) {
    if (n[a] < 2) continue;
    const Node at = pitch.items()[static_cast<std::size_t>(a)];
    if (!(p[a] > 0)) at.fail(fmt::format("must be a positive length where the count is above 1, got '{}'", at.text()));
    if (!std::isfinite(box.lo[a]) || !std::isfinite(box.hi[a]))
      count.fail(fmt::format("repeats along {} a body that is unbounded along {}", "xyz"[a], "xyz"[a]));
  }
  v.done();
  return geometry::make_periodic_array(body, n, p);
}

/// A shape with its `move` and `turn` (turns first, about the shape's own centre by default).
geometry::ShapePtr read_placed_shape(const std::string& shape, const Node& item, solver::Scene& scene,
                                     geometry::ShapePtr cut) {
  geometry::ShapePtr body = read_shape(shape, item, scene);
  if (cut) body = geometry::make_difference(body, cut);
  if (auto t = item.get("turn")) body = apply_turns(body, *t);
  if (auto m = item.get("move")) body = geometry::make_moved(body, read_position(*m));
  return body;
}

/// `minus`: one shape block or a list of them (each with optional move/turn), cut from the body.
geometry::ShapePtr read_cuts(const Node& v, solver::Scene& scene) {
  std::vector<geometry::ShapePtr> cuts;
  for (const Node& c : v.items_or_single()) {
    const std::string shape = check_keys(c, {"shape"}, cut_keys);
    cuts.push_back(read_placed_shape(shape, c, scene, nullptr));
    c.done();
  }
  if (cuts.empty()) v.fail("must hold at least one shape to cut away");
  return geometry::make_union(cuts);
}

}  // namespace

void read_bodies(const Node& list, solver::Scene& scene) {
  for (const Node& item : list.items_or_single()) {
    const std::string shape = check_keys(item, {"shape", "material", "name"}, body_keys);
    solver::BodySpec body;
    body.where = item.where();
    body.material = material_index(item.require("material"), scene);
    if (auto name = item.get("name")) {
      body.name = read_text(*name);
      for (const auto& other : scene.bodies)
        if (other.name == body.name)
          name->fail(fmt::format("the body name '{}' is already used by {}", body.name, other.where.key_path));
    }
    geometry::ShapePtr cut;
    if (auto m = item.get("minus")) cut = read_cuts(*m, scene);
    body.shape = read_placed_shape(shape, item, scene, cut);
    if (auto a = item.get("array")) body.shape = apply_array(body.shape, *a);
    item.done();
    scene.bodies.push_back(std::move(body));
  }
}

}  // namespace yeegap::io
