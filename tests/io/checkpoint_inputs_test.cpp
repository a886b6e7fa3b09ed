// Checkpoints refuse to resume once a file the scene reads besides itself has changed (io/results/checkpoint.h,
// io/file_hash.h): a scene with an n,k table and an STL mesh beside it is checkpointed; the same
// files resume, an edited table or mesh is refused with a message naming the file and its scene key.
// The hash is FNV-1a 64; its test vectors below are those published with the algorithm (from memory,
// cross-checked against an independent few-line implementation in Python).
#include <fmt/format.h>
#include <gtest/gtest.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <string>

#include "base/errors.h"
#include "io/results/checkpoint.h"
#include "io/file_hash.h"
#include "io/scene/scene_reader.h"
#include "solver/engine/simulation.h"

namespace fs = std::filesystem;
using namespace yeegap;

namespace {

// Invented numbers, chosen only to be small: 8^3 cells of 10 nm, a dielectric tetrahedron from an STL
// file and a sphere whose material is a table of n, k (a constant index 1.5, k = 0.1).
const char* scene_text = R"(scene: {version: 1, title: checkpoint inputs test}
materials:
  vacuum: {index: 1}
  measured: {table: data/measured.csv, poles: 1}
  glass: {index: 1.5}
domain: {size: [80 nm, 80 nm, 80 nm], step: 10 nm, edges: cpml, cpml: {cells: 2}}
bodies:
  - {shape: sphere, material: measured, center: [0, 0, 0], radius: 15 nm}
  - {shape: mesh, material: glass, file: tet.stl, unit: nm}
excitation:
  - dipole: {position: [0, 0, 25 nm], direction: z, band: {from: 500 nm, to: 900 nm}}
stop: {after: 1 fs}
)";

std::string table(double k) {
  std::string s = "wavelength_nm,n,k\n";
  for (int i = 0; i < 20; ++i) s += fmt::format("{},1.5,{}\n", 400 + 30 * i, k);
  return s;
}

const char* tetrahedron = R"(solid tet
facet normal 0 0 0
 outer loop
  vertex 0 0 0
  vertex 0 20 0
  vertex 20 0 0
 endloop
endfacet
facet normal 0 0 0
 outer loop
  vertex 0 0 0
  vertex 20 0 0
  vertex 0 0 20
 endloop
endfacet
facet normal 0 0 0
 outer loop
  vertex 0 0 0
  vertex 0 0 20
  vertex 0 20 0
 endloop
endfacet
facet normal 0 0 0
 outer loop
  vertex 20 0 0
  vertex 0 20 0
  vertex 0 0 20
 endloop
endfacet
endsolid tet
)";

class CheckpointInputs : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() /
           fmt::format("yeegap_checkpoint_inputs_{}_{}", ::testing::UnitTest::GetInstance()->current_test_info()->name(),
                       ::getpid());
    fs::remove_all(dir_);
    fs::create_directories(dir_ / "data");
    write("scene.yaml", scene_text);
    write("data/measured.csv", table(0.1));
    write("tet.stl", tetrahedron);
  }
  void TearDown() override { fs::remove_all(dir_); }
  void write(const std::string& name, const std::string& text) const { std::ofstream(dir_ / name) << text; }
  solver::Scene scene() const {
    return io::read_scene_file((dir_ / "scene.yaml").string(), {}, [](const std::string&) {});
  }
  std::string checkpoint() const { return (dir_ / "run.checkpoint.h5").string(); }
  // The message of the refusal when resuming the checkpoint with the files as they are now; empty if accepted.
  std::string resume() const {
    const solver::Scene s = scene();
    solver::Simulation sim(s);
    try {
      io::read_checkpoint(checkpoint(), sim, s, info_);
    } catch (const RunError& e) {
      return e.what();
    }
    return "";
  }
  fs::path dir_;
  io::CheckpointInfo info_{"test", {}};
};

}  // namespace

TEST(FileHash, Fnv1a64MatchesThePublishedTestVectors) {
  EXPECT_EQ(io::fnv1a_64(""), 0xcbf29ce484222325ULL);  // the offset basis
  EXPECT_EQ(io::fnv1a_64("a"), 0xaf63dc4c8601ec8cULL);
  EXPECT_EQ(io::fnv1a_64("foobar"), 0x85944171f73967e8ULL);
  EXPECT_EQ(io::hash_text(0xaf63dc4c8601ec8cULL), "fnv1a64:af63dc4c8601ec8c");
}

TEST_F(CheckpointInputs, SceneRecordsTheTableAndTheMeshWithTheirHashes) {
  const solver::Scene s = scene();
  ASSERT_EQ(s.input_files.size(), 2u);
  EXPECT_EQ(s.input_files[0].key_path, "materials.measured.table");
  EXPECT_EQ(fs::path(s.input_files[0].path), dir_ / "data/measured.csv");
  EXPECT_EQ(s.input_files[0].content_hash, io::fnv1a_64(table(0.1)));
  EXPECT_EQ(s.input_files[1].key_path, "bodies[1].file");
  EXPECT_EQ(s.input_files[1].content_hash, io::fnv1a_64(tetrahedron));
}

TEST_F(CheckpointInputs, ChangedTableOrMeshIsRefusedNamingTheFile) {
  {
    const solver::Scene s = scene();
    solver::Simulation sim(s);
    sim.step();
    io::write_checkpoint(checkpoint(), sim, s, info_);
  }
  EXPECT_EQ(resume(), "") << "the same files must resume";

  write("data/measured.csv", table(0.2));  // another k: the fit, and so the model, differ
  const std::string table_refusal = resume();
  EXPECT_NE(table_refusal.find("cannot be resumed: the file '"), std::string::npos) << table_refusal;
  EXPECT_NE(table_refusal.find("measured.csv' (materials.measured.table) has changed since the run started"),
            std::string::npos)
      << table_refusal;
  EXPECT_NE(table_refusal.find(io::hash_text(io::fnv1a_64(table(0.1))) + " then"), std::string::npos) << table_refusal;

  write("data/measured.csv", table(0.1));  // back as it was: accepted again
  EXPECT_EQ(resume(), "");

  std::string moved = tetrahedron;
  for (auto at = moved.find("vertex 20 0 0"); at != std::string::npos; at = moved.find("vertex 20 0 0"))
    moved.replace(at, 13, "vertex 25 0 0");  // one corner 5 nm further out, in each facet that has it
  write("tet.stl", moved);
  const std::string mesh_refusal = resume();
  EXPECT_NE(mesh_refusal.find("tet.stl' (bodies[1].file) has changed since the run started"), std::string::npos)
      << mesh_refusal;
}
