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
#include "sensor_report.h"
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

// Power a dipole of current moment |I l| radiates in a lossless background of index n:
// P0 = n eta0 k0^2 |I l|^2 / (12 pi) (Jackson 1999, eq. 9.24, with eta = eta0/n and k = n k0).
double dipole_power_in_background(double omega, double il, double n) {
  const double k0 = omega / constants::c0;
  return n * constants::eta0 * k0 * k0 * il * il / (12 * constants::pi);
}

// A figure for the terminal. A normalised value is not defined when its normaliser is zero (a run
// stopped before any incident light or source spectrum was recorded): shown as "undefined", with
// one line saying why at the end, instead of "-nan". JSON gives null for these (json.h).
bool undefined_shown = false;
std::string shown(double v, const char* spec = "{:.5g}") {
  if (std::isfinite(v)) return fmt::format(fmt::runtime(spec), v);
  undefined_shown = true;
  return "undefined";
}

// Headline figures of each output, as JSON, and one human line each on stderr.
std::string headlines(const solver::RunResults& r, const solver::Scene& scene) {
  JsonObject outs;
  const double n_bg = std::sqrt(scene.materials[scene.domain.background].poles.eps_inf);
  for (const auto& f : r.fluxes) {
    std::vector<std::string> rows;
    std::fprintf(stderr, "  flux %s:\n", f.name.c_str());
    for (std::size_t q = 0; q < f.omegas.size(); ++q) {
      JsonObject row;
      const double lambda_nm = 2 * constants::pi * constants::c0 / f.omegas[q] * 1e9;
      row.number("wavelength_nm", lambda_nm).number("power", f.power[q]);
      std::string rel;
      if (r.source_spectra.size() == 1) {
        // Normalised to the same dipole alone in the background: for a box around the dipole this
        // is the total decay-rate enhancement; for a box around everything, the radiative one.
        const auto it = std::find(r.source_omegas.begin(), r.source_omegas.end(), f.omegas[q]);
        const double il = std::abs(r.source_spectra[0][it - r.source_omegas.begin()]);
        const double rel_power = f.power[q] / dipole_power_in_background(f.omegas[q], il, n_bg);
        row.number("relative_to_dipole_alone", rel_power);
        rel = fmt::format("  ({} x the dipole alone)", shown(rel_power, "{:.4f}"));
      }
      if (!f.fraction.empty()) {
        row.number("fraction_of_incident", f.fraction[q]);
        rel += fmt::format("  ({} of the incident power)", shown(f.fraction[q], "{:.5f}"));
      }
      std::fprintf(stderr, "    %8.2f nm  %s%s\n", lambda_nm, shown(f.power[q]).c_str(), rel.c_str());
      rows.push_back(row.str());
    }
    outs.add(f.name, json_array(rows));
  }
  for (const auto& t : r.reflectance) {
    std::vector<std::string> rows;
    std::fprintf(stderr, "  %s (%s, incident index %.4g)%s: wavelength, angle, R, T, A\n", t.name.c_str(),
                 t.p_polarized ? "p" : "s", t.incident_index, t.angle_scan ? ", angle scan" : ", each frequency at its own angle");
    for (std::size_t q = 0; q < t.omegas.size(); ++q) {
      const double lambda_nm = 2 * constants::pi * constants::c0 / t.omegas[q] * 1e9;
      const double angle_deg = t.angles[q] * 180 / constants::pi;
      JsonObject row;
      row.number("wavelength_nm", lambda_nm).number("angle_deg", angle_deg).number("R", t.reflectance[q])
          .number("T", t.transmittance[q]).number("A", t.absorptance[q]);
      rows.push_back(row.str());
      std::fprintf(stderr, "    %8.2f nm  %7.3f deg  %s  %s  %s\n", lambda_nm, angle_deg,
                   shown(t.reflectance[q], "{:.5f}").c_str(), shown(t.transmittance[q], "{:.5f}").c_str(),
                   shown(t.absorptance[q], "{:.5f}").c_str());
    }
    outs.add(t.name, json_array(rows));
  }
  for (const auto& o : r.orders) {
    std::vector<std::string> rows;
    std::fprintf(stderr, "  %s: wavelength, reflected (r) and transmitted (t) orders m: efficiency at angle\n", o.name.c_str());
    for (std::size_t q = 0; q < o.omegas.size(); ++q) {
      const double lambda_nm = 2 * constants::pi * constants::c0 / o.omegas[q] * 1e9;
      std::string line;
      for (std::size_t e = 0; e < o.row.size(); ++e) {
        if (o.row[e] != static_cast<int>(q)) continue;
        const double angle_deg = o.angle[e] * 180 / constants::pi;
        const std::string order = o.diffracting[1] ? fmt::format("{},{}", o.order_b[e], o.order_c[e])
                                                   : fmt::format("{:+d}", o.order_b[e]);
        line += fmt::format("  {}{}: {} at {:.1f} deg", o.side[e] < 0 ? "r" : "t", order, shown(o.efficiency[e], "{:.4f}"), angle_deg);
        JsonObject row;
        row.number("wavelength_nm", lambda_nm).number("side", o.side[e]).number("order_0", o.order_b[e])
            .number("order_1", o.order_c[e]).number("angle_deg", angle_deg).number("efficiency", o.efficiency[e]);
        rows.push_back(row.str());
      }
      std::fprintf(stderr, "    %8.2f nm%s\n", lambda_nm, line.c_str());
    }
    outs.add(o.name, json_array(rows));
  }
  for (const auto& g : r.tunnelling_gaps) {
    const auto body_name = [&](int i) {
      return scene.bodies[i].name.empty() ? fmt::format("body {}", i) : scene.bodies[i].name;
    };
    std::fprintf(stderr, "  gap %s - %s: %ld cells below %.3g nm, narrowest %.3g nm (%s)\n", body_name(g.pair[0]).c_str(),
                 body_name(g.pair[1]).c_str(), g.cells, g.cutoff * 1e9, g.smallest_width * 1e9,
                 g.quantum ? "quantum-corrected" : "classical");
  }
  for (const auto& c : r.cross_sections) {
    std::vector<std::string> rows;
    const char* unit = c.per_unit_length ? "nm" : "nm^2";
    const double scale = c.per_unit_length ? 1e9 : 1e18;
    std::fprintf(stderr, "  cross sections %s (%s): wavelength, extinction, scattering, absorption\n", c.name.c_str(), unit);
    for (std::size_t q = 0; q < c.omegas.size(); ++q) {
      const double lambda_nm = 2 * constants::pi * constants::c0 / c.omegas[q] * 1e9;
      JsonObject row;
      row.number("wavelength_nm", lambda_nm).number("extinction", c.extinction[q]).number("scattering", c.scattering[q])
          .number("absorption", c.absorption[q]);
      rows.push_back(row.str());
      std::fprintf(stderr, "    %8.2f nm  %s  %s  %s\n", lambda_nm, shown(c.extinction[q] * scale).c_str(),
                   shown(c.scattering[q] * scale).c_str(), shown(c.absorption[q] * scale).c_str());
    }
    outs.add(c.name, json_array(rows));
  }
  for (const auto& f : r.far_fields) {
    std::vector<std::string> rows;
    std::fprintf(stderr, "  far field %s: wavelength, radiated power%s, peak directivity%s\n", f.name.c_str(),
                 r.source_spectra.size() == 1 ? " (x the dipole alone)" : "",
                 f.collected.empty() ? "" : ", fraction collected");
    for (std::size_t q = 0; q < f.omegas.size(); ++q) {
      const double lambda_nm = 2 * constants::pi * constants::c0 / f.omegas[q] * 1e9;
      double peak = 0;
      for (double d : f.directivity[q]) peak = std::max(peak, d);
      JsonObject row;
      row.number("wavelength_nm", lambda_nm).number("power", f.power[q]).number("peak_directivity", peak);
      double value = f.power[q];
      if (r.source_spectra.size() == 1) {
        const auto it = std::find(r.source_omegas.begin(), r.source_omegas.end(), f.omegas[q]);
        const double il = std::abs(r.source_spectra[0][it - r.source_omegas.begin()]);
        value = f.power[q] / dipole_power_in_background(f.omegas[q], il, n_bg);
        row.number("relative_to_dipole_alone", value);
      }
      std::string collected;
      if (!f.collected.empty()) {
        row.number("collected_fraction", f.collected[q] / f.power[q]);
        collected = "  " + shown(f.collected[q] / f.power[q], "{:.4f}");
      }
      std::fprintf(stderr, "    %8.2f nm  %s  %s%s\n", lambda_nm, shown(value).c_str(), shown(peak, "{:.3f}").c_str(), collected.c_str());
      rows.push_back(row.str());
    }
    outs.add(f.name, json_array(rows));
  }
  for (const auto& d : r.decay_rates) {
    std::vector<std::string> rows;
    std::fprintf(stderr, "  decay rate %s (dipole %d): wavelength, total enhancement%s\n", d.name.c_str(), d.dipole,
                 d.radiative.empty() ? "" : ", radiative, quantum efficiency");
    for (std::size_t q = 0; q < d.omegas.size(); ++q) {
      const double lambda_nm = 2 * constants::pi * constants::c0 / d.omegas[q] * 1e9;
      JsonObject row;
      row.number("wavelength_nm", lambda_nm).number("total", d.total[q]);
      std::string more;
      if (!d.radiative.empty()) {
        row.number("radiative", d.radiative[q]).number("efficiency", d.efficiency[q]);
        more = "  " + shown(d.radiative[q]) + "  " + shown(d.efficiency[q], "{:.4f}");
      }
      std::fprintf(stderr, "    %8.2f nm  %s%s\n", lambda_nm, shown(d.total[q]).c_str(), more.c_str());
      rows.push_back(row.str());
    }
    outs.add(d.name, json_array(rows));
  }
  for (const auto& m : r.field_maps) {
    std::vector<std::string> rows;
    for (std::size_t q = 0; q < m.omegas.size(); ++q) {
      double peak = 0;
      for (std::size_t c = 0; c < m.components.size(); ++c)
        if (solver::is_electric(m.components[c]))
          for (std::size_t p = 0; p < m.values[q][c].size(); ++p) {
            double e2 = 0;
            for (std::size_t c2 = 0; c2 < m.components.size(); ++c2)
              if (solver::is_electric(m.components[c2])) e2 += std::norm(m.values[q][c2][p]);
            peak = std::max(peak, e2);
          }
      JsonObject row;
      row.number("wavelength_nm", 2 * constants::pi * constants::c0 / m.omegas[q] * 1e9).number("peak_E_squared", peak);
      rows.push_back(row.str());
    }
    std::fprintf(stderr, "  field map %s: %zu x %zu x %zu nodes, %zu frequencies\n", m.name.c_str(), m.x.size(), m.y.size(),
                 m.z.size(), m.omegas.size());
    outs.add(m.name, json_array(rows));
  }
  for (const auto& p : r.probes) {
    std::vector<std::string> rows;
    for (std::size_t c = 0; c < p.components.size(); ++c) {
      double peak = 0;
      for (double v : p.values[c]) peak = std::max(peak, std::abs(v));
      JsonObject row;
      row.text("component", solver::component_names[static_cast<int>(p.components[c])]).number("peak", peak);
      rows.push_back(row.str());
    }
    std::fprintf(stderr, "  probe %s: %zu samples\n", p.name.c_str(), p.time.size());
    outs.add(p.name, json_array(rows));
  }
  for (const auto& x : r.sensors) outs.add(x.name, report_sensor(x));
  if (undefined_shown)
    std::fprintf(stderr, "yeegap: note: 'undefined' values are normalised by light or a source spectrum that was not "
                 "recorded yet: the run stopped before the pulse reached them (see stop in docs/scene.md)\n");
  return outs.str();
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
  if (planned.kind == solver::RunKind::angle_scan && !scene.sensors.empty() && !run.interrupted && !diverged) {
    // The sensor's repeats of the scan (sensing medium's index raised; bound layer taken away). The
    // finished scan is checkpointed first; a signal during the repeats stops them, writes the scan's
    // results as partial ones and exits 3, and --resume runs the repeats again (they are not
    // checkpointed themselves).
    try {
      io::write_checkpoint(checkpoint.path, *state, scene, checkpoint.info);
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
    const bool complete = state->run_repeats(run.results, [&](const solver::Progress& p) { progress.update(p); },
                                             [&] { return signals.received() != 0; });
    if (!complete) {
      progress.break_line();
      run.interrupted = true;
      run.results.summary.stop_reason = "interrupted";
      std::fprintf(stderr, "yeegap: stopped by %s during the sensor's repeats of the scan; the finished scan is in %s "
                   "(its reflectance is written below as partial results)\n",
                   signals.received() == SIGINT ? "SIGINT" : "SIGTERM", checkpoint.path.c_str());
    }
  }
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
  const auto& s = results.summary;
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
  const std::string outs = headlines(results, scene);
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
