// The one rule every fuzz target checks: a mistake in user input is a SceneError or a RunError, which
// the program reports and exits 2 on. Any other exception escaping a reader is a finding, as are the
// crashes, YG_CHECK aborts, sanitizer reports and hangs that libFuzzer catches by itself.
#pragma once

#include <cstdio>
#include <cstdlib>
#include <exception>
#include <typeinfo>

#include "base/errors.h"

namespace yeegap::fuzz {

/// Runs `read`; swallows the user errors, aborts (a libFuzzer crash) naming anything else that escapes.
template <class Read>
void expect_only_user_errors(Read&& read) {
  try {
    read();
  } catch (const SceneError&) {
  } catch (const RunError&) {
  } catch (const std::exception& e) {
    std::fprintf(stderr, "fuzz finding: %s escaped instead of a SceneError: %s\n", typeid(e).name(), e.what());
    std::abort();
  } catch (...) {
    std::fprintf(stderr, "fuzz finding: an exception that is not a std::exception escaped\n");
    std::abort();
  }
}

/// Stops the run naming a broken promise of an interface (a result its header rules out).
[[noreturn]] inline void broken_promise(const char* what) {
  std::fprintf(stderr, "fuzz finding: %s\n", what);
  std::abort();
}

}  // namespace yeegap::fuzz
