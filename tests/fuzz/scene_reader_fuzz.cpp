// Fuzzes reading a whole scene from YAML text (io/scene/scene_reader.h), the program's main user input.
// Every mistake must come back as a SceneError or RunError; a sweep scene is also read at its first
// and last point, which runs the ${name} substitution and its column bookkeeping.
#include <cstddef>
#include <cstdint>
#include <string>

#include "fuzz_support.h"
#include "io/scene/scene_reader.h"
#include "io/sweep/sweep_expand.h"
#include "scene_dir.h"

namespace {

// The notes are built (their formatting is code too) and dropped.
void drop_note(const std::string& message) { static_cast<void>(message.size()); }

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace yeegap::io;
  const std::string text(reinterpret_cast<const char*>(data), size);
  const std::string& label = yeegap::fuzz::scene_label();
  yeegap::fuzz::expect_only_user_errors([&] { read_scene_text(text, label, {}, drop_note); });
  yeegap::fuzz::expect_only_user_errors([&] {
    const SweepPlan plan = read_sweep_plan(text, label);
    if (plan.empty()) return;
    const std::size_t points = plan.point_count();
    if (points == 0) yeegap::fuzz::broken_promise("a sweep plan with parameters has no points");
    plan.describe(points - 1);
    read_scene_point(text, label, plan, 0, {}, drop_note);
    if (points > 1) read_scene_point(text, label, plan, points - 1, {}, drop_note);
  });
  return 0;
}
