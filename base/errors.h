// The two kinds of failure: a user error in a scene or data file (SceneError, says where and what
// was expected; the program exits with code 2 and runs nothing), and a broken invariant (our bug:
// YG_CHECK in setup code, always on; YG_ASSERT in hot code, compiled out in release builds).
#pragma once

#include <cstdio>
#include <cstdlib>
#include <stdexcept>
#include <string>

#include "base/where.h"

namespace yeegap {

/// A mistake in the user's input. what() is the full message "file:line:col: key: text".
class SceneError : public std::runtime_error {
 public:
  SceneError(Where where, const std::string& message)
      : std::runtime_error(format(where, message)), where_(std::move(where)), message_(message) {}
  const Where& where() const { return where_; }
  const std::string& message() const { return message_; }

 private:
  static std::string format(const Where& w, const std::string& m) {
    std::string s = w.location();
    if (!s.empty()) s += ": ";
    return s + m;
  }
  Where where_;
  std::string message_;
};

/// A request that is well-formed but cannot be run (unstable time step, too little memory...).
class RunError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

namespace detail {
[[noreturn]] inline void check_failed(const char* condition, const char* file, int line, const std::string& message) {
  std::fprintf(stderr, "yeegap internal error: check '%s' failed at %s:%d: %s\n", condition, file, line,
               message.c_str());
  std::abort();
}
}  // namespace detail

}  // namespace yeegap

#define YG_CHECK(cond, msg) \
  ((cond) ? void(0) : ::yeegap::detail::check_failed(#cond, __FILE__, __LINE__, (msg)))

#ifdef NDEBUG
#define YG_ASSERT(cond, msg) ((void)0)
#else
#define YG_ASSERT(cond, msg) YG_CHECK(cond, msg)
#endif
