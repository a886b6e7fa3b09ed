// Turns exceptions into messages and exit codes (see commands.h).
#include <cstdio>
#include <new>

#include "base/errors.h"
#include "commands.h"

namespace yeegap::cli {

int guarded(const std::function<int()>& body) {
  try {
    return body();
  } catch (const SceneError& e) {
    std::fprintf(stderr, "%s\n", e.what());
    return exit_user_error;
  } catch (const RunError& e) {
    std::fprintf(stderr, "%s\n", e.what());
    return exit_user_error;
  } catch (const std::bad_alloc&) {
    std::fprintf(stderr, "yeegap: out of memory; `yeegap check` shows what the scene needs\n");
    return exit_failure;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "yeegap: %s\n", e.what());
    return exit_failure;
  }
}

}  // namespace yeegap::cli
