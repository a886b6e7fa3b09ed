// `yeegap view RESULTS.h5`: makes a results file ready to look at: writes its XDMF sidecar for
// ParaView (<results>.xmf) and, unless --no-plots, the figures of the plot script (PNG and SVG
// next to the results file). Useful for results written before the sidecar existed, or copied
// from a cluster without their figures. A sweep's merged table (sweep.h5) gets its heat maps
// (spectrum over parameter and wavelength) and no sidecar: it holds no grid.
#include <cstdio>
#include <filesystem>

#include "commands.h"
#include "io/sweep/sweep_table.h"
#include "viewer_outputs.h"

namespace yeegap::cli {

namespace {

struct ViewOptions {
  std::string results;
  bool no_plots = false;
};

int run_view(const ViewOptions& o) {
  std::error_code ec;
  if (!std::filesystem::is_regular_file(o.results, ec)) {
    std::fprintf(stderr, "yeegap: results file '%s' does not exist\n", o.results.c_str());
    return exit_user_error;
  }
  if (io::is_sweep_table(o.results)) {
    if (o.no_plots) {
      std::fprintf(stderr, "yeegap: %s is a sweep table: nothing to write without plots (it has no grid for ParaView)\n",
                   o.results.c_str());
      return exit_ok;
    }
    return make_plots(o.results) ? exit_ok : exit_failure;
  }
  if (!write_viewer_file(o.results)) return exit_failure;
  if (!o.no_plots && !make_plots(o.results)) return exit_failure;
  return exit_ok;
}

}  // namespace

void add_view_command(CLI::App& app, int& exit_code) {
  auto opts = std::make_shared<ViewOptions>();
  CLI::App* cmd = app.add_subcommand("view", "write the ParaView file (.xmf) and the plots (PNG, SVG) of a results file");
  cmd->footer(
      "Examples:\n"
      "  yeegap view examples/dipole_near_sphere.h5              sidecar and plots next to the file\n"
      "  yeegap view run.h5 --no-plots                           only the sidecar (no Python needed)\n"
      "  yeegap view gaps_sweep/sweep.h5                         heat maps of a sweep's spectra\n"
      "Plots need /usr/bin/python3 with python3-matplotlib and python3-h5py (tools/setup.sh installs them).");
  cmd->add_option("results", opts->results, "results file (HDF5) written by yeegap run, or a sweep's sweep.h5")->required();
  cmd->add_flag("--no-plots", opts->no_plots, "write only the .xmf sidecar, no figures");
  cmd->callback([opts, &exit_code] { exit_code = guarded([&] { return run_view(*opts); }); });
}

}  // namespace yeegap::cli
