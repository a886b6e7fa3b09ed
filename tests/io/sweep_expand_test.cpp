// The `sweep` block: grid and zip expansion, value lists, ranges with units, words, ${name}
// substitution into the scene, and errors that point at the file's own line and column (of the
// ${name} use, of the sweep key, or of a value moved along its line by an earlier substitution).
#include <algorithm>
#include <string>

#include <gtest/gtest.h>

#include "base/errors.h"
#include "io/scene/scene_reader.h"
#include "io/sweep/sweep_expand.h"
#include "scene_refusal.h"

namespace yeegap::io {
namespace {

constexpr double nm = 1e-9;

// A small valid scene whose domain width, tunnelling model and stop time come from the sweep.
const std::string dimer = R"(scene: {version: 1, title: "gap ${gap}, ${model}"}
domain: {size: [${width}, 20 nm, 20 nm], step: 0.5 nm, edges: metal}
materials:
  gold: {library: Au}
bodies:
  - {shape: sphere, name: left, material: gold, center: [-5.2 nm, 0, 0], radius: 5 nm}
  - {shape: sphere, name: right, material: gold, center: [5.2 nm, 0, 0], radius: 5 nm}
tunnelling:
  pairs: [[left, right]]
  model: ${model}
  metal: Au
excitation:
  - dipole: {position: [0, 0, 8 nm], direction: z, band: {from: 500 nm, to: 900 nm}}
stop: {after: 1 fs}
sweep:
  gap: [0.3 nm, 0.5 nm, 1 nm]
  width: {from: 20 nm, to: 24 nm, count: 3}
  model: [classical, quantum_corrected]
  COMBINE
)";

std::string with(std::string text, const std::string& key, const std::string& value) {
  const auto at = text.find(key);
  EXPECT_NE(at, std::string::npos) << key;
  return text.replace(at, key.size(), value);
}

// 1-based line and column of the first `fragment` in `text`.
std::pair<int, int> position_of(const std::string& text, const std::string& fragment) {
  const std::size_t at = text.find(fragment);
  EXPECT_NE(at, std::string::npos) << fragment;
  const std::size_t line_start = text.rfind('\n', at) == std::string::npos ? 0 : text.rfind('\n', at) + 1;
  return {1 + static_cast<int>(std::count(text.begin(), text.begin() + static_cast<long>(at), '\n')),
          1 + static_cast<int>(at - line_start)};
}

SceneError error_of(const std::function<void()>& f) { return testing::refusal_of(f, "(a sweep)"); }

std::vector<std::string> texts(const SweepParameter& p) {
  std::vector<std::string> out;
  for (const auto& v : p.values) out.push_back(v.text);
  return out;
}

TEST(SweepPlan, GridTakesEveryCombinationWithTheLastParameterFastest) {
  const SweepPlan plan = read_sweep_plan(with(dimer, "COMBINE", ""), "d.yaml");
  ASSERT_EQ(plan.parameters.size(), 3u);
  EXPECT_EQ(plan.combine, Combine::grid);
  EXPECT_EQ(plan.point_count(), 3u * 3u * 2u);
  EXPECT_EQ(plan.value_indices(0), (std::vector<std::size_t>{0, 0, 0}));
  EXPECT_EQ(plan.value_indices(1), (std::vector<std::size_t>{0, 0, 1}));
  EXPECT_EQ(plan.value_indices(2), (std::vector<std::size_t>{0, 1, 0}));
  EXPECT_EQ(plan.value_indices(17), (std::vector<std::size_t>{2, 2, 1}));
  EXPECT_EQ(plan.describe(1), "gap = 0.3 nm, width = 20 nm, model = quantum_corrected");
  // Every combination exactly once.
  std::vector<std::vector<std::size_t>> seen;
  for (std::size_t k = 0; k < plan.point_count(); ++k) seen.push_back(plan.value_indices(k));
  std::sort(seen.begin(), seen.end());
  EXPECT_EQ(std::unique(seen.begin(), seen.end()), seen.end());
}

TEST(SweepPlan, ZipTakesTheIthValuesTogether) {
  std::string text = with(dimer, "COMBINE", "combine: zip");
  text = with(text, "[classical, quantum_corrected]", "[classical, quantum_corrected, classical]");
  const SweepPlan plan = read_sweep_plan(text, "d.yaml");
  EXPECT_EQ(plan.combine, Combine::zip);
  EXPECT_EQ(plan.point_count(), 3u);
  EXPECT_EQ(plan.describe(1), "gap = 0.5 nm, width = 22 nm, model = quantum_corrected");
}

TEST(SweepPlan, ZipWithUnequalLengthsPointsAtTheParameter) {
  const std::string text = with(dimer, "COMBINE", "combine: zip");
  const SceneError e = error_of([&] { read_sweep_plan(text, "d.yaml"); });
  const auto [line, column] = position_of(text, "model: [classical");
  EXPECT_EQ(e.where().line, line);
  EXPECT_EQ(e.where().column, column);
  EXPECT_NE(e.message().find("'gap' has 3, 'model' has 2"), std::string::npos) << e.what();
}

TEST(SweepPlan, ListsKeepTheirTextAndKnowNumbersAndUnits) {
  const SweepPlan plan = read_sweep_plan(with(dimer, "COMBINE", ""), "d.yaml");
  const SweepParameter& gap = plan.parameters[0];
  EXPECT_EQ(texts(gap), (std::vector<std::string>{"0.3 nm", "0.5 nm", "1 nm"}));
  EXPECT_TRUE(gap.numeric());
  EXPECT_EQ(gap.unit(), "nm");
  EXPECT_DOUBLE_EQ(*gap.values[1].number, 0.5);
  const SweepParameter& model = plan.parameters[2];
  EXPECT_EQ(texts(model), (std::vector<std::string>{"classical", "quantum_corrected"}));
  EXPECT_FALSE(model.numeric());
  // Numbers in different units stay text: the table cannot put 1 nm and 10 A in one column.
  const SweepPlan mixed = read_sweep_plan(with(with(dimer, "COMBINE", ""), "[0.3 nm, 0.5 nm, 1 nm]", "[3 A, 0.5 nm]"), "d.yaml");
  EXPECT_FALSE(mixed.parameters[0].numeric());
}

TEST(SweepPlan, CountRangeIncludesBothEndsWithoutRoundingNoise) {
  const std::string text =
      with(with(dimer, "COMBINE", ""), "[0.3 nm, 0.5 nm, 1 nm]", "{from: 0.3 nm, to: 1 nm, count: 8}");
  const SweepPlan plan = read_sweep_plan(text, "d.yaml");
  EXPECT_EQ(texts(plan.parameters[0]),
            (std::vector<std::string>{"0.3 nm", "0.4 nm", "0.5 nm", "0.6 nm", "0.7 nm", "0.8 nm", "0.9 nm", "1 nm"}));
  EXPECT_DOUBLE_EQ(*plan.parameters[0].values.back().number, 1.0);
}

TEST(SweepPlan, StepRangeReachesItsEndAndRunsDownwardsToo) {
  std::string text = with(with(dimer, "COMBINE", ""), "[0.3 nm, 0.5 nm, 1 nm]", "{from: 0.3 nm, to: 1 nm, step: 0.1 nm}");
  EXPECT_EQ(read_sweep_plan(text, "d.yaml").parameters[0].values.size(), 8u);
  EXPECT_EQ(read_sweep_plan(text, "d.yaml").parameters[0].values.back().text, "1 nm");
  text = with(with(dimer, "COMBINE", ""), "[0.3 nm, 0.5 nm, 1 nm]", "{from: 1 nm, to: 0.35 nm, step: -0.25 nm}");
  EXPECT_EQ(texts(read_sweep_plan(text, "d.yaml").parameters[0]), (std::vector<std::string>{"1 nm", "0.75 nm", "0.5 nm"}));
}

TEST(SweepPlan, BadRangesAreRefusedAtTheirKey) {
  const auto message = [&](const std::string& range) {
    const std::string text = with(with(dimer, "COMBINE", ""), "[0.3 nm, 0.5 nm, 1 nm]", range);
    return std::string(error_of([&] { read_sweep_plan(text, "d.yaml"); }).what());
  };
  EXPECT_NE(message("{from: 0.3 nm, to: 1 nm, step: -0.1 nm}").find("step towards 'to'"), std::string::npos);
  EXPECT_NE(message("{from: 0.3 nm, to: 1 nm, count: 3, step: 0.1 nm}").find("either 'count'"), std::string::npos);
  EXPECT_NE(message("{from: 0.3 nm, to: 1 eV, count: 3}").find("same unit as 'from'"), std::string::npos);
  EXPECT_NE(message("{from: 0.3 nm, to: 1 nm, count: 2.5}").find("whole number"), std::string::npos);
  EXPECT_NE(message("{from: 0.3 nm, to: 1 nm, cuont: 3}").find("did you mean 'count'"), std::string::npos);
  const std::string text =
      with(with(dimer, "COMBINE", ""), "[0.3 nm, 0.5 nm, 1 nm]", "{from: 0.3 nm, to: 1 nm, step: 0.000001 nm}");
  const SceneError e = error_of([&] { read_sweep_plan(text, "d.yaml"); });
  EXPECT_NE(std::string(e.what()).find("more than"), std::string::npos) << e.what();
  EXPECT_EQ(e.where().line, position_of(text, "0.000001 nm").first);
}

TEST(SweepPlan, CombineWordGetsASuggestion) {
  const SceneError e = error_of([&] { read_sweep_plan(with(dimer, "COMBINE", "combine: zp"), "d.yaml"); });
  EXPECT_NE(e.message().find("did you mean 'zip'"), std::string::npos) << e.what();
}

TEST(SweepPlan, UnusedParameterIsRefusedAtItsKey) {
  const std::string text = with(dimer, "COMBINE", "spare: [1, 2]");
  const SceneError e = error_of([&] { read_sweep_plan(text, "d.yaml"); });
  const auto [line, column] = position_of(text, "spare:");
  EXPECT_EQ(e.where().line, line);
  EXPECT_EQ(e.where().column, column);
  EXPECT_NE(e.message().find("'${spare}'"), std::string::npos) << e.what();
}

TEST(SweepPlan, SweepValuesCannotUseParameters) {
  const std::string text = with(dimer, "[0.3 nm, 0.5 nm, 1 nm]", "[0.3 nm, ${width}]");
  const SceneError e = error_of([&] { read_sweep_plan(with(text, "COMBINE", ""), "d.yaml"); });
  EXPECT_NE(e.message().find("cannot itself use '${width}'"), std::string::npos) << e.what();
}

TEST(SweepPlan, MalformedUseIsRefusedWhereItStarts) {
  const std::string text = with(with(dimer, "COMBINE", ""), "model: ${model}", "model: ${model");
  const SceneError e = error_of([&] { read_sweep_plan(text, "d.yaml"); });
  const auto [line, column] = position_of(text, "${model\n");
  EXPECT_EQ(e.where().line, line);
  EXPECT_EQ(e.where().column, column);
}

TEST(SweepSubstitution, ValuesReplaceEveryUseAndReachTheScene) {
  const std::string text = with(dimer, "COMBINE", "");
  const SweepPlan plan = read_sweep_plan(text, "d.yaml");
  const PointText p = substitute_point(text, "d.yaml", plan, 1);  // gap 0.3 nm, width 20 nm, quantum
  EXPECT_NE(p.text.find("title: \"gap 0.3 nm, quantum_corrected\""), std::string::npos);
  EXPECT_NE(p.text.find("size: [20 nm, 20 nm, 20 nm]"), std::string::npos);
  EXPECT_EQ(p.text.find("${"), std::string::npos);
  // The same number of lines: values never hold a line break.
  EXPECT_EQ(std::count(p.text.begin(), p.text.end(), '\n'), std::count(text.begin(), text.end(), '\n'));

  const solver::Scene quantum = read_scene_point(text, "d.yaml", plan, 1);
  EXPECT_TRUE(quantum.tunnelling.at(0).quantum);
  EXPECT_NEAR(quantum.domain.size[0], 20 * nm, 1e-12 * nm);
  EXPECT_EQ(quantum.title, "gap 0.3 nm, quantum_corrected");
  EXPECT_EQ(quantum.text, p.text);
  const solver::Scene classical = read_scene_point(text, "d.yaml", plan, 16);  // gap 1 nm, width 24 nm, classical
  EXPECT_FALSE(classical.tunnelling.at(0).quantum);
  EXPECT_NEAR(classical.domain.size[0], 24 * nm, 1e-12 * nm);
}

TEST(SweepSubstitution, ErrorInASubstitutedValuePointsAtTheUseAndNamesTheValue) {
  std::string text = with(dimer, "COMBINE", "");
  text = with(text, "[classical, quantum_corrected]", "[classical, quantum_corected]");
  const SweepPlan plan = read_sweep_plan(text, "d.yaml");
  const SceneError e = error_of([&] { read_scene_point(text, "d.yaml", plan, 1); });
  const auto [line, column] = position_of(text, "${model}\n");
  EXPECT_EQ(e.where().line, line);
  EXPECT_EQ(e.where().column, column);
  EXPECT_NE(e.message().find("${model} = 'quantum_corected' here, sweep point 1"), std::string::npos) << e.what();
  EXPECT_NE(e.message().find("did you mean 'quantum_corrected'"), std::string::npos) << e.what();
}

TEST(SweepSubstitution, ColumnsAfterAUseOnTheSameLineStayThoseOfTheFile) {
  // The width value (9 characters) is longer than its use (8): the step that follows on the same
  // line moves in the parsed text, but the error must name the file's column.
  std::string text = with(dimer, "COMBINE", "");
  text = with(text, "step: 0.5 nm", "step: -0.5 nm");
  text = with(text, "{from: 20 nm, to: 24 nm, count: 3}", "[20.125 nm]");
  const SweepPlan plan = read_sweep_plan(text, "d.yaml");
  const SceneError e = error_of([&] { read_scene_point(text, "d.yaml", plan, 0); });
  const auto [line, column] = position_of(text, "-0.5 nm");
  EXPECT_EQ(e.where().line, line);
  EXPECT_EQ(e.where().column, column) << e.what();
  EXPECT_EQ(e.message().find("sweep point"), std::string::npos) << "the step was not substituted: " << e.what();
}

TEST(SweepSubstitution, UnknownNameSuggestsTheNearestParameter) {
  std::string text = with(dimer, "COMBINE", "");
  text = with(text, "model: ${model}", "model: ${modle}");
  const SweepPlan plan = read_sweep_plan(text, "d.yaml");  // model is still used in the title
  const SceneError e = error_of([&] { substitute_point(text, "d.yaml", plan, 0); });
  const auto [line, column] = position_of(text, "${modle}");
  EXPECT_EQ(e.where().line, line);
  EXPECT_EQ(e.where().column, column);
  EXPECT_NE(e.message().find("did you mean 'model'"), std::string::npos) << e.what();
}

TEST(SweepSubstitution, UseWithoutASweepBlockSaysWhatIsMissing) {
  std::string text = dimer.substr(0, dimer.find("sweep:"));
  const SceneError e = error_of([&] { read_scene_text(text, "d.yaml"); });
  const auto [line, column] = position_of(text, "${gap}");
  EXPECT_EQ(e.where().line, line);
  EXPECT_EQ(e.where().column, column);
  EXPECT_NE(e.message().find("no 'sweep' block"), std::string::npos) << e.what();
}

TEST(SweepSubstitution, PlainReadOfASweepSceneNamesTheSweepVerbAndThePointOption) {
  const std::string text = with(dimer, "COMBINE", "");
  const SceneError e = error_of([&] { read_scene_text(text, "d.yaml"); });
  EXPECT_EQ(e.where().line, position_of(text, "sweep:").first);
  EXPECT_NE(e.message().find("18 points"), std::string::npos) << e.what();
  EXPECT_NE(e.message().find("yeegap sweep"), std::string::npos) << e.what();
  EXPECT_NE(e.message().find("--point"), std::string::npos) << e.what();
}

TEST(SweepSubstitution, PointOutOfRangeAndSweepOverridesAreRefused) {
  const std::string text = with(dimer, "COMBINE", "");
  const SweepPlan plan = read_sweep_plan(text, "d.yaml");
  EXPECT_NE(std::string(error_of([&] { read_scene_point(text, "d.yaml", plan, 18); }).what()).find("numbered 0 to 17"),
            std::string::npos);
  EXPECT_NE(std::string(error_of([&] { read_scene_point(text, "d.yaml", plan, 0, {"sweep.gap=[1 nm]"}); }).what())
                .find("cannot be changed with --set"),
            std::string::npos);
  // Other overrides apply to every point as usual.
  EXPECT_NEAR(read_scene_point(text, "d.yaml", plan, 0, {"stop.after=2 fs"}).stop.after, 2e-15, 1e-27);
}

TEST(SweepSubstitution, ScenesWithoutSweepReadAsBefore) {
  const std::string text = with(with(with(with(dimer.substr(0, dimer.find("sweep:")), "${gap}", "1 nm"), "${model}", "x"),
                                     "${width}", "20 nm"),
                                "model: ${model}", "model: classical");
  EXPECT_TRUE(read_sweep_plan(text, "d.yaml").empty());
  EXPECT_FALSE(read_scene_text(text, "d.yaml").tunnelling.at(0).quantum);
}

TEST(SweepSubstitution, SyntaxErrorMadeByAValueIsReportedOnItsLineInFileColumns) {
  // A value that breaks the YAML (an unclosed list) is reported on the line of the ${name} that
  // brought it in, at a column of the file's line (the parsed line is longer).
  std::string text = with(dimer, "COMBINE", "");
  text = with(text, "{from: 20 nm, to: 24 nm, count: 3}", "['[20 nm']");
  const SweepPlan plan = read_sweep_plan(text, "d.yaml");
  const SceneError e = error_of([&] { read_scene_point(text, "d.yaml", plan, 0); });
  const auto [line, column] = position_of(text, "${width}");
  EXPECT_EQ(e.where().line, line) << e.what();
  const std::size_t start = text.find("${width}") - static_cast<std::size_t>(column - 1);
  const int file_line_length = static_cast<int>(text.find('\n', start) - start);
  EXPECT_GE(e.where().column, column) << e.what();
  EXPECT_LE(e.where().column, file_line_length + 1) << e.what();
  EXPECT_NE(e.message().find("YAML syntax error"), std::string::npos) << e.what();
  EXPECT_NE(e.message().find("${width} = '[20 nm'"), std::string::npos) << e.what();
}

TEST(SweepSubstitution, PointOfASceneWithoutSweepIsRefused) {
  const std::string text = with(with(with(with(dimer.substr(0, dimer.find("sweep:")), "${gap}", "1 nm"), "${model}", "x"),
                                     "${width}", "20 nm"),
                                "model: ${model}", "model: classical");
  const SceneError e = error_of([&] { read_scene_point(text, "d.yaml", read_sweep_plan(text, "d.yaml"), 0); });
  EXPECT_NE(e.message().find("no 'sweep' block"), std::string::npos) << e.what();
}

}  // namespace
}  // namespace yeegap::io
