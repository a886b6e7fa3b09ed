// yeegap: the command-line program, a thin layer over the io, solver, geometry and materials
// libraries. Machine-readable output (--json) goes to stdout; messages and progress to stderr.
#include <cstdio>
#include <string>

#include <CLI/CLI.hpp>

#include "commands.h"

int main(int argc, char** argv) {
  CLI::App app{
      "yeegap " YEEGAP_VERSION " - full-wave FDTD solver for plasmonic gaps and metal films\n\n"
      "Examples:\n"
      "  yeegap check examples/dipole_near_sphere.yaml          validate a scene, print grid and cost\n"
      "  yeegap run examples/dipole_near_sphere.yaml --threads 2 run it; results go next to the scene (.h5)\n"
      "  yeegap run scene.yaml --set domain.step=2nm -o fine.h5  override a value for this run\n"
      "  yeegap sweep examples/tunnelling_gap_sweep.yaml         every point of a sweep, merged into one table\n"};
  app.set_version_flag("--version", "yeegap " YEEGAP_VERSION);
  app.require_subcommand(1);
  int exit_code = yeegap::cli::exit_ok;
  std::string command_line = "yeegap";
  for (int i = 1; i < argc; ++i) command_line += std::string(" ") + argv[i];
  yeegap::cli::add_run_command(app, exit_code, command_line);
  yeegap::cli::add_check_command(app, exit_code);
  yeegap::cli::add_sweep_command(app, exit_code, command_line);
  yeegap::cli::add_view_command(app, exit_code);
  yeegap::cli::add_tunnelling_command(app, exit_code);
  yeegap::cli::add_materials_command(app, exit_code);
  yeegap::cli::add_renamed_verb(app, exit_code, "gap", "tunnelling");
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    // CLI11 returns 0 for --help and --version; any other parse problem is a user error.
    return code == 0 ? 0 : yeegap::cli::exit_user_error;
  }
  return exit_code;
}
