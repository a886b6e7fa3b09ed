// `yeegap run SCENE`: reads and checks the scene, refuses what cannot run before starting, runs it
// with progress on a terminal, writes one HDF5 results file and prints the headline figures
// (`--json`: one object on stdout for scripts and sweeps). Checkpoints every --checkpoint-every
// and on SIGINT/SIGTERM (then partial results and exit code 3); --resume continues from one.
#include <omp.h>

#include <algorithm>
#include <cmath>
#include <csignal>
#include <cstdio>
#include <ctime>
#include <filesystem>
#include <memory>
#include <optional>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "commands.h"
#include "io/results/checkpoint.h"
#include "io/results/results_writer.h"
#include "io/scene/scene_reader.h"
#include "io/results/xdmf_writer.h"
#include "io/sweep/sweep_table.h"
#include "json.h"
#include "machine_memory.h"
#include "progress.h"
#include "checkpointed_run.h"
#include "run_control.h"
#include "output_summaries.h"
#include "solver/runs/run_plan.h"
#include "solver/engine/simulation.h"
#include "viewer_outputs.h"

namespace yeegap::cli {

namespace {

struct RunOptions {
  std::string scene;
  std::string output;
  std::vector<std::string> overrides;
  int threads = 0;
  std::optional<std::size_t> point;  // one point of the scene's sweep
  bool json = false;
  bool plot = false;
  std::string checkpoint_every = "30min";
  bool resume = false;
  std::string memory;  // --memory: the most the run may use (default: what the machine has free)
  std::string command_line;
};

std::string default_output(const std::string& scene, std::optional<std::size_t> point) {
  std::filesystem::path p(scene);
  if (point) return p.replace_extension().string() + fmt::format("_point_{}.h5", *point);
  return p.replace_extension(".h5").string();
}

std::string now_iso8601() {
  const std::time_t t = std::time(nullptr);
  char buf[64];
  std::strftime(buf, sizeof buf, "%Y-%m-%dT%H:%M:%S%z", std::localtime(&t));
  return buf;
}

// The files a run writes (results, checkpoint, viewer sidecar) must not be files it reads: `-o
// scene.yaml` used to replace the scene with HDF5. Compared as files (same inode), so another
// spelling of the same path is caught too.
void refuse_overwriting_inputs(const std::string& output, const std::string& scene_path, const solver::Scene& scene) {
  std::vector<std::pair<std::string, std::string>> inputs{{scene_path, "the scene file"}};
  for (const solver::InputFile& f : scene.input_files) inputs.push_back({f.path, "the file of " + f.key_path});
  for (const std::string& written : {output, io::checkpoint_path(output), io::xdmf_path(output)})
    for (const auto& [path, what] : inputs) {
      std::error_code ec;
      if (std::filesystem::equivalent(written, path, ec) && !ec)
        throw SceneError(Where{}, fmt::format("--output {}: the run would write '{}', which is {} ('{}'); choose "
                                              "another results file (they end in .h5)",
                                              output, written, what, path));
    }
}

// The sensor's repeats of the scan (sensing medium's index raised; bound layer taken away). The
// finished scan is checkpointed first; a signal during the repeats stops them, writes the scan's
// results as partial ones and exits 3, and --resume runs the repeats again (they are not
// checkpointed themselves).
void run_sensor_repeats(solver::Run& state, const solver::Scene& scene, const CheckpointSettings& checkpoint,
                        CheckpointedResults& run) {
  try {
    io::write_checkpoint(checkpoint.path, state, scene, checkpoint.info);
  } catch (const std::exception& e) {
    std::fprintf(stderr, "yeegap: warning: %s; the sensor's repeats go on without it\n", e.what());
  }
  const solver::SensorSpec& spec = scene.sensors.front();
  std::fprintf(stderr, "yeegap: sensor: the scan again with the index of '%s' raised by %g%s%s\n",
               scene.materials[static_cast<std::size_t>(spec.medium)].name.c_str(), spec.delta_n,
               spec.binding >= 0 ? ", then with the bound layer taken away: " : "",
               spec.binding >= 0 ? scene.materials[static_cast<std::size_t>(spec.binding)].name.c_str() : "");
  ProgressLine progress;
  StopSignals signals;
  const bool complete = state.run_repeats(run.results, [&](const solver::Progress& p) { progress.update(p); },
                                          [&] { return signals.received() != 0; });
  if (complete) return;
  progress.break_line();
  run.interrupted = true;
  run.results.summary.stop_reason = "interrupted";
  std::fprintf(stderr, "yeegap: stopped by %s during the sensor's repeats of the scan; the finished scan is in %s "
               "(its reflectance is written below as partial results)\n",
               signals.received() == SIGINT ? "SIGINT" : "SIGTERM", checkpoint.path.c_str());
}

// The run's last lines before the outputs: steps and speed, how to resume, and what makes the
// spectra below untrustworthy (a pulse cut off, diverged fields).
void report_end(const solver::RunSummary& s, const std::string& output, bool interrupted, bool checkpoint_failed) {
  const bool diverged = s.stop_reason == "diverged";
  std::fprintf(stderr, "yeegap: %ld steps (%s) in %.1f s, %.1f Mcells/s; %sresults in %s\n", s.steps, s.stop_reason.c_str(),
               s.wall_seconds, s.cell_updates_per_second / 1e6, interrupted ? "partial " : "", output.c_str());
  if (interrupted && !checkpoint_failed)
    std::fprintf(stderr, "yeegap: to finish the run: the same command with --resume\n");
  // A run stopped by its time or step limit while a source still runs holds spectra of a
  // truncated excitation, finite and plausible-looking: say so beside them.
  if (!interrupted && !diverged && s.simulated_time < s.sources_end_time && std::isfinite(s.sources_end_time))
    std::fprintf(stderr,
                 "yeegap: warning: the run stopped at %.4g fs, before its sources ended (%.4g fs): the spectra below "
                 "are those of a cut-off pulse, not of the structure; lengthen stop.after or use stop.energy_below\n",
                 s.simulated_time * 1e15, s.sources_end_time * 1e15);
  if (diverged)
    std::fprintf(stderr,
                 "yeegap: error: the fields diverged by step %ld: %s. The results file holds what was recorded "
                 "(spectra are not valid). Usual causes: a time step set above the stability bound, a material "
                 "with gain, or a source far beyond the scene's scale (docs/running.md, exit codes)\n",
                 s.steps, s.divergence.c_str());
}

int execute_run(const RunOptions& o) {
  io::SweepPlan sweep;
  solver::Scene scene;
  if (o.point) {
    const std::string text = io::read_scene_file_text(o.scene);
    sweep = io::read_sweep_plan(text, o.scene);
    scene = io::read_scene_point(text, o.scene, sweep, *o.point, o.overrides);
  } else {
    scene = io::read_scene_file(o.scene, o.overrides);
  }
  const std::string output = o.output.empty() ? default_output(o.scene, o.point) : o.output;
  refuse_overwriting_inputs(output, o.scene, scene);
  io::check_writable(output);  // fail now, not after hours of computing
  if (o.threads > 0) omp_set_num_threads(o.threads);
  const int threads = omp_get_max_threads();
  const std::string started = now_iso8601();

  CheckpointSettings checkpoint{io::checkpoint_path(output), parse_duration(o.checkpoint_every).value_or(0),
                                {YEEGAP_VERSION, o.overrides}, {}};  // the duration was checked by the option
  if (o.point) checkpoint.info.overrides.push_back(fmt::format("(sweep point {})", *o.point));  // points share one text

  // One plan decides the kind of run (run_plan.h); before anything is allocated, a run that
  // cannot fit is refused, not started.
  const solver::RunPlan planned = solver::plan_run(scene);
  refuse_if_over_memory(static_cast<double>(planned.summary.memory_bytes),
                        o.memory.empty() ? std::nullopt : parse_memory_size(o.memory));
  const std::unique_ptr<solver::Run> state = solver::make_run(planned);
  checkpoint.position = [&state](long counter) { return state->position(counter); };
  const RunFunction run_function = [&](const auto& report, const auto& between_steps) {
    return state->run(report, between_steps);
  };
  resume_or_start(*state, scene, checkpoint, o.resume);
  const solver::ModelSummary plan = state->summary();
  std::fprintf(stderr, "yeegap: %s: %s; %d x %d x %d cells, dt %.4g fs, %s%ld steps, %.1f MB, %d thread%s\n",
               o.scene.c_str(), planned.description().c_str(), plan.cells[0], plan.cells[1], plan.cells[2],
               plan.time_step * 1e15, plan.steps_estimated ? "about " : "", plan.steps, plan.memory_bytes / 1e6, threads,
               threads == 1 ? "" : "s");
  for (const auto& w : plan.warnings) std::fprintf(stderr, "yeegap: warning: %s\n", w.c_str());
  if (plan.mixed_cells > 0)
    std::fprintf(stderr, "yeegap: %lld E locations on body surfaces averaged (domain.averaging)\n", plan.mixed_cells);
  CheckpointedResults run;
  {
    ProgressLine progress;
    run = run_with_checkpoints(*state, run_function, scene, checkpoint, progress);
  }
  const bool diverged = run.results.summary.stop_reason == "diverged";
  if (planned.kind == solver::RunKind::angle_scan && !scene.sensors.empty() && !run.interrupted && !diverged)
    run_sensor_repeats(*state, scene, checkpoint, run);
  const solver::RunResults& results = run.results;
  const bool interrupted = run.interrupted, checkpoint_failed = run.checkpoint_failed;
  std::error_code ec;
  io::write_results(output, results, scene, {YEEGAP_VERSION, o.command_line, started, threads});
  // With its /sweep record the file counts as a finished point for `yeegap sweep` (if named
  // point_NNNN.h5 in the sweep's folder); written after the results, so a failure here loses none.
  // Partial results of an interrupted run get none: the point is not finished.
  if (o.point && !interrupted && !diverged) io::write_point_record(output, sweep, *o.point, io::compute_figures(results, scene), o.overrides);
  write_viewer_file(output);  // a failure is reported; the results are safe either way
  // Finished: nothing left to resume. A diverged run keeps its last periodic checkpoint (from
  // before the divergence), which shows the state of a run that was still sound.
  if (!interrupted && !diverged) std::filesystem::remove(checkpoint.path, ec);
  report_end(results.summary, output, interrupted, checkpoint_failed);
  const auto& s = results.summary;
  const std::string outs = summarise_outputs(results, scene);
  if (o.json) {
    JsonObject j;
    j.text("results", output)
        .number("steps", static_cast<double>(s.steps))
        .text("stop_reason", s.stop_reason)
        .number("time_step_s", s.time_step)
        .number("wall_seconds", s.wall_seconds)
        .number("mcells_per_second", s.cell_updates_per_second / 1e6)
        .number("threads", threads)
        .add("outputs", outs);
    // The figures a sweep would tabulate for this run (spectrum peaks and where they are), SI
    // unless the name ends in a unit: the same names as the sweep table's columns.
    JsonObject figures;
    for (const io::Figure& f : io::compute_figures(results, scene)) figures.number(f.name, f.value);
    j.add("figures", figures.str());
    std::printf("%s\n", j.str().c_str());
  }
  if (interrupted) return checkpoint_failed ? exit_failure : exit_interrupted;
  if (diverged) return exit_diverged;
  if (o.plot) make_plots(output);  // a failure is reported but leaves the exit code alone
  return exit_ok;
}

}  // namespace

void add_run_command(CLI::App& app, int& exit_code, const std::string& command_line) {
  auto opts = std::make_shared<RunOptions>();
  CLI::App* cmd = app.add_subcommand("run", "run one scene and write its results file (HDF5)");
  cmd->footer(
      "Examples:\n"
      "  yeegap run examples/dipole_near_sphere.yaml\n"
      "  yeegap run scene.yaml -o out.h5 --threads 2 --set 'bodies[0].radius=45 nm' --json\n"
      "  yeegap run sweep_scene.yaml --point 2             one point of a scene's sweep block\n"
      "  yeegap run scene.yaml --checkpoint-every 10min     (then, after a kill or Ctrl-C:)\n"
      "  yeegap run scene.yaml --resume\n"
      "Exit codes: 0 done, 1 program or system failure, 2 input error, 3 stopped by SIGINT/SIGTERM\n"
      "(checkpoint and partial results written; --resume finishes the run).");
  cmd->add_option("scene", opts->scene, "scene file (YAML)")->required();
  cmd->add_option("-o,--output", opts->output, "results file (default: the scene's name with .h5)");
  cmd->add_option("--set", opts->overrides, "override a scene value, e.g. --set domain.step=2nm (repeatable)");
  cmd->add_option("--threads", opts->threads, "worker threads (default: all cores)")->check(CLI::PositiveNumber);
  cmd->add_option("--point", opts->point,
                  "for a scene with a sweep block: run this point of it (from 0; default output SCENE_point_K.h5)");
  cmd->add_flag("--json", opts->json, "print a one-object summary on stdout at the end");
  cmd->add_flag("--plot", opts->plot, "also write PNG and SVG figures next to the results (needs python3-matplotlib)");
  cmd->add_option("--checkpoint-every", opts->checkpoint_every,
                  "write a checkpoint (<results>.checkpoint.h5) this often: 30min, 90s, 2h, or off (default 30min)")
      ->check([](const std::string& v) {
        return parse_duration(v) ? std::string() : "expected a duration like 10min, 90s or 2h, or off; got '" + v + "'";
      });
  cmd->add_flag("--resume", opts->resume,
                "continue from the checkpoint next to the results file (same scene, --set values and program version)");
  add_memory_option(*cmd, opts->memory);
  opts->command_line = command_line;
  cmd->callback([opts, &exit_code] {
    exit_code = guarded([&] { return execute_run(*opts); });
  });
}

}  // namespace yeegap::cli
