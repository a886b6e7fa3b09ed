// The sidecar and the plot script behind `yeegap view` and `yeegap run --plot`. The script is run
// with posix_spawn (no shell, so no quoting of paths) and its stdout joined to stderr.
#include "viewer_outputs.h"

#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <vector>

#include "io/results/xdmf_writer.h"

extern char** environ;

namespace yeegap::cli {

namespace {

// The plot script's own exit code for "numpy, h5py or matplotlib cannot be imported"; it has then
// already printed which package to install.
constexpr int plot_missing_packages = 3;

constexpr const char* install_hint =
    "install python3-matplotlib python3-h5py (Debian), or run tools/setup.sh";

std::string environment(const char* name) {
  const char* value = std::getenv(name);
  return value != nullptr ? value : "";
}

std::string plot_script() {
  std::string script = environment("YEEGAP_PLOT_SCRIPT");
#ifdef YEEGAP_SOURCE_DIR
  if (script.empty()) script = YEEGAP_SOURCE_DIR "/tools/plot/yeegap_plot.py";
#endif
  return script;
}

// Debian's python3-h5py and -matplotlib live under /usr/bin/python3; a python3 earlier on PATH
// (a version manager's, a virtual environment's) often lacks them.
std::string python() {
  std::string interpreter = environment("YEEGAP_PYTHON");
  if (interpreter.empty()) interpreter = ::access("/usr/bin/python3", X_OK) == 0 ? "/usr/bin/python3" : "python3";
  return interpreter;
}

/// Runs `argv` with its stdout sent to our stderr; returns the exit status, or -1 with errno set if
/// it could not start, or 128 + signal if a signal ended it.
int run_to_stderr(const std::vector<std::string>& argv) {
  std::vector<char*> args;
  for (const std::string& a : argv) args.push_back(const_cast<char*>(a.c_str()));
  args.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_adddup2(&actions, STDERR_FILENO, STDOUT_FILENO);
  std::fflush(stdout);
  std::fflush(stderr);
  pid_t pid = 0;
  const int started = posix_spawnp(&pid, args[0], &actions, nullptr, args.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  if (started != 0) {
    errno = started;
    return -1;
  }
  int status = 0;
  while (::waitpid(pid, &status, 0) < 0)
    if (errno != EINTR) return -1;
  if (WIFSIGNALED(status)) return 128 + WTERMSIG(status);
  return WEXITSTATUS(status);
}

}  // namespace

bool write_viewer_file(const std::string& results) {
  try {
    const std::string path = io::write_xdmf(results);
    std::fprintf(stderr, "yeegap: viewer file %s (ParaView: open it with the Xdmf3ReaderT reader)\n", path.c_str());
    return true;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "yeegap: %s\n", e.what());
    return false;
  }
}

bool make_plots(const std::string& results) {
  const std::string script = plot_script();
  if (script.empty() || !std::filesystem::is_regular_file(script)) {
    std::fprintf(stderr,
                 "yeegap: no plots: the plot script '%s' does not exist; set YEEGAP_PLOT_SCRIPT to "
                 "tools/plot/yeegap_plot.py of a yeegap source tree\n",
                 script.c_str());
    return false;
  }
  const std::string interpreter = python();
  const int code = run_to_stderr({interpreter, script, results});
  if (code == 0) return true;
  if (code == -1)
    std::fprintf(stderr, "yeegap: no plots: cannot start '%s' (%s); %s\n", interpreter.c_str(), std::strerror(errno),
                 install_hint);
  else if (code == 127)  // not found by name on PATH
    std::fprintf(stderr, "yeegap: no plots: no Python 3 found; %s\n", install_hint);
  else if (code != plot_missing_packages)  // that one has printed its own hint
    std::fprintf(stderr, "yeegap: no plots: the plot script failed (exit code %d)\n", code);
  return false;
}

}  // namespace yeegap::cli
