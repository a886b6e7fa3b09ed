// Reading a scene file (YAML) into the typed, validated solver::Scene, in SI units. The format is
// documented key by key in docs/scene.md. Every mistake in the text is a SceneError with file,
// line, column, key path, what was expected and what was found.
#pragma once

#include <string>
#include <vector>

#include "io/scene/scene_notes.h"
#include "io/sweep/sweep_expand.h"
#include "solver/scene.h"

namespace yeegap::io {

/// Reads and validates the scene at `path`. `overrides` are "key.path=value" edits (the --set
/// option of `yeegap run`) applied before validation, e.g. "domain.step=2 nm". Notes and warnings
/// that do not stop the reading (a table fit's error, a band outside a library range) go to `notes`.
solver::Scene read_scene_file(const std::string& path, const std::vector<std::string>& overrides = {},
                              const NoteSink& notes = notes_to_stderr);

/// The same for scene text held in memory; `file_label` names it in messages and Scene::file, and
/// relative table files are looked for beside it. A scene with a `sweep` block is refused here
/// with a message pointing at `yeegap sweep` and `run --point K`: it is many scenes, not one.
solver::Scene read_scene_text(const std::string& text, const std::string& file_label,
                              const std::vector<std::string>& overrides = {},
                              const NoteSink& notes = notes_to_stderr);

/// Point `point` of a scene with a sweep block (`plan` read from the same text by read_sweep_plan):
/// the text with that point's values in place of each ${name}, read as above. Scene::text is the
/// substituted text, so a results file holds the scene exactly as it ran. Errors keep the file's
/// lines and columns; one about a substituted value names the parameter, its value and the point.
solver::Scene read_scene_point(const std::string& text, const std::string& file_label, const SweepPlan& plan,
                               std::size_t point, const std::vector<std::string>& overrides = {},
                               const NoteSink& notes = notes_to_stderr);

/// The whole text of a scene file; SceneError naming the file if it cannot be read.
std::string read_scene_file_text(const std::string& path);

}  // namespace yeegap::io
