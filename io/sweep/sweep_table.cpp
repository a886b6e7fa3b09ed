// The sweep's point records and merged table (see sweep_table.h; layout in docs/results_file.md). Figures
// are matched across points by name, so points whose scenes differ in their outputs still merge.
#include "io/sweep/sweep_table.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <limits>
#include <stdexcept>

#include <fmt/format.h>

#include "io/h5.h"

namespace yeegap::io {

namespace fs = std::filesystem;

std::string point_file_name(std::size_t point, std::size_t point_count) {
  const std::size_t digits = std::max<std::size_t>(4, fmt::format("{}", point_count > 0 ? point_count - 1 : 0).size());
  return fmt::format("point_{:0{}}.h5", point, digits);
}

void write_point_record(const std::string& path, const SweepPlan& plan, std::size_t point,
                        const std::vector<Figure>& figures, const std::vector<std::string>& overrides) {
  h5::File file = h5::File::open(path, /*writable=*/true);
  {
    const h5::Group g = file.create_group("sweep");
    g.write("point", std::vector<std::int64_t>{static_cast<std::int64_t>(point)}).set_attribute("units", "none");
    g.write("point_count", std::vector<std::int64_t>{static_cast<std::int64_t>(plan.point_count())})
        .set_attribute("units", "none");
    std::vector<std::string> names, values, figure_names, figure_units, figure_descriptions;
    std::vector<double> figure_values;
    const std::vector<std::size_t> idx = plan.value_indices(point);
    for (std::size_t p = 0; p < plan.parameters.size(); ++p) {
      names.push_back(plan.parameters[p].name);
      values.push_back(plan.parameters[p].values[idx[p]].text);
    }
    for (const Figure& f : figures) {
      figure_names.push_back(f.name);
      figure_units.push_back(f.unit);
      figure_descriptions.push_back(f.description);
      figure_values.push_back(f.value);
    }
    g.write_strings("parameter_names", names).set_attribute("units", "none");
    g.write_strings("parameter_values", values).set_attribute("units", "none");
    g.write_strings("figure_names", figure_names).set_attribute("units", "none");
    g.write_strings("figure_units", figure_units).set_attribute("units", "none");
    g.write_strings("figure_descriptions", figure_descriptions).set_attribute("units", "none");
    g.write("figure_values", figure_values).set_attribute("units", "see figure_units");
    g.write_strings("overrides", overrides).set_attribute("units", "none");
  }
  file.close();
}

std::optional<PointRecord> read_point_record(const std::string& path) {
  std::error_code ec;
  if (!fs::is_regular_file(path, ec)) return std::nullopt;
  try {
    const h5::File file = h5::File::open(path);
    if (!file.exists("sweep/figure_values")) return std::nullopt;
    const h5::Group sweep = file.open_group("sweep");
    const auto strings = [&](const char* name) { return sweep.open_dataset(name).read_strings(); };
    PointRecord r;
    const auto point = sweep.open_dataset("point").read_vector<std::int64_t>();
    if (point.size() != 1 || point[0] < 0) return std::nullopt;
    r.point = static_cast<std::size_t>(point[0]);
    r.parameter_names = strings("parameter_names");
    r.parameter_values = strings("parameter_values");
    r.overrides = strings("overrides");
    r.scene_text = file.open_dataset("scene/text").read_string();
    const auto names = strings("figure_names");
    const auto units = strings("figure_units");
    const auto descriptions = strings("figure_descriptions");
    const auto values = sweep.open_dataset("figure_values").read_vector<double>();
    if (units.size() != names.size() || descriptions.size() != names.size() || values.size() != names.size())
      return std::nullopt;
    for (std::size_t i = 0; i < names.size(); ++i) r.figures.push_back({names[i], units[i], descriptions[i], values[i]});
    return r;
  } catch (const std::exception&) {
    return std::nullopt;  // unreadable: the point runs again and replaces the file
  }
}

namespace {

struct Column {
  std::string name, unit, description;
  std::vector<double> values;
};

// Figures by name in order of first appearance; NaN where a point has none of that name.
std::vector<Column> figure_columns(const std::vector<PointRecord>& records) {
  std::vector<Column> columns;
  for (std::size_t row = 0; row < records.size(); ++row)
    for (const Figure& f : records[row].figures) {
      auto it = std::find_if(columns.begin(), columns.end(), [&](const Column& c) { return c.name == f.name; });
      if (it == columns.end()) {
        columns.push_back({f.name, f.unit, f.description,
                           std::vector<double>(records.size(), std::numeric_limits<double>::quiet_NaN())});
        it = columns.end() - 1;
      }
      it->values[row] = f.value;
    }
  return columns;
}

std::string csv_field(const std::string& text) {
  if (text.find_first_of(",\"\n") == std::string::npos) return text;
  std::string quoted = "\"";
  for (char c : text) quoted += c == '"' ? std::string("\"\"") : std::string(1, c);
  return quoted + "\"";
}

// "gap [nm]" for a column with a unit its name does not already end in; plain name otherwise.
std::string csv_header(const std::string& name, const std::string& unit) {
  const bool unitless = unit.empty() || unit == "1" || unit == "none";
  const bool named = name.size() > unit.size() + 1 && name.compare(name.size() - unit.size() - 1, std::string::npos,
                                                                   "_" + unit) == 0;
  return csv_field(unitless || named ? name : fmt::format("{} [{}]", name, unit));
}

void publish(const std::string& partial, const std::string& path) {
  std::error_code ec;
  fs::rename(partial, path, ec);
  if (ec) {
    fs::remove(partial, ec);
    throw std::runtime_error(fmt::format("{}: cannot rename the finished table into place: {}", path, ec.message()));
  }
}

void write_h5_table(const std::string& path, const SweepPlan& plan, const std::vector<PointRecord>& records,
                    const std::vector<std::string>& point_files, const std::vector<Column>& figures,
                    const std::string& scene_file, const std::string& scene_text) {
  const std::string partial = path + ".partial";
  try {
    h5::File file = h5::File::create(partial);
    file.set_attribute("format", sweep_table_format);
    file.set_attribute("format_version", std::int32_t{sweep_table_format_version});
    file.set_attribute("combine", plan.combine == Combine::zip ? "zip" : "grid");
    file.set_attribute("point_count", static_cast<std::int64_t>(plan.point_count()));
    file.set_attribute("rows", static_cast<std::int64_t>(records.size()));
    {
      const h5::Group scene = file.create_group("scene");
      scene.set_attribute("file", scene_file);
      scene.write_string("text", scene_text).set_attribute("units", "none");
      const h5::Group points = file.create_group("points");
      std::vector<std::int64_t> index;
      for (const PointRecord& r : records) index.push_back(static_cast<std::int64_t>(r.point));
      points.write("index", index).set_attribute("units", "none");
      points.write_strings("file", point_files).set_attribute("units", "none");
      const h5::Group parameters = file.create_group("parameters");
      for (std::size_t p = 0; p < plan.parameters.size(); ++p) {
        const SweepParameter& param = plan.parameters[p];
        std::vector<std::string> texts;
        for (const PointRecord& r : records) texts.push_back(p < r.parameter_values.size() ? r.parameter_values[p] : "");
        if (param.numeric()) {
          std::vector<double> numbers;
          for (const PointRecord& r : records) numbers.push_back(param.values[plan.value_indices(r.point)[p]].number.value());
          const h5::Dataset d = parameters.write(param.name, numbers);
          d.set_attribute("units", param.unit().empty() ? "1" : param.unit());
          d.set_attribute("kind", "number");
        } else {
          const h5::Dataset d = parameters.write_strings(param.name, texts);
          d.set_attribute("units", "none");
          d.set_attribute("kind", "text");
        }
      }
      const h5::Group figs = file.create_group("figures");
      for (const Column& c : figures) {
        const h5::Dataset d = figs.write(c.name, c.values);
        d.set_attribute("units", c.unit);
        d.set_attribute("description", c.description);
      }
    }
    file.close();
  } catch (...) {
    std::error_code ec;
    fs::remove(partial, ec);
    throw;
  }
  publish(partial, path);
}

void write_csv_table(const std::string& path, const SweepPlan& plan, const std::vector<PointRecord>& records,
                     const std::vector<Column>& figures) {
  const std::string partial = path + ".partial";
  {
    std::ofstream out(partial, std::ios::binary | std::ios::trunc);
    if (!out) throw std::runtime_error(fmt::format("{}: cannot write the table", partial));
    out << "point";
    for (const SweepParameter& p : plan.parameters) out << ',' << csv_header(p.name, p.numeric() ? p.unit() : "");
    for (const Column& c : figures) out << ',' << csv_header(c.name, c.unit);
    out << '\n';
    for (std::size_t row = 0; row < records.size(); ++row) {
      const PointRecord& r = records[row];
      out << r.point;
      const std::vector<std::size_t> idx = plan.value_indices(r.point);
      for (std::size_t p = 0; p < plan.parameters.size(); ++p) {
        const SweepValue& v = plan.parameters[p].values[idx[p]];
        out << ',' << (plan.parameters[p].numeric() ? fmt::format("{:.12g}", *v.number) : csv_field(v.text));
      }
      for (const Column& c : figures)
        out << ',' << (std::isnan(c.values[row]) ? std::string() : fmt::format("{:.10g}", c.values[row]));
      out << '\n';
    }
    out.flush();
    if (!out) {
      std::error_code ec;
      fs::remove(partial, ec);
      throw std::runtime_error(fmt::format("{}: writing the table failed", partial));
    }
  }
  publish(partial, path);
}

}  // namespace

bool is_sweep_table(const std::string& path) {
  try {
    const h5::File f = h5::File::open(path);
    return f.has_attribute("format") && f.string_attribute("format") == sweep_table_format;
  } catch (const std::exception&) {
    return false;
  }
}

void write_sweep_table(const std::string& h5_path, const std::string& csv_path, const SweepPlan& plan,
                       const std::vector<PointRecord>& records, const std::vector<std::string>& point_files,
                       const std::string& scene_file, const std::string& scene_text) {
  const std::vector<Column> figures = figure_columns(records);
  write_h5_table(h5_path, plan, records, point_files, figures, scene_file, scene_text);
  write_csv_table(csv_path, plan, records, figures);
}

}  // namespace yeegap::io
