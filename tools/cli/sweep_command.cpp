// `yeegap sweep SCENE`: every point of the scene's sweep block, run here one after another (each
// with all threads) or N at a time (--jobs, threads split between them), one results file per point,
// points already finished skipped on a re-run, and the merged table (HDF5 + CSV). --batch slurm
// writes an array job script instead of running. Spreading points over MPI ranks is not built.
#include <omp.h>
#include <unistd.h>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <csignal>
#include <ctime>
#include <cstdio>
#include <exception>
#include <filesystem>
#include <mutex>
#include <optional>
#include <set>
#include <thread>

#include <fmt/format.h>

#include "base/errors.h"
#include "commands.h"
#include "io/results/results_writer.h"
#include "io/scene/scene_reader.h"
#include "io/sweep/sweep_table.h"
#include "json.h"
#include "machine_memory.h"
#include "progress.h"
#include "run_control.h"
#include "solver/runs/run_plan.h"
#include "solver/engine/simulation.h"
#include "sweep_batch.h"
#include "viewer_outputs.h"

namespace yeegap::cli {

namespace {

namespace fs = std::filesystem;

struct SweepOptions {
  std::string scene;
  std::string output;  // folder
  std::vector<std::string> overrides;
  int threads = 0;
  int jobs = 1;
  std::string batch;
  std::optional<std::size_t> point;
  bool merge_only = false;
  bool json = false;
  bool plot = false;
  std::string memory;  // --memory: the most all points running at once may use together
  std::string command_line;
};

std::string now_iso8601() {
  const std::time_t t = std::time(nullptr);
  std::tm local{};
  localtime_r(&t, &local);  // points may finish on several threads at once
  char buf[64];
  std::strftime(buf, sizeof buf, "%Y-%m-%dT%H:%M:%S%z", &local);
  return buf;
}

std::string default_folder(const std::string& scene) {
  const fs::path p(scene);
  return (p.parent_path() / (p.stem().string() + "_sweep")).string();
}

// A note (a table fit, a band outside a library range) is the same for most points: say it once.
io::NoteSink once_per_message() {
  auto seen = std::make_shared<std::set<std::string>>();
  auto lock = std::make_shared<std::mutex>();
  return [seen, lock](const std::string& m) {
    std::lock_guard<std::mutex> guard(*lock);
    if (seen->insert(m).second) io::notes_to_stderr(m);
  };
}

struct Point {
  std::size_t index = 0;
  solver::Scene scene;
  std::string file;  // full path
  bool finished = false;
};

// Runs one point and publishes its file: results and /sweep record go to a side name, which is
// renamed to point_NNNN.h5 only when both are complete, so a killed sweep never leaves a file that
// a re-run would take for finished.
// A signal stops the points in progress between two steps; they are not published (a re-run runs
// them again from their start) and no new point starts.
struct PointStopped {};

double run_point(const Point& p, const io::SweepPlan& plan, const SweepOptions& o, int threads, bool show_progress,
                 const StopSignals& signals) {
  // Points running at once share the memory: each gets its share of the limit.
  const int jobs = std::max(1, o.jobs);
  std::optional<double> limit = o.memory.empty() ? std::nullopt : parse_memory_size(o.memory);
  if (!limit && jobs > 1)
    if (const auto free = available_memory_bytes()) limit = 0.9 * *free;
  if (limit) *limit /= jobs;
  refuse_if_over_memory(static_cast<double>(solver::plan_run(p.scene).summary.memory_bytes), limit);
  omp_set_num_threads(threads);
  const std::string started = now_iso8601();
  const auto start = std::chrono::steady_clock::now();
  solver::RunResults results;
  {
    std::optional<ProgressLine> progress;
    if (show_progress) progress.emplace();
    // Any kind of run: a plain Simulation, a Bloch run or an angle scan (a plane_wave scene).
    results = solver::run_scene(
        p.scene, [&](const solver::Progress& pr) { if (progress) progress->update(pr); },
        [&] { return signals.received() != 0; });
    if (progress) progress->break_line();
  }
  if (results.summary.stop_reason == "interrupted") throw PointStopped{};
  const std::vector<io::Figure> figures = io::compute_figures(results, p.scene);
  const std::string side = p.file + ".incomplete";
  io::write_results(side, results, p.scene, {YEEGAP_VERSION, o.command_line, started, threads});
  io::write_point_record(side, plan, p.index, figures, o.overrides);
  std::error_code ec;
  fs::rename(side, p.file, ec);
  if (ec) throw std::runtime_error(fmt::format("{}: cannot rename the finished point into place: {}", p.file, ec.message()));
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

struct Failure {
  std::size_t point = 0;
  std::string message;
  bool user_error = false;  // SceneError or RunError: the scene, not the machine
  bool operator<(const Failure& o) const { return point < o.point; }
};

// Runs `pending` with `jobs` workers; returns the points that failed with their messages.
std::vector<Failure> run_points(const std::vector<Point*>& pending, const io::SweepPlan& plan,
                                                            const SweepOptions& o, bool tty, const StopSignals& signals) {
  const int all_threads = o.threads > 0 ? o.threads : omp_get_max_threads();
  const int jobs = std::max(1, std::min<int>(o.jobs, static_cast<int>(pending.size())));
  const int threads = std::max(1, all_threads / jobs);
  if (jobs > 1)
    std::fprintf(stderr, "yeegap: %zu point%s to run, %d at a time with %d thread%s each\n", pending.size(),
                 pending.size() == 1 ? "" : "s", jobs, threads, threads == 1 ? "" : "s");
  std::atomic<std::size_t> next{0};
  std::mutex lock;
  std::vector<Failure> failed;
  std::size_t done = 0;
  const auto worker = [&] {
    for (std::size_t i = next++; i < pending.size() && signals.received() == 0; i = next++) {
      const Point& p = *pending[i];
      try {
        const double seconds = run_point(p, plan, o, threads, tty && jobs == 1, signals);
        std::lock_guard<std::mutex> guard(lock);
        ++done;
        if (tty)
          std::fprintf(stderr, "  point %zu (%zu of %zu to run): %s: %.1f s -> %s\n", p.index, done, pending.size(),
                       plan.describe(p.index).c_str(), seconds, fs::path(p.file).filename().c_str());
      } catch (const PointStopped&) {
        std::lock_guard<std::mutex> guard(lock);
        std::fprintf(stderr, "  point %zu (%s) stopped by the signal; a re-run of the sweep runs it again\n", p.index,
                     plan.describe(p.index).c_str());
      } catch (const std::exception& e) {
        std::lock_guard<std::mutex> guard(lock);
        ++done;
        const bool user = dynamic_cast<const SceneError*>(&e) || dynamic_cast<const RunError*>(&e);
        failed.push_back({p.index, e.what(), user});
        std::fprintf(stderr, "  point %zu (%s) failed: %s\n", p.index, plan.describe(p.index).c_str(), e.what());
      }
    }
  };
  if (jobs == 1) {
    worker();
  } else {
    std::vector<std::thread> workers;
    for (int j = 0; j < jobs; ++j) workers.emplace_back(worker);
    for (auto& w : workers) w.join();
  }
  std::sort(failed.begin(), failed.end());
  return failed;
}

int run_sweep(const SweepOptions& o) {
  const std::string text = io::read_scene_file_text(o.scene);
  const io::SweepPlan plan = io::read_sweep_plan(text, o.scene);
  if (plan.empty())
    throw SceneError(plan.where, "the scene has no 'sweep' block; run it with 'yeegap run' (docs/scene.md, 'sweep')");
  const std::size_t n = plan.point_count();
  if (o.point && *o.point >= n)
    throw SceneError(plan.where, fmt::format("there is no point {}: the sweep has {} point{}, numbered 0 to {}", *o.point,
                                             n, n == 1 ? "" : "s", n - 1));
  const std::string folder = o.output.empty() ? default_folder(o.scene) : o.output;

  // Every point is read and planned before anything runs: a mistake or an unstable setting in
  // point 17 is found now, not after the first 16 have run.
  const io::NoteSink notes = once_per_message();
  std::vector<Point> points(n);
  for (std::size_t k = 0; k < n; ++k) {
    points[k].index = k;
    points[k].scene = io::read_scene_point(text, o.scene, plan, k, o.overrides, notes);
    solver::Simulation::plan(points[k].scene);
    points[k].file = (fs::path(folder) / io::point_file_name(k, n)).string();
  }
  if (o.batch == "slurm") return write_slurm_script(o.scene, folder, plan, o.overrides, o.threads, o.jobs);

  std::error_code ec;
  fs::create_directories(folder, ec);
  if (ec) throw std::runtime_error(fmt::format("{}: cannot create the sweep folder: {}", folder, ec.message()));
  io::check_writable((fs::path(folder) / "sweep.h5").string());

  // A point is finished when its file holds a record of the same scene text and --set options:
  // editing the scene (or the options) makes the points it changes run again.
  std::vector<std::optional<io::PointRecord>> records(n);
  std::size_t already = 0;
  for (Point& p : points) {
    records[p.index] = io::read_point_record(p.file);
    const auto& r = records[p.index];
    p.finished = r && r->point == p.index && r->scene_text == p.scene.text && r->overrides == o.overrides;
    if (!p.finished && r)
      std::fprintf(stderr, "yeegap: %s is from a different scene text or --set options; point %zu runs again\n",
                   p.file.c_str(), p.index);
    if (p.finished) ++already;
  }
  std::vector<Point*> pending;
  for (Point& p : points)
    if (!p.finished && !o.merge_only && (!o.point || p.index == *o.point)) pending.push_back(&p);

  const bool tty = isatty(fileno(stderr)) == 1;
  std::fprintf(stderr, "yeegap: sweep of %zu point%s in %s: %zu already finished, %zu to run\n", n, n == 1 ? "" : "s",
               folder.c_str(), already, pending.size());
  // SIGINT/SIGTERM: the points in progress stop, the finished ones stay published, the table is
  // merged from them, and the exit code is 3; the same command runs the rest.
  StopSignals signals;
  const auto failed = run_points(pending, plan, o, tty, signals);
  const int stopped_by = signals.received();
  if (stopped_by != 0)
    std::fprintf(stderr, "yeegap: sweep stopped by %s; finished points are kept, the same command runs the rest\n",
                 stopped_by == SIGINT ? "SIGINT" : "SIGTERM");
  const auto failure_code = [&] {
    if (stopped_by != 0) return exit_interrupted;
    if (failed.empty()) return exit_ok;
    const bool user = std::all_of(failed.begin(), failed.end(), [](const Failure& f) { return f.user_error; });
    return user ? exit_user_error : exit_failure;
  };
  if (o.point) return failure_code();  // one point of a batch: the merge comes later

  std::vector<io::PointRecord> rows;
  std::vector<std::string> files, missing;
  for (const Point& p : points) {
    auto r = io::read_point_record(p.file);
    if (r && r->scene_text == p.scene.text && r->overrides == o.overrides) {
      rows.push_back(std::move(*r));
      files.push_back(fs::path(p.file).filename().string());
    } else {
      missing.push_back(fmt::format("{}", p.index));
    }
  }
  const std::string table = (fs::path(folder) / "sweep.h5").string();
  const std::string csv = (fs::path(folder) / "sweep.csv").string();
  io::write_sweep_table(table, csv, plan, rows, files, o.scene, text);
  std::fprintf(stderr, "yeegap: sweep of %zu point%s: %zu run now, %zu already finished%s; table in %s and %s\n", n,
               n == 1 ? "" : "s", rows.size() - already, already,
               missing.empty() ? "" : fmt::format(", {} not finished ({})", missing.size(), fmt::join(missing, ", ")).c_str(),
               table.c_str(), csv.c_str());
  if (o.json) {
    JsonObject j;
    j.text("table", table)
        .text("csv", csv)
        .number("points", static_cast<double>(n))
        .number("run", static_cast<double>(rows.size() - already))
        .number("already_finished", static_cast<double>(already))
        .number("not_finished", static_cast<double>(missing.size()));
    std::printf("%s\n", j.str().c_str());
  }
  if (o.plot && !rows.empty()) make_plots(table);  // a failure is reported but leaves the exit code alone
  return failure_code();
}

}  // namespace

void add_sweep_command(CLI::App& app, int& exit_code, const std::string& command_line) {
  auto opts = std::make_shared<SweepOptions>();
  CLI::App* cmd = app.add_subcommand("sweep", "run every point of the scene's sweep block and merge them into one table");
  cmd->footer(
      "Each point is written to DIR/point_NNNN.h5 (DIR: the scene's name with _sweep, next to it, or -o); points\n"
      "whose file is already there from the same scene are skipped, so an interrupted sweep resumes. The merged\n"
      "table is DIR/sweep.h5 and DIR/sweep.csv: one row per point, parameters and figures as columns.\n"
      "Spreading the points over MPI ranks is not available yet; use --jobs or --batch slurm.\n\n"
      "Examples:\n"
      "  yeegap sweep examples/tunnelling_gap_sweep.yaml              every point, one after another\n"
      "  yeegap sweep scene.yaml --jobs 2 -o runs/gaps                two at a time, threads split\n"
      "  yeegap sweep scene.yaml --batch slurm                        write a Slurm array script instead\n"
      "  yeegap sweep scene.yaml --point 3                            run point 3 only (no merge)\n"
      "  yeegap sweep scene.yaml --merge-only                         merge the points finished so far\n"
      "  yeegap sweep scene.yaml --merge-only --plot                  ... and draw the heat maps");
  cmd->add_option("scene", opts->scene, "scene file (YAML) with a sweep block")->required();
  cmd->add_option("-o,--output", opts->output, "folder for the point files and the table (default: next to the scene)");
  cmd->add_option("--set", opts->overrides, "override a scene value in every point, e.g. --set domain.step=2nm (repeatable)");
  cmd->add_option("--threads", opts->threads, "worker threads in all (default: all cores)")->check(CLI::PositiveNumber);
  cmd->add_option("--jobs", opts->jobs, "points run at once, the threads split between them (default 1)")
      ->check(CLI::PositiveNumber);
  cmd->add_option("--batch", opts->batch, "write a batch script instead of running: slurm")
      ->check(CLI::IsMember({"slurm"}));
  CLI::Option* point = cmd->add_option("--point", opts->point, "run only this point (counted from 0) and do not merge");
  cmd->add_flag("--merge-only", opts->merge_only, "run nothing; merge the points already finished")->excludes(point);
  cmd->add_flag("--json", opts->json, "print a one-object summary on stdout at the end");
  add_memory_option(*cmd, opts->memory);
  cmd->add_flag("--plot", opts->plot,
                "also write heat maps (PNG, SVG) of each spectrum over the swept parameter and wavelength next to "
                "the table (needs python3-matplotlib)");
  opts->command_line = command_line;
  cmd->callback([opts, &exit_code] { exit_code = guarded([&] { return run_sweep(*opts); }); });
}

}  // namespace yeegap::cli
