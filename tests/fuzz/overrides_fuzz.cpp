// Fuzzes the --set overrides (io/scene/overrides.h) with the reading they feed, so the path walk and the
// messages that point at an override (it has no line in the file) are both exercised. Input: one
// override per line up to the first empty line, then the scene; with no empty line, all lines are
// overrides on a small built-in scene with a list of bodies, materials and outputs.
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "fuzz_support.h"
#include "io/scene/scene_reader.h"
#include "scene_dir.h"

namespace {

constexpr const char* built_in_scene = R"(scene: {version: 1, title: built-in}
domain:
  size: [400 nm, 400 nm, 400 nm]
  step: 5 nm
  edges: cpml
materials:
  glass: {index: 1.5}
  metal: {poles: {eps_inf: 1, drude: [{plasma_frequency: 9 eV, damping: 70 meV}]}}
bodies:
  - {shape: sphere, material: glass, center: [0, 0, -40 nm], radius: 40 nm}
  - {shape: box, material: metal, center: [0, 0, 60 nm], size: [60 nm, 60 nm, 20 nm]}
excitation:
  - dipole: {position: [0, 0, 20 nm], direction: z, band: {from: 450 nm, to: 900 nm}}
outputs:
  - probe: {name: p, position: [0, 0, 20 nm], components: [Ez]}
  - flux: {name: f, box: {from: [-10 nm, -10 nm, 10 nm], to: [10 nm, 10 nm, 30 nm]}, frequencies: [500 nm, 600 nm]}
stop: {after: 50 fs}
)";

void drop_note(const std::string& message) { static_cast<void>(message.size()); }

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view input(reinterpret_cast<const char*>(data), size);
  std::vector<std::string> overrides;
  std::string scene = built_in_scene;
  std::size_t pos = 0;
  while (pos < input.size()) {
    const std::size_t newline = input.find('\n', pos);
    const std::size_t end = newline == std::string_view::npos ? input.size() : newline;
    if (end == pos) {  // the empty line: the rest is the scene
      scene = std::string(input.substr(pos + 1));
      break;
    }
    overrides.emplace_back(input.substr(pos, end - pos));
    pos = end + 1;
  }
  yeegap::fuzz::expect_only_user_errors(
      [&] { yeegap::io::read_scene_text(scene, yeegap::fuzz::scene_label(), overrides, drop_note); });
  return 0;
}
