// The scene reader's entry points and the two small blocks `scene` and `stop`. The YAML is parsed
// whole, overrides are applied to the tree, then each top-level block is read by its own file
// (scene_blocks.h); unknown keys are refused before anything is converted.
#include "io/scene/scene_reader.h"

#include <cerrno>
#include <cstring>
#include <fstream>
#include <sstream>

#include <fmt/format.h>
#include <yaml-cpp/eventhandler.h>
#include <yaml-cpp/parser.h>
#include <yaml-cpp/yaml.h>

#include "base/errors.h"
#include "io/scene/overrides.h"
#include "io/scene/read_values.h"
#include "io/scene/scene_blocks.h"
#include "io/yaml_node.h"

namespace yeegap::io {
namespace {

// The format version this reader understands; a file with another one was written for a program
// that reads its keys differently.
constexpr long scene_format_version = 1;

// Where each document of a YAML stream starts and whether it holds anything, without building it.
// yaml-cpp 0.7's LoadAll never returns on a stream whose document starts with a stray ',' (the
// token is never consumed: an endless run of empty documents, found by fuzzing), so the documents
// are walked here one at a time, and only a few.
class DocumentScan : public YAML::EventHandler {
 public:
  struct Document {
    YAML::Mark start, first;  // where the document and its first node begin
    bool content = false;
  };
  std::vector<Document> documents;
  void OnDocumentStart(const YAML::Mark& mark) override { documents.push_back({mark, mark, false}); }
  void OnDocumentEnd() override {}
  void OnNull(const YAML::Mark&, YAML::anchor_t) override {}
  void OnAlias(const YAML::Mark& m, YAML::anchor_t) override { note(m); }
  void OnScalar(const YAML::Mark& m, const std::string&, YAML::anchor_t, const std::string&) override { note(m); }
  void OnSequenceStart(const YAML::Mark& m, const std::string&, YAML::anchor_t, YAML::EmitterStyle::value) override {
    note(m);
  }
  void OnSequenceEnd() override {}
  void OnMapStart(const YAML::Mark& m, const std::string&, YAML::anchor_t, YAML::EmitterStyle::value) override {
    note(m);
  }
  void OnMapEnd() override {}

 private:
  void note(const YAML::Mark& m) {
    if (documents.empty() || documents.back().content) return;
    documents.back().content = true;
    documents.back().first = m;
  }
};

YAML::Node parse_yaml(const std::string& text, const SceneSource& source) {
  try {
    std::istringstream stream(text);
    YAML::Parser parser(stream);
    DocumentScan scan;
    // The first document, a second one if any, and one more: a stream that goes on producing
    // documents past a few is stuck on a token it cannot place.
    constexpr std::size_t looked_at = 4;
    while (scan.documents.size() < looked_at && parser.HandleNextDocument(scan)) {
    }
    const auto where = [&](const YAML::Mark& m) {
      int column = m.column;
      source.to_file_column(m.line, column);
      return Where{source.file, m.line + 1, column + 1, ""};
    };
    if (scan.documents.size() >= looked_at)
      throw SceneError(where(scan.documents[1].start),
                       "the YAML parser cannot go on from here (a stray ',' or bracket outside a list or block?)");
    // A second document (after a '---' line) would be ignored, and with it whatever the user wrote
    // there: refuse it. An empty one (a trailing '---') holds nothing to lose.
    for (std::size_t d = 1; d < scan.documents.size(); ++d)
      if (scan.documents[d].content)
        throw SceneError(where(scan.documents[d].first),
                         "a second YAML document starts here (after a '---' line); a scene file holds one document, "
                         "and this one would be ignored: merge it into the first or move it to its own file");
    return scan.documents.empty() ? YAML::Node() : YAML::Load(text);
  } catch (const YAML::ParserException& e) {
    // e.msg is yaml-cpp's text without its own "error at line..." prefix; marks are 0-based.
    int column = e.mark.column;
    source.to_file_column(e.mark.line, column);
    std::string note = source.substitution_note(e.mark.line, e.mark.column);
    // The parser often notices a bad value only at a later token: name the values on that line.
    for (const SceneSource::Substitution& s : source.substitutions)
      if (note.empty() && s.line == e.mark.line)
        note = fmt::format(" (this line has ${{{}}} = '{}', {})", s.name, s.value, source.point_label);
    throw SceneError(Where{source.file, e.mark.line + 1, column + 1, ""}, fmt::format("YAML syntax error: {}{}", e.msg, note));
  } catch (const YAML::Exception& e) {
    throw SceneError(Where{source.file, 0, 0, ""}, fmt::format("cannot read the YAML: {}", e.what()));
  }
}

// A --set cannot change the sweep itself: the points are laid out from the file's block before
// any override is applied, so such an override would silently do nothing.
void refuse_sweep_overrides(const std::vector<std::string>& overrides, const std::string& label) {
  for (const std::string& o : overrides) {
    const std::string path = o.substr(0, o.find('='));
    const auto first = path.find_first_not_of(" \t");
    if (first != std::string::npos && path.compare(first, 5, "sweep") == 0 &&
        (path.size() == first + 5 || std::string(".[ \t").find(path[first + 5]) != std::string::npos))
      throw SceneError(Where{label, 0, 0, "sweep"},
                       fmt::format("--set {}: the sweep block cannot be changed with --set; edit it in the file", o));
  }
}

solver::Scene read_parsed_scene(const std::string& text, std::shared_ptr<SceneSource> source,
                                const std::vector<std::string>& overrides, const NoteSink& notes) {
  const std::string& file_label = source->file;
  YAML::Node doc = parse_yaml(text, *source);
  if (!doc.IsDefined() || doc.IsNull())
    throw SceneError(Where{file_label, 0, 0, ""}, "the scene is empty; it needs at least the blocks scene, domain, "
                                                  "excitation and stop (see docs/scene.md)");
  if (!doc.IsMap())
    throw SceneError(Where{file_label, doc.Mark().line + 1, doc.Mark().column + 1, ""},
                     "a scene is a block of keys (scene, domain, materials, bodies, excitation, outputs, stop)");
  refuse_sweep_overrides(overrides, file_label);
  apply_overrides(doc, overrides, *source);

  const Node root = Node::root(doc, source);
  root.allow({"scene", "domain", "materials", "bodies", "tunnelling", "excitation", "outputs", "stop", "sweep"});

  solver::Scene scene;
  scene.file = file_label;
  scene.text = text;
  read_scene_block(root.require("scene"), scene);
  if (auto materials = root.get("materials")) read_materials(*materials, scene, notes);
  read_domain(root.require("domain"), scene);
  if (auto bodies = root.get("bodies")) read_bodies(*bodies, scene);
  if (auto tunnelling = root.get("tunnelling")) read_tunnelling(*tunnelling, scene);
  read_excitation(root.require("excitation"), scene);
  warn_outside_library_ranges(scene, notes);
  if (auto outputs = root.get("outputs")) read_outputs(*outputs, scene);
  read_stop(root.require("stop"), scene);
  root.get("sweep");  // read by read_sweep_plan, which laid out this point
  root.done();
  return scene;
}

}  // namespace

void read_scene_block(const Node& block, solver::Scene& scene) {
  block.allow({"version", "title"});
  const Node version = block.require("version");
  const long v = read_whole_number(version, 1);
  if (v != scene_format_version)
    version.fail(fmt::format("this program reads scene format version {}, got '{}'", scene_format_version,
                             version.text()));
  scene.version = static_cast<int>(v);
  if (auto title = block.get("title")) {
    scene.title = read_text(*title);
    // The title goes into the results file as an HDF5 attribute, which holds at most 64 KiB; a
    // longer one would be found only after the run, when the results cannot be written.
    constexpr std::size_t max_title = 4096;
    if (scene.title.size() > max_title)
      title->fail(fmt::format("is {} characters long; a title holds at most {} (put longer notes in comments)",
                              scene.title.size(), max_title));
  }
  block.done();
}

void read_stop(const Node& block, solver::Scene& scene) {
  if (block.is_map() && block.has("decayed"))
    block.fail_key("decayed", "stop.decayed is now stop.energy_below (stop once the field energy is below this "
                              "fraction of its peak)");
  block.allow({"after", "energy_below", "max_steps"});
  if (!block.has("after") && !block.has("energy_below"))
    block.fail("needs 'after' (a time, e.g. 'after: 200 fs') or 'energy_below' (a fraction, e.g. 'energy_below: 1e-5'), or both");
  if (auto after = block.get("after")) scene.stop.after = read_positive_time(*after);
  if (auto below = block.get("energy_below")) {
    const double f = read_number(*below);
    if (!(f > 0 && f < 1)) below->fail(fmt::format("must be a fraction between 0 and 1, got '{}'", below->text()));
    scene.stop.energy_below = f;
  }
  if (auto max_steps = block.get("max_steps")) scene.stop.max_steps = read_whole_number(*max_steps, 1);
  block.done();
}

solver::Scene read_scene_text(const std::string& text, const std::string& file_label,
                              const std::vector<std::string>& overrides, const NoteSink& notes) {
  const SweepPlan plan = read_sweep_plan(text, file_label);
  if (!plan.empty()) {
    const std::size_t n = plan.point_count();
    throw SceneError(plan.where, fmt::format("this scene is a sweep of {} point{}: run them all with 'yeegap sweep {}', "
                                             "or one with 'yeegap run {} --point K' (K from 0 to {})",
                                             n, n == 1 ? "" : "s", file_label, file_label, n - 1));
  }
  const PointText point = substitute_point(text, file_label, plan, 0);  // refuses any ${...}
  auto source = std::make_shared<SceneSource>();
  source->file = file_label;
  return read_parsed_scene(point.text, source, overrides, notes);
}

solver::Scene read_scene_point(const std::string& text, const std::string& file_label, const SweepPlan& plan,
                               std::size_t point, const std::vector<std::string>& overrides, const NoteSink& notes) {
  if (plan.empty())
    throw SceneError(Where{file_label, 0, 0, ""}, "the scene has no 'sweep' block, so it has no points to choose from; "
                                                  "run it without --point");
  const std::size_t n = plan.point_count();
  if (point >= n)
    throw SceneError(plan.where, fmt::format("there is no point {}: the sweep has {} point{}, numbered 0 to {}", point, n,
                                             n == 1 ? "" : "s", n - 1));
  PointText expanded = substitute_point(text, file_label, plan, point);
  auto source = std::make_shared<SceneSource>();
  source->file = file_label;
  source->substitutions = std::move(expanded.substitutions);
  source->point_label = fmt::format("sweep point {}", point);
  return read_parsed_scene(expanded.text, source, overrides, notes);
}

std::string read_scene_file_text(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw SceneError(Where{path, 0, 0, ""}, fmt::format("cannot open the scene file: {}", std::strerror(errno)));
  std::ostringstream text;
  text << in.rdbuf();
  if (in.bad()) throw SceneError(Where{path, 0, 0, ""}, "cannot read the scene file");
  return text.str();
}

solver::Scene read_scene_file(const std::string& path, const std::vector<std::string>& overrides,
                              const NoteSink& notes) {
  return read_scene_text(read_scene_file_text(path), path, overrides, notes);
}

}  // namespace yeegap::io
