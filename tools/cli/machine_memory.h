// The memory a run may use: what this machine (or the job's control group on a cluster) has free,
// or a limit given with --memory. A run whose estimate exceeds it is refused before anything is
// allocated, instead of allocating for a minute and then failing or being killed.
#pragma once

#include <optional>
#include <string>

#include <CLI/CLI.hpp>

namespace yeegap::cli {

/// Bytes available now: MemAvailable from /proc/meminfo, lowered to the control group's limit
/// less its usage where one is set (cgroup v2 memory.max, or v1 memory.limit_in_bytes); nothing
/// when neither can be read.
std::optional<double> available_memory_bytes();

/// "8GB", "512 MB", "1.5GiB", "2TB" -> bytes; nothing for any other text.
std::optional<double> parse_memory_size(const std::string& text);

/// "2.5 GB", "380 MB".
std::string format_bytes(double bytes);

/// Throws RunError when `needed` exceeds the limit: `limit` when given, else nine tenths of what is
/// available (nothing is refused when that cannot be read).
void refuse_if_over_memory(double needed, std::optional<double> limit);

/// The --memory option of a verb, checked as it is read.
void add_memory_option(CLI::App& cmd, std::string& value);

}  // namespace yeegap::cli
