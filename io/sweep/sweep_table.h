// A sweep's files: the record each point's results file carries under /sweep (which point, its
// parameter values, its figures, the --set options it ran with), reading that record back to
// decide whether a point is finished, and the merged table of all points as HDF5 and CSV. The
// layouts are in docs/results_file.md ("Sweeps").
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "io/sweep/sweep_expand.h"
#include "io/sweep/sweep_figures.h"

namespace yeegap::io {

inline constexpr const char* sweep_table_format = "yeegap-sweep";
inline constexpr int sweep_table_format_version = 1;

/// "point_0007.h5": the point's index, zero-padded to at least 4 digits (more for larger sweeps),
/// so the files sort in point order.
std::string point_file_name(std::size_t point, std::size_t point_count);

/// What a point's results file says about the point (/sweep and /scene/text).
struct PointRecord {
  std::size_t point = 0;
  std::vector<std::string> parameter_names, parameter_values;  // texts as substituted
  std::vector<Figure> figures;
  std::vector<std::string> overrides;  // the --set options of the run
  std::string scene_text;              // the substituted scene text the run read
};

/// Adds the /sweep group to the results file at `path` (written by write_results, not yet under
/// its final name). Throws std::runtime_error naming the file on failure.
void write_point_record(const std::string& path, const SweepPlan& plan, std::size_t point,
                        const std::vector<Figure>& figures, const std::vector<std::string>& overrides);

/// The record of a finished point, or nullopt when `path` is missing, unreadable or has no /sweep
/// group (a results file of a plain run, or one cut short): such a point counts as not finished.
std::optional<PointRecord> read_point_record(const std::string& path);

/// Whether `path` is a merged sweep table (root attribute format = yeegap-sweep); false for any other
/// file, readable or not.
bool is_sweep_table(const std::string& path);

/// Writes the merged table: one row per record (in the order given), the parameters as columns
/// (numbers with their unit, or texts) and every figure any point has (NaN where a point lacks
/// one). `h5_path` and `csv_path` appear atomically (written as .partial, then renamed).
/// `point_files` are the points' file names as the table should name them (relative to the table).
void write_sweep_table(const std::string& h5_path, const std::string& csv_path, const SweepPlan& plan,
                       const std::vector<PointRecord>& records, const std::vector<std::string>& point_files,
                       const std::string& scene_file, const std::string& scene_text);

}  // namespace yeegap::io
