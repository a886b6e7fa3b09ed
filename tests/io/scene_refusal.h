// Shared scaffolding of the reader tests: the SceneError a reading call raises, or a failed test
// (and an empty error) when it accepts its input. Each test file wraps it with its own scene head.
#pragma once

#include <gtest/gtest.h>

#include <string>
#include <utility>

#include "base/errors.h"
#include "io/scene/scene_reader.h"

namespace yeegap::io::testing {

template <class Read>
SceneError refusal_of(Read&& read, const std::string& input) {
  try {
    std::forward<Read>(read)();
  } catch (const SceneError& e) {
    return e;
  }
  ADD_FAILURE() << "accepted:\n" << input;
  return SceneError(Where{}, "");
}

/// The error read_scene_text raises for `text`, read as the file `file`.
inline SceneError scene_refusal(const std::string& text, const std::string& file = "bad.yaml") {
  return refusal_of([&] { read_scene_text(text, file); }, text);
}

}  // namespace yeegap::io::testing
