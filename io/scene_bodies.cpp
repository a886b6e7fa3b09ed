// The `bodies` list: each item is a shape word, its size keys and a material name, built with the
// factories of geometry/shapes.h. Later bodies overwrite earlier ones where they overlap.
#include <algorithm>
#include <map>

#include <fmt/format.h>

#include "geometry/shapes.h"
#include "io/read_values.h"
#include "io/scene_blocks.h"

namespace yeegap::io {
namespace {

// The keys each shape takes besides 'shape' and 'material'.
const std::map<std::string, std::vector<std::string>> shape_keys = {
    {"sphere", {"center", "radius"}},
    {"box", {"center", "size"}},
    {"slab", {"axis", "from", "to"}},
    {"cylinder", {"center", "axis", "radius", "length"}},
};
const std::vector<std::string> planned_shapes = {"ellipsoid", "cone", "prism", "mesh"};
const std::vector<std::string> planned_body_keys = {"move", "turn", "minus"};

geometry::ShapePtr read_shape(const std::string& shape, const Node& item) {
  if (shape == "sphere")
    return geometry::make_sphere(read_position(item.require("center")), read_positive_length(item.require("radius")));
  if (shape == "box") return geometry::make_box(read_position(item.require("center")), read_extent(item.require("size")));
  if (shape == "slab") {
    const int axis = read_axis(item.require("axis"));
    const double from = read_length(item.require("from"));
    const Node to = item.require("to");
    const double to_m = read_length(to);
    if (!(to_m > from))
      to.fail(fmt::format("must be above 'from' ({}), got '{}'", format_length(from), to.text()));
    return geometry::make_slab(axis, from, to_m);
  }
  // cylinder
  const Vec3 center = read_position(item.require("center"));
  const Vec3 axis = read_direction(item.require("axis"));
  const double radius = read_positive_length(item.require("radius"));
  return geometry::make_cylinder(center, axis, radius, read_positive_length(item.require("length")));
}

}  // namespace

void read_bodies(const Node& list, solver::Scene& scene) {
  std::vector<std::string> shape_words;
  for (const auto& [word, keys] : shape_keys) shape_words.push_back(word);
  for (const Node& item : list.items_or_single()) {
    if (!item.is_map())
      item.fail(fmt::format("must be a block with 'shape', 'material' and the shape's sizes, got {}", item.found()));
    if (!item.has("shape")) {
      // A misspelt 'shape' is better reported as that than as a missing key.
      std::vector<std::string> all = {"shape", "material", "name"};
      for (const auto& [word, keys] : shape_keys)
        for (const std::string& k : keys)
          if (std::find(all.begin(), all.end(), k) == all.end()) all.push_back(k);
      item.allow(all, planned_body_keys);
    }
    const std::string shape = read_word(item.require("shape"), shape_words, planned_shapes);
    std::vector<std::string> keys = {"shape", "material", "name"};
    const auto& own = shape_keys.at(shape);
    keys.insert(keys.end(), own.begin(), own.end());
    // A key of another shape gets a message that says so, rather than a far-fetched suggestion.
    for (const auto& [other, other_keys] : shape_keys)
      for (const std::string& k : other_keys)
        if (item.has(k) && std::find(keys.begin(), keys.end(), k) == keys.end())
          item.fail_key(k, fmt::format("{}: a {} takes no '{}'; its keys are {}", item.path(), shape, k,
                                       fmt::join(keys, ", ")));
    item.allow(keys, planned_body_keys);

    solver::BodySpec body;
    body.where = item.where();
    body.material = material_index(item.require("material"), scene);
    if (auto name = item.get("name")) {
      body.name = read_text(*name);
      for (const auto& other : scene.bodies)
        if (other.name == body.name)
          name->fail(fmt::format("the body name '{}' is already used by {}", body.name, other.where.key_path));
    }
    body.shape = read_shape(shape, item);
    item.done();
    scene.bodies.push_back(std::move(body));
  }
}

}  // namespace yeegap::io
