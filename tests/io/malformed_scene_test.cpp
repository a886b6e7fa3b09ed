// Malformed scenes: each mistake must be a SceneError that says what was expected and what was
// found, at the right line and column (1-based; the column of the value, or of the key for an
// unknown key, or of the enclosing block's key for a missing key).
#include <string>
#include <vector>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "base/errors.h"
#include "io/scene/scene_reader.h"
#include "scene_refusal.h"

namespace {

using ::testing::HasSubstr;
using yeegap::io::read_scene_text;

struct Failure {
  std::string what;
  yeegap::Where where;
};

Failure failure_of(const std::string& text, const std::vector<std::string>& overrides = {}) {
  const yeegap::SceneError e = yeegap::io::testing::refusal_of([&] { read_scene_text(text, "bad.yaml", overrides); }, text);
  return {e.what(), e.where()};
}

// The message starts with the place, so a reader sees "bad.yaml:LINE:COL: ..." first.
void expect_at(const Failure& f, int line, int column) {
  EXPECT_EQ(f.where.file, "bad.yaml");
  EXPECT_EQ(f.where.line, line) << f.what;
  EXPECT_EQ(f.where.column, column) << f.what;
  EXPECT_THAT(f.what, ::testing::StartsWith("bad.yaml:" + std::to_string(line) + ":" + std::to_string(column) + ": "));
}

TEST(MalformedScene, UnknownTopLevelKeySuggestsTheClosestWord) {
  const auto f = failure_of(R"(scene: {version: 1}
domian: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("unknown top-level key 'domian'; did you mean 'domain'?"));
  expect_at(f, 2, 1);
  EXPECT_EQ(f.where.key_path, "domian");
}

TEST(MalformedScene, UnknownNestedKeyIsReportedAtTheKeyWithSuggestion) {
  const auto f = failure_of(R"(scene: {version: 1}
domain:
  size: 400 nm
  sise: 300 nm
  step: 5 nm
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("unknown key 'sise' in domain; did you mean 'size'?"));
  expect_at(f, 4, 3);
  EXPECT_EQ(f.where.key_path, "domain.sise");
}

TEST(MalformedScene, UnknownKeyFarFromAnyListsTheValidKeys) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm, colour: blue}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("unknown key 'colour' in domain; expected one of: size, center, step"));
  expect_at(f, 2, 36);
}

TEST(MalformedScene, UnknownUnitIsRefusedWithTheClosestUnit) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
bodies:
  - shape: sphere
    material: vacuum
    center: [0, 0, 0]
    radius: 40 nn
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("bodies[0].radius: unknown unit 'nn' in '40 nn'; did you mean 'nm'?"));
  expect_at(f, 7, 13);
}

TEST(MalformedScene, UnitOfAnotherKindIsNamedAsSuch) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 fs}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("domain.step: 'fs' is a time unit, but this must be a length"));
  expect_at(f, 2, 30);
}

TEST(MalformedScene, NegativeRadiusIsRefusedAtTheValue) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
bodies:
  - shape: sphere
    material: vacuum
    center: [0, 0, 0]
    radius: 40 nm
  - shape: sphere
    material: vacuum
    center: [0, 0, 0]
    radius: -40 nm
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("bodies[1].radius: must be a positive length, got '-40 nm'"));
  expect_at(f, 11, 13);
  EXPECT_EQ(f.where.key_path, "bodies[1].radius");
}

TEST(MalformedScene, BareNumberAsSpectralValueIsAmbiguous) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation:
  - dipole:
      position: [0, 0, 0]
      direction: z
      band: {from: 500, to: 800 nm}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("excitation[0].dipole.band.from: a bare number is ambiguous for a spectral value"));
  EXPECT_THAT(f.what, HasSubstr("got '500'"));
  expect_at(f, 7, 20);
}

TEST(MalformedScene, BareNumberAsTimeNeedsAUnit) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100}
)");
  EXPECT_THAT(f.what, HasSubstr("stop.after: needs a unit (fs, ps, ns, s), got '100'"));
  expect_at(f, 4, 15);
}

TEST(MalformedScene, MissingRequiredKeyNamesItAndPointsAtItsBlock) {
  const auto f = failure_of(R"(scene: {version: 1}
domain:
  size: 400 nm
  edges: cpml
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("domain: missing key 'step'"));
  expect_at(f, 2, 1);
}

TEST(MalformedScene, MissingTopLevelBlockIsNamed) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
)");
  EXPECT_THAT(f.what, HasSubstr("missing top-level key 'stop'"));
}

TEST(MalformedScene, UnknownMaterialSuggestsTheClosestDefinedOne) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
materials:
  glass: {index: 1.5}
  gold: {permittivity: 3}
bodies:
  - {shape: sphere, material: glas, center: [0, 0, 0], radius: 40 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("bodies[0].material: unknown material 'glas'; did you mean 'glass'?"));
  expect_at(f, 7, 31);
}

TEST(MalformedScene, YamlSyntaxErrorGivesLineAndColumn) {
  const auto f = failure_of(R"(scene: {version: 1}
domain:
  size: [400 nm, 400 nm, 400 nm
  step: 5 nm
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("YAML syntax error: end of sequence flow not found"));
  // yaml-cpp notices the missing ']' where the flow list should have ended: at the next key.
  expect_at(f, 4, 7);
}

TEST(MalformedScene, ASecondYamlDocumentIsRefusedWhereItStarts) {
  // Everything after '---' used to be ignored without a word (a stop rule, an output, ...).
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
---
outputs:
  - probe: {name: p, position: [0, 0, 0]}
)");
  EXPECT_THAT(f.what, HasSubstr("a second YAML document starts here"));
  expect_at(f, 6, 1);
}

TEST(MalformedScene, ATitleTooLongForTheResultsFileIsRefusedBeforeTheRun) {
  const auto f = failure_of("scene: {version: 1, title: " + std::string(5000, 'x') + R"(}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("is 5000 characters long; a title holds at most 4096"));
  expect_at(f, 1, 28);
}

TEST(MalformedScene, TextWhereANumberIsExpectedIsRefused) {
  const auto f = failure_of(R"(scene: {version: 1}
domain:
  size: 400 nm
  step: 5 nm
  stability_fraction: fast
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("domain.stability_fraction: must be a plain number, got 'fast'"));
  expect_at(f, 5, 23);
}

TEST(MalformedScene, ListWhereABlockIsExpectedIsRefused) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: [400 nm, 5 nm]
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("domain: must be a block of keys (size, center, step"));
  EXPECT_THAT(f.what, HasSubstr("got a list of 2 items"));
  expect_at(f, 2, 1);
}

TEST(MalformedScene, IndexAndPermittivityTogetherAreRefused) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
materials:
  glass:
    index: 1.5
    permittivity: 2.25
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("materials.glass: give either 'index' or 'permittivity', not both"));
  expect_at(f, 6, 5);
}

TEST(MalformedScene, BadEdgeWordSuggestsTheClosestOne) {
  const auto f = failure_of(R"(scene: {version: 1}
domain:
  size: 400 nm
  step: 5 nm
  edges: {x: periodic, y: periodic, z: cmpl}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("domain.edges.z: unknown word 'cmpl'; did you mean 'cpml'?"));
  expect_at(f, 5, 40);
}

// Keys and words renamed with #15 (absorber, courant, decayed): an old scene is refused at the old
// word, and the message names the new one.
TEST(MalformedScene, RenamedKeysAndWordsNameTheirNewSpelling) {
  const std::string tail = "excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}\n";
  auto f = failure_of("scene: {version: 1}\ndomain: {size: 400 nm, step: 5 nm, absorber: {cells: 8}}\n" + tail +
                      "stop: {after: 100 fs}\n");
  EXPECT_THAT(f.what, HasSubstr("domain.absorber is now domain.cpml"));
  expect_at(f, 2, 36);
  f = failure_of("scene: {version: 1}\ndomain: {size: 400 nm, step: 5 nm, courant: 0.9}\n" + tail + "stop: {after: 100 fs}\n");
  EXPECT_THAT(f.what, HasSubstr("domain.courant is now domain.stability_fraction"));
  f = failure_of("scene: {version: 1}\ndomain: {size: 400 nm, step: 5 nm, edges: {z: absorber}}\n" + tail +
                 "stop: {after: 100 fs}\n");
  EXPECT_THAT(f.what, HasSubstr("'absorber' is now called 'cpml'"));
  f = failure_of("scene: {version: 1}\ndomain: {size: 400 nm, step: 5 nm}\n" + tail + "stop: {decayed: 1e-5}\n");
  EXPECT_THAT(f.what, HasSubstr("stop.decayed is now stop.energy_below"));
  expect_at(f, 4, 8);
}

TEST(MalformedScene, PeriodicOnOneFaceOnlyIsRefused) {
  const auto f = failure_of(R"(scene: {version: 1}
domain:
  size: 400 nm
  step: 5 nm
  edges: {x_low: periodic, x_high: metal}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("x_low is periodic but x_high is metal: periodic applies to both faces of an axis"));
  expect_at(f, 5, 3);
}

TEST(MalformedScene, DuplicateOutputNameIsRefusedNamingTheFirstUse) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
outputs:
  - probe: {name: near, position: [0, 0, 10 nm]}
  - flux:
      name: near
      plane: {axis: z, at: 50 nm}
      frequencies: [600 nm]
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("outputs[1].flux.name: the output name 'near' is already used by outputs[0].probe (line 5)"));
  expect_at(f, 7, 13);
}

TEST(MalformedScene, BadOverridePathNamesTheOverride) {
  const std::string scene = R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
bodies:
  - {shape: sphere, material: vacuum, center: [0, 0, 0], radius: 40 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)";
  const auto past_end = failure_of(scene, {"bodies[3].radius=40 nm"});
  EXPECT_THAT(past_end.what, HasSubstr("--set bodies[3].radius=40 nm: 'bodies' has 1 item, so there is no item [3]"));
  EXPECT_EQ(past_end.where.line, 0);  // an override has no place in the file
  EXPECT_EQ(past_end.where.key_path, "bodies[3].radius");

  const auto into_value = failure_of(scene, {"domain.step.x=2 nm"});
  EXPECT_THAT(into_value.what, HasSubstr("--set domain.step.x=2 nm: 'domain.step' is a plain value, so it has no key 'x'"));

  const auto not_a_path = failure_of(scene, {"domain..step=2 nm"});
  EXPECT_THAT(not_a_path.what, HasSubstr("--set domain..step=2 nm: 'domain..step' is not a key path"));

  const auto no_equals = failure_of(scene, {"domain.step"});
  EXPECT_THAT(no_equals.what, HasSubstr("--set domain.step: expected key.path=value"));
}

TEST(MalformedScene, OverriddenKeyWithATypoIsAnUnknownKeyNamingTheOverride) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)", {"domain.sise=300 nm"});
  EXPECT_THAT(f.what, HasSubstr("unknown key 'sise' in domain; did you mean 'size'? (set by --set domain.sise=300 nm)"));
  EXPECT_EQ(f.where.line, 0);
}

TEST(MalformedScene, OverriddenValueIsValidatedLikeOneInTheFile) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
bodies:
  - {shape: sphere, material: vacuum, center: [0, 0, 0], radius: 40 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)", {"bodies[0].radius=-3 nm"});
  EXPECT_THAT(f.what, HasSubstr("bodies[0].radius: must be a positive length, got '-3 nm' (set by --set bodies[0].radius=-3 nm)"));
}

TEST(MalformedScene, RepeatedKeyIsRefusedNamingTheFirst) {
  const auto f = failure_of(R"(scene: {version: 1}
domain:
  size: 400 nm
  step: 5 nm
  step: 4 nm
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("key 'step' appears twice in domain (first on line 4)"));
  expect_at(f, 5, 3);
}

TEST(MalformedScene, StepLargerThanTheDomainIsRefused) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: [400 nm, 400 nm, 4 nm], step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("domain.step: the cell step 5 nm along z is larger than the domain size 4 nm"));
  expect_at(f, 2, 46);
}

TEST(MalformedScene, DipoleOutsideTheDomainIsRefused) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 300 nm], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("excitation.dipole.position[2]: z = 300 nm lies outside the domain, which spans -200 nm to 200 nm"));
  expect_at(f, 3, 40);
}

TEST(MalformedScene, KeyOfAnotherShapeSaysWhichKeysTheShapeTakes) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
bodies:
  - {shape: sphere, material: vacuum, center: [0, 0, 0], size: 40 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("bodies[0]: a sphere takes no 'size'; its keys are shape, material, name, center, radius"));
  expect_at(f, 4, 58);
}

TEST(MalformedScene, PlannedSourceIsNotAvailableYet) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation:
  - beam: {direction: z}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("'beam' in excitation[0] is not available in this version; available: dipole"));
  expect_at(f, 4, 5);
}

TEST(MalformedScene, RampOnAPulseIsRefused) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation:
  - dipole:
      position: [0, 0, 0]
      direction: z
      band: {from: 500 nm, to: 800 nm}
      ramp: 10 fs
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("'ramp' applies to a continuous wave ('frequency'), not to a pulse"));
  expect_at(f, 8, 7);
}

TEST(MalformedScene, MisspeltComponentSuggestsTheRightCase) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
outputs:
  - probe: {name: p, position: [0, 0, 0], components: [Ex, ez]}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("outputs[0].probe.components[1]: unknown word 'ez'; did you mean 'Ez'?"));
  expect_at(f, 5, 60);
}

TEST(MalformedScene, FrequencyRangeOfOnePointIsRefused) {
  const auto f = failure_of(R"(scene: {version: 1}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
outputs:
  - flux: {name: f, plane: {axis: z, at: 0 nm}, frequencies: {from: 500 nm, to: 800 nm, count: 1}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("outputs[0].flux.frequencies.count: must be a whole number of at least 2, got '1'"));
  expect_at(f, 5, 96);
}

TEST(MalformedScene, OtherFormatVersionIsRefused) {
  const auto f = failure_of(R"(scene: {version: 2}
domain: {size: 400 nm, step: 5 nm}
excitation: {dipole: {position: [0, 0, 0], direction: z, frequency: 600 nm}}
stop: {after: 100 fs}
)");
  EXPECT_THAT(f.what, HasSubstr("scene.version: this program reads scene format version 1, got '2'"));
  expect_at(f, 1, 18);
}

TEST(MalformedScene, EmptySceneIsRefused) {
  const auto f = failure_of("# nothing here\n");
  EXPECT_THAT(f.what, HasSubstr("the scene is empty"));
}

TEST(MalformedScene, MissingFileIsASceneErrorNamingIt) {
  try {
    yeegap::io::read_scene_file("no_such_scene_file.yaml");
    ADD_FAILURE() << "a missing file was accepted";
  } catch (const yeegap::SceneError& e) {
    EXPECT_THAT(e.what(), HasSubstr("no_such_scene_file.yaml: cannot open the scene file"));
  }
}

}  // namespace
