// The default sink for the scene reader's notes and warnings (scene_notes.h).
#include "io/scene/scene_notes.h"

#include <cstdio>

namespace yeegap::io {

void notes_to_stderr(const std::string& message) { std::fprintf(stderr, "%s\n", message.c_str()); }

}  // namespace yeegap::io
