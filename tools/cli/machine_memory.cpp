// Memory available and the check against it (see machine_memory.h). A tenth is kept back by default
// for the program, the libraries and the results being written (common practice, not measured).
#include "machine_memory.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <regex>
#include <sstream>

#include <fmt/format.h>

#include "base/errors.h"

namespace yeegap::cli {
namespace {

constexpr double usable_share = 0.9;

std::optional<double> read_number_file(const std::string& path) {
  std::ifstream in(path);
  std::string word;
  if (!(in >> word) || word == "max") return std::nullopt;
  char* end = nullptr;
  const double v = std::strtod(word.c_str(), &end);
  if (end == word.c_str() || !(v > 0)) return std::nullopt;
  return v;
}

std::optional<double> mem_available() {
  std::ifstream in("/proc/meminfo");
  std::string line;
  while (std::getline(in, line)) {
    std::istringstream words(line);
    std::string key;
    double kib = 0;
    if (words >> key >> kib && key == "MemAvailable:") return kib * 1024.0;
  }
  return std::nullopt;
}

// The control group's limit less its usage (cgroup v2, then v1); a v1 "no limit" reads as about 2^63.
std::optional<double> cgroup_free() {
  for (const auto& [limit_file, usage_file] :
       {std::pair{"/sys/fs/cgroup/memory.max", "/sys/fs/cgroup/memory.current"},
        std::pair{"/sys/fs/cgroup/memory/memory.limit_in_bytes", "/sys/fs/cgroup/memory/memory.usage_in_bytes"}}) {
    const auto limit = read_number_file(limit_file);
    if (!limit || *limit > 1e18) continue;
    return std::max(0.0, *limit - read_number_file(usage_file).value_or(0.0));
  }
  return std::nullopt;
}

}  // namespace

std::optional<double> available_memory_bytes() {
  const auto machine = mem_available(), group = cgroup_free();
  if (machine && group) return std::min(*machine, *group);
  return machine ? machine : group;
}

std::optional<double> parse_memory_size(const std::string& text) {
  static const std::regex pattern(R"(\s*([0-9]*\.?[0-9]+(?:[eE][-+]?[0-9]+)?)\s*(B|kB|KB|MB|GB|TB|KiB|MiB|GiB|TiB)\s*)");
  std::smatch m;
  if (!std::regex_match(text, m, pattern)) return std::nullopt;
  const double value = std::strtod(m[1].str().c_str(), nullptr);
  const std::string u = m[2];
  const double unit = u == "B"                 ? 1.0
                      : u == "kB" || u == "KB" ? 1e3
                      : u == "MB"              ? 1e6
                      : u == "GB"              ? 1e9
                      : u == "TB"              ? 1e12
                      : u == "KiB"             ? 1024.0
                      : u == "MiB"             ? 1024.0 * 1024
                      : u == "GiB"             ? 1024.0 * 1024 * 1024
                                               : 1024.0 * 1024 * 1024 * 1024;
  if (!(value > 0) || !std::isfinite(value * unit)) return std::nullopt;
  return value * unit;
}

std::string format_bytes(double bytes) {
  if (bytes >= 1e12) return fmt::format("{:.3g} TB", bytes / 1e12);
  if (bytes >= 1e9) return fmt::format("{:.3g} GB", bytes / 1e9);
  return fmt::format("{:.3g} MB", bytes / 1e6);
}

void refuse_if_over_memory(double needed, std::optional<double> limit) {
  if (limit) {
    if (needed <= *limit) return;
    throw RunError(fmt::format("the scene needs about {} (fields, absorbers, dispersive currents and recorders; "
                               "`yeegap check` shows the grid), more than --memory {} allows",
                               format_bytes(needed), format_bytes(*limit)));
  }
  const auto available = available_memory_bytes();
  if (!available || needed <= usable_share * *available) return;
  throw RunError(fmt::format("the scene needs about {} (fields, absorbers, dispersive currents and recorders; "
                             "`yeegap check` shows the grid), but this machine has {} free: a coarser step, a "
                             "smaller domain or fewer recorders would fit; --memory sets the limit yourself (on a "
                             "cluster, the memory the job asked for)",
                             format_bytes(needed), format_bytes(*available)));
}

void add_memory_option(CLI::App& cmd, std::string& value) {
  cmd.add_option("--memory", value,
                 "the most memory the run may use, e.g. 8GB or 500MB (default: nine tenths of what the machine, "
                 "or the job's control group, has free)")
      ->check([](const std::string& v) {
        return parse_memory_size(v) ? std::string() : "expected a size like 8GB, 512MB or 1.5GiB; got '" + v + "'";
      });
}

}  // namespace yeegap::cli
