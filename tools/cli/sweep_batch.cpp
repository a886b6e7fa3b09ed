// The Slurm array script of sweep_batch.h. Paths are made absolute (a job starts in the submit
// folder, not necessarily here); values are single-quoted for the shell, and no path goes into an
// #SBATCH line (Slurm reads those without the shell's quoting): each task sends its own output to
// the sweep folder. Comments show control characters escaped, so a newline in a file name cannot end
// a comment and run as a command. The job's shape (array tasks, one node each, OMP_NUM_THREADS
// from the CPUs per task) is the one checked on Slurm 22.05.
#include "sweep_batch.h"

#include <omp.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <stdexcept>

#include <fmt/format.h>

#include "commands.h"

namespace yeegap::cli {

namespace {

namespace fs = std::filesystem;

// Single quotes only where the shell needs them, so the printed commands stay readable.
std::string shell_quote(const std::string& s) {
  const bool plain = !s.empty() && s.find_first_not_of("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789"
                                                       "_/.,:=+@%-") == std::string::npos;
  if (plain) return s;
  std::string out = "'";
  for (char c : s) out += c == '\'' ? std::string("'\\''") : std::string(1, c);
  return out + "'";
}

// Text for a comment line: control characters (a newline above all) shown as \xNN.
std::string commented(const std::string& s) {
  std::string out;
  for (unsigned char c : s) out += c < 0x20 || c == 0x7f ? fmt::format("\\x{:02x}", c) : std::string(1, static_cast<char>(c));
  return out;
}

std::string this_program() {
  std::error_code ec;
  const fs::path self = fs::read_symlink("/proc/self/exe", ec);
  return ec ? std::string("yeegap") : self.string();
}

}  // namespace

int write_slurm_script(const std::string& scene, const std::string& folder, const io::SweepPlan& plan,
                       const std::vector<std::string>& overrides, int threads, int jobs) {
  const std::size_t n = plan.point_count();
  const int cpus = threads > 0 ? threads : omp_get_max_threads();
  const std::string program = this_program();
  const std::string scene_abs = fs::absolute(scene).lexically_normal().string();
  const std::string folder_abs = fs::absolute(folder).lexically_normal().string();
  std::error_code ec;
  fs::create_directories(folder_abs, ec);
  if (ec) throw std::runtime_error(fmt::format("{}: cannot create the sweep folder: {}", folder_abs, ec.message()));
  std::string sets;
  for (const std::string& o : overrides) sets += " --set " + shell_quote(o);
  const std::string merge = fmt::format("{} sweep {} -o {} --merge-only{}", shell_quote(program), shell_quote(scene_abs),
                                        shell_quote(folder_abs), sets);
  const std::string script_path = (fs::path(folder_abs) / "sweep.sbatch").string();

  std::string s;
  s += "#!/bin/bash\n";
  s += fmt::format("# Written by `yeegap sweep --batch slurm`: one array task per point of the sweep in\n#   {}\n",
                   commented(scene_abs));
  s += fmt::format("# ({} point{}; each task runs one point on one node with {} CPU{}). Submit, then merge\n", n,
                   n == 1 ? "" : "s", cpus, cpus == 1 ? "" : "s");
  s += "# once every task has finished:\n";
  s += fmt::format("#   jid=$(sbatch --parsable {})\n", commented(shell_quote(script_path)));
  s += fmt::format("#   sbatch --dependency=afterok:$jid --wrap {}\n", commented(shell_quote(merge)));
  s += "# A task whose point is already finished (same scene text) returns at once, so submitting the\n";
  s += "# script again runs only the points that failed. Points are not spread over MPI ranks.\n";
  s += "#SBATCH --job-name=yeegap-sweep\n";
  s += fmt::format("#SBATCH --array=0-{}{}\n", n - 1, jobs > 1 ? fmt::format("%{}", jobs) : "");
  s += "#SBATCH --nodes=1\n#SBATCH --ntasks=1\n";
  s += fmt::format("#SBATCH --cpus-per-task={}\n", cpus);
  s += "#SBATCH --output=/dev/null\n";
  s += fmt::format("exec >>{}/slurm_\"${{SLURM_ARRAY_JOB_ID}}_${{SLURM_ARRAY_TASK_ID}}\".txt 2>&1\n", shell_quote(folder_abs));
  s += "export OMP_NUM_THREADS=\"${SLURM_CPUS_PER_TASK:-1}\"\n";
  s += fmt::format("exec {} sweep {} -o {} --point \"$SLURM_ARRAY_TASK_ID\" --threads \"$OMP_NUM_THREADS\"{}\n",
                   shell_quote(program), shell_quote(scene_abs), shell_quote(folder_abs), sets);

  const std::string partial = script_path + ".partial";
  {
    std::ofstream out(partial, std::ios::binary | std::ios::trunc);
    out << s;
    out.flush();
    if (!out) throw std::runtime_error(fmt::format("{}: cannot write the batch script", partial));
  }
  fs::rename(partial, script_path, ec);
  if (ec) throw std::runtime_error(fmt::format("{}: cannot rename into place: {}", script_path, ec.message()));
  fs::permissions(script_path, fs::perms::owner_exec | fs::perms::group_exec, fs::perm_options::add, ec);
  std::fprintf(stderr,
               "yeegap: wrote %s (%zu array task%s). Submit it, then merge after the last task:\n"
               "  jid=$(sbatch --parsable %s)\n  sbatch --dependency=afterok:$jid --wrap %s\n",
               script_path.c_str(), n, n == 1 ? "" : "s", shell_quote(script_path).c_str(), shell_quote(merge).c_str());
  return exit_ok;
}

}  // namespace yeegap::cli
