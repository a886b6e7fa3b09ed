// Notes and warnings the scene reader has for the user that are not errors: the error of a pole fit
// made while loading a `table:` material, a source band that leaves a library entry's fitted range.
// They go to a sink the caller chooses (stderr by default), never through an exception, so a scene
// that deserves a warning still loads.
#pragma once

#include <functional>
#include <string>

namespace yeegap::io {

/// Receives one message at a time, complete ("scene.yaml:5:9: warning: ..."), without a newline.
using NoteSink = std::function<void(const std::string& message)>;

/// Writes the message and a newline to stderr: the sink the program uses.
void notes_to_stderr(const std::string& message);

}  // namespace yeegap::io
