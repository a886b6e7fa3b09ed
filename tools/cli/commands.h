// The verbs of the `yeegap` program (naming.md). Each verb registers itself on the CLI11 app and
// returns the exit code through the callback's shared state.
#pragma once

#include <CLI/CLI.hpp>

namespace yeegap::cli {

/// Exit codes: 0 success, 1 a failure of the program or the system (disk, memory),
/// 2 a mistake in the user's input (scene, option, unstable setting, a checkpoint that does not
/// fit), found before running, 3 `run` stopped by SIGINT or SIGTERM after writing its checkpoint
/// and partial results (`run --resume` finishes it).
inline constexpr int exit_ok = 0;
inline constexpr int exit_failure = 1;
inline constexpr int exit_user_error = 2;
inline constexpr int exit_interrupted = 3;
// The fields diverged (not finite, or growing without bound): results written as they stood.
inline constexpr int exit_diverged = 4;

/// `command_line` is the program's arguments joined by spaces, stored with the results.
void add_run_command(CLI::App& app, int& exit_code, const std::string& command_line);
void add_check_command(CLI::App& app, int& exit_code);
void add_sweep_command(CLI::App& app, int& exit_code, const std::string& command_line);
void add_view_command(CLI::App& app, int& exit_code);
void add_tunnelling_command(CLI::App& app, int& exit_code);
void add_materials_command(CLI::App& app, int& exit_code);
/// A verb's old name: recognised, and refused with exit_user_error and the new name
/// ("yeegap: the verb 'gap' is now 'tunnelling' (same options): yeegap tunnelling ...").
void add_renamed_verb(CLI::App& app, int& exit_code, const std::string& old_verb, const std::string& new_verb);

/// Runs `body`, turning user errors into a message and exit_user_error, other failures into
/// exit_failure; prints to stderr.
int guarded(const std::function<int()>& body);

}  // namespace yeegap::cli
