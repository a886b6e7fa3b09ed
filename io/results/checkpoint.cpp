// Checkpoint file layout of docs/results_file.md ("Checkpoints"): identity first (format, program version,
// scene text, overrides, grid, time step), then the counters and every state array under /state,
// each a chunked dataset with a Fletcher32 checksum so damaged bytes fail to read rather than
// resume a run with wrong numbers. Arrays are stored in their own type (float fields stay float), so
// reading them back is a copy of the same bits.
#include "io/results/checkpoint.h"

#include <fmt/format.h>

#include <algorithm>
#include <cstdint>
#include <filesystem>
#include <map>
#include <span>
#include <stdexcept>

#include "base/errors.h"
#include "io/atomic_file.h"
#include "io/file_hash.h"
#include "io/h5.h"

namespace yeegap::io {

namespace fs = std::filesystem;
using solver::StateArray;

namespace {

const h5::Storage checked{.chunk = {}, .deflate_level = 0, .shuffle = false, .checksum = true};

std::string joined(const std::vector<std::string>& lines) {
  std::string s;
  for (const auto& l : lines) s += l + "\n";
  return s;
}

/// Line `n` (1-based) of `text`, without its newline.
std::string line_of(const std::string& text, std::size_t n) {
  std::size_t start = 0;
  for (std::size_t i = 1; i < n && start != std::string::npos; ++i) {
    start = text.find('\n', start);
    if (start != std::string::npos) ++start;
  }
  if (start == std::string::npos || start > text.size()) return "";
  return text.substr(start, text.find('\n', start) - start);
}

/// "line 12: 'radius: 40 nm' in the checkpoint, 'radius: 45 nm' here", for two texts that differ.
std::string first_difference(const std::string& stored, const std::string& here) {
  const auto at = std::mismatch(stored.begin(), stored.end(), here.begin(), here.end());
  const std::size_t line = 1 + std::count(stored.begin(), at.first, '\n');
  return fmt::format("line {}: '{}' in the checkpoint, '{}' here", line, line_of(stored, line), line_of(here, line));
}

/// The group holding `name`'s leaf ("cpml/slab0/psi2" -> group "cpml/slab0" under /state),
/// creating groups on the way and keeping them open in `open` until the file is closed.
const h5::Group& group_for(const std::string& name, const h5::Group& state, std::map<std::string, h5::Group>& open) {
  const std::size_t slash = name.rfind('/');
  if (slash == std::string::npos) return state;
  const std::string dir = name.substr(0, slash);
  if (auto it = open.find(dir); it != open.end()) return it->second;
  const h5::Group& parent = group_for(dir, state, open);
  h5::Group g = parent.create_group(dir.substr(dir.rfind('/') == std::string::npos ? 0 : dir.rfind('/') + 1));
  return open.emplace(dir, std::move(g)).first->second;
}

std::string leaf(const std::string& name) { return name.substr(name.rfind('/') == std::string::npos ? 0 : name.rfind('/') + 1); }

void write_array(const h5::Group& g, const StateArray& a) {
  const std::string n = leaf(a.name);
  switch (a.type) {
    case StateArray::Type::f32:
      g.write(n, std::span<const float>(static_cast<const float*>(a.data), a.count), {a.count}, checked);
      break;
    case StateArray::Type::f64:
      g.write(n, std::span<const double>(static_cast<const double*>(a.data), a.count), {a.count}, checked);
      break;
    case StateArray::Type::c128:  // (count, 2): real and imaginary parts, as std::complex lays them out
      g.write(n, std::span<const double>(static_cast<const double*>(a.data), 2 * a.count), {a.count, 2}, checked);
      break;
  }
}

void write_layout(const h5::File& f, solver::Checkpointable& sim, const solver::Scene& scene, const CheckpointInfo& info) {
  f.set_attribute("format", checkpoint_format);
  f.set_attribute("format_version", std::int32_t{checkpoint_format_version});
  f.set_attribute("program_version", info.program_version);
  {
    const h5::Group g = f.create_group("scene");
    g.set_attribute("file", scene.file);
    g.write_string("text", scene.text);
    g.write_string("overrides", joined(info.overrides));
  }
  {  // the files the scene reads besides itself, with their hashes
    const h5::Group g = f.create_group("inputs");
    g.set_attribute("count", static_cast<std::int64_t>(scene.input_files.size()));
    if (!scene.input_files.empty()) {
      std::vector<std::string> paths, keys, hashes;
      for (const solver::InputFile& in : scene.input_files) {
        paths.push_back(in.path);
        keys.push_back(in.key_path);
        hashes.push_back(hash_text(in.content_hash));
      }
      g.write_strings("paths", paths);
      g.write_strings("key_paths", keys);
      g.write_strings("content_hashes", hashes);
    }
  }
  {
    const h5::Group g = f.create_group("grid");
    g.write("x", sim.grid().nodes[0]);
    g.write("y", sim.grid().nodes[1]);
    g.write("z", sim.grid().nodes[2]);
    g.set_attribute("time_step", sim.dt());
  }
  {
    const solver::StateCounters c = sim.state_counters();
    const h5::Group g = f.create_group("counters");
    g.write("step", std::vector<std::int64_t>{c.step}, checked);
    g.write("energy", std::vector<double>{c.peak_energy, c.last_energy}, checked);
    g.write("wall_seconds", std::vector<double>{c.wall_seconds}, checked);
  }
  const solver::StateArrays arrays = sim.state_arrays();
  const h5::Group state = f.create_group("state");
  state.set_attribute("arrays", static_cast<std::int64_t>(arrays.list().size()));
  std::map<std::string, h5::Group> open;
  for (const StateArray& a : arrays.list()) write_array(group_for(a.name, state, open), a);
}

// ---- reading ----

struct Refusal {
  std::string path;
  [[noreturn]] void operator()(const std::string& why) const {
    throw RunError(fmt::format("checkpoint '{}' cannot be resumed: {}", path, why));
  }
};

/// The files the scene reads (tables, meshes) must hold the bytes they held when the run started:
/// the same scene text with an edited table would otherwise resume a different model. Compared in
/// reading order, so a scene given by another path (another working directory) still matches.
void check_inputs(const h5::File& f, const solver::Scene& scene, const Refusal& refuse) {
  const auto& here = scene.input_files;
  if (!f.contains("inputs"))
    refuse("it records no hashes of the files the scene reads (written by an older version)");
  const auto count = f.open_group("inputs").int_attribute("count");
  if (count != static_cast<std::int64_t>(here.size()))
    refuse(fmt::format("the scene read {} other files (tables, meshes) when the run started, {} now", count,
                       here.size()));
  if (count == 0) return;
  const std::vector<std::string> hashes = f.open_dataset("inputs/content_hashes").read_strings();
  const std::vector<std::string> paths = f.open_dataset("inputs/paths").read_strings();
  if (hashes.size() != here.size() || paths.size() != here.size())
    refuse("its list of the files the scene reads is damaged");
  for (std::size_t i = 0; i < here.size(); ++i)
    if (hashes[i] != hash_text(here[i].content_hash))
      refuse(fmt::format("the file '{}' ({}) has changed since the run started ({} then, {} now): resume with the "
                         "file as it was, or start the run again without --resume",
                         here[i].path, here[i].key_path, hashes[i], hash_text(here[i].content_hash)));
}

void check_identity(const h5::File& f, const solver::Checkpointable& sim, const solver::Scene& scene,
                    const CheckpointInfo& info, const Refusal& refuse) {
  if (!f.has_attribute("format") || f.string_attribute("format") != checkpoint_format)
    refuse("it is not a yeegap checkpoint (no format attribute 'yeegap-checkpoint')");
  const auto version = f.int_attribute("format_version");
  if (version != checkpoint_format_version)
    refuse(fmt::format("its format version is {}, this program reads version {}", version, checkpoint_format_version));
  const std::string program = f.string_attribute("program_version");
  if (program != info.program_version)
    refuse(fmt::format("it was written by yeegap {}, this is yeegap {}; finish the run with that version or start "
                       "it again", program, info.program_version));
  const h5::Group s = f.open_group("scene");
  const std::string text = s.open_dataset("text").read_string();
  if (text != scene.text)
    refuse(fmt::format("the scene text differs from the one the run started with ({}): resume with the same scene",
                       first_difference(text, scene.text)));
  const std::string overrides = s.open_dataset("overrides").read_string();
  if (overrides != joined(info.overrides))
    refuse(fmt::format("the --set overrides differ ({}): resume with the same ones",
                       first_difference(overrides, joined(info.overrides))));
  check_inputs(f, scene, refuse);
  const h5::Group g = f.open_group("grid");
  for (int a = 0; a < 3; ++a) {
    const std::vector<double>& here = sim.grid().nodes[a];
    const h5::Dataset d = g.open_dataset(std::string(1, "xyz"[a]));
    if (d.size() != here.size())
      refuse(fmt::format("the grid differs: {} nodes along {} in the checkpoint, {} here", d.size(), "xyz"[a],
                         here.size()));
    std::vector<double> stored(d.size());
    d.read(std::span<double>(stored));
    for (std::size_t i = 0; i < here.size(); ++i)
      if (stored[i] != here[i])
        refuse(fmt::format("the grid differs: node {} along {} is at {:.17g} m in the checkpoint, {:.17g} m here", i,
                           "xyz"[a], stored[i], here[i]));
  }
  const double dt = g.double_attribute("time_step");
  if (dt != sim.dt()) refuse(fmt::format("the time step differs: {:.17g} s in the checkpoint, {:.17g} s here", dt, sim.dt()));
}

solver::StateCounters read_counters(const h5::File& f, const Refusal& refuse) {
  const h5::Group g = f.open_group("counters");
  const auto read = [&](const char* name, auto& out, std::size_t n) {
    const h5::Dataset d = g.open_dataset(name);
    if (d.size() != n) refuse(fmt::format("/counters/{} holds {} values, not {}", name, d.size(), n));
    d.read(std::span(out.data(), n));
  };
  std::vector<std::int64_t> step(1);
  std::vector<double> energy(2), wall(1);
  read("step", step, 1);
  read("energy", energy, 2);
  read("wall_seconds", wall, 1);
  if (step[0] < 0) refuse(fmt::format("its step counter is negative ({})", step[0]));
  return {.step = static_cast<long>(step[0]), .peak_energy = energy[0], .last_energy = energy[1], .wall_seconds = wall[0]};
}

void read_array(const h5::Group& state, const StateArray& a, const Refusal& refuse) {
  if (!state.exists(a.name)) refuse(fmt::format("it has no state array '{}', which this run needs", a.name));
  const h5::Dataset d = state.open_dataset(a.name);
  const bool complex = a.type == StateArray::Type::c128;
  const bool type_ok = a.type == StateArray::Type::f32 ? d.stores<float>() : d.stores<double>();
  const h5::Shape want = complex ? h5::Shape{a.count, 2} : h5::Shape{a.count};
  if (!type_ok || d.shape() != want) {
    const std::size_t stored = d.shape().empty() ? 1 : d.shape()[0];
    const char* stored_type = d.stores<float>() ? "float32" : d.stores<double>() ? (d.shape().size() == 2 ? "complex128" : "float64") : "other";
    refuse(fmt::format("state array '{}' holds {} {} values in the checkpoint, this run needs {} {} values", a.name,
                       stored, stored_type, a.count, solver::type_name(a.type)));
  }
  if (a.type == StateArray::Type::f32) d.read(std::span<float>(static_cast<float*>(a.data), a.count));
  else d.read(std::span<double>(static_cast<double*>(a.data), complex ? 2 * a.count : a.count));
}

}  // namespace

std::string checkpoint_path(const std::string& results_path) {
  return fs::path(results_path).replace_extension(".checkpoint.h5").string();
}

void write_checkpoint(const std::string& path, solver::Checkpointable& sim, const solver::Scene& scene,
                      const CheckpointInfo& info) {
  const std::string partial = partial_path(path);
  bool partial_is_ours = false;  // never remove something of that name that we did not create
  try {
    {
      h5::File file = h5::File::create(partial);
      partial_is_ours = true;
      write_layout(file, sim, scene, info);
      file.close();
    }
    commit_file(partial, path);
    partial_is_ours = false;
  } catch (const std::exception& e) {
    if (partial_is_ours) {
      std::error_code ec;
      fs::remove(partial, ec);
    }
    throw std::runtime_error(fmt::format("cannot write checkpoint '{}': {}", path, e.what()));
  }
}

void read_checkpoint(const std::string& path, solver::Checkpointable& sim, const solver::Scene& scene,
                     const CheckpointInfo& info) {
  const Refusal refuse{path};
  std::error_code ec;
  if (!fs::is_regular_file(path, ec))
    refuse("there is no such file (a run writes it next to its results file, periodically and when stopped by a "
           "signal)");
  try {
    const h5::File f = h5::File::open(path);
    check_identity(f, sim, scene, info, refuse);
    sim.restore_counters(read_counters(f, refuse));
    const solver::StateArrays arrays = sim.state_arrays();
    const h5::Group state = f.open_group("state");
    const auto stored = state.int_attribute("arrays");
    for (const StateArray& a : arrays.list()) read_array(state, a, refuse);
    if (stored != static_cast<std::int64_t>(arrays.list().size()))
      refuse(fmt::format("it holds {} state arrays, this run has {}", stored, arrays.list().size()));
  } catch (const RunError&) {
    throw;
  } catch (const std::exception& e) {
    // Truncated files, damaged metadata and chunks failing their checksum end up here.
    refuse(fmt::format("it is damaged or unreadable ({})", e.what()));
  }
}

}  // namespace yeegap::io
