// Checkpoint and resume (io/results/checkpoint.h, simulation_state.h): a small scene holding every
// stateful part of the time loop (dispersive sphere, CPML, TFSF box, dipole, every recorder) is stopped
// half-way, written, read into a fresh Simulation and finished, bit for bit like the uninterrupted run.
// Damaged and mismatched checkpoints are refused naming the file and what differs.
#include "io/results/checkpoint.h"

#include <fmt/format.h>
#include <gtest/gtest.h>
#include <hdf5.h>
#include <omp.h>
#include <unistd.h>

#include <cmath>
#include <cstdio>
#include <complex>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include "base/errors.h"
#include "io/scene/scene_reader.h"
#include "solver/engine/simulation.h"

namespace fs = std::filesystem;
using namespace yeegap;

namespace {

// Invented numbers, chosen only to be small: 36^3 cells of 3 nm, about 1050 steps. The pulses
// (300-1200 nm) peak at 5.5 fs, so at the half-way stop (3 fs) every array holds rising fields.
const char* scene_text = R"(scene: {version: 1, title: checkpoint test}
materials:
  vacuum: {index: 1}
  gold: {library: Au}
domain:
  size: [108 nm, 108 nm, 108 nm]
  step: 3 nm
  edges: cpml
  cpml: {cells: 6}
bodies:
  - {shape: sphere, material: gold, center: [0, 0, 0], radius: 4.5 nm}
excitation:
  - tfsf:
      box: {from: [-18 nm, -18 nm, -18 nm], to: [18 nm, 18 nm, 18 nm]}
      direction: z
      polarization: x
      band: {from: 300 nm, to: 1200 nm}
  - dipole: {position: [0, 0, 10.5 nm], direction: z, band: {from: 300 nm, to: 1200 nm}}
outputs:
  - probe: {name: near, position: [0, 0, 7 nm], components: [Ex, Hy]}
  - field_map: {name: xz, plane: {axis: y, at: 0 nm}, frequencies: [550 nm, 700 nm], components: [Ex, Ez, Hy]}
  - flux: {name: around, box: {from: [-24 nm, -24 nm, -24 nm], to: [24 nm, 24 nm, 24 nm]}, frequencies: [550 nm, 700 nm]}
  - cross_sections: {name: sphere, frequencies: [550 nm, 700 nm]}
  - far_field: {name: far, frequencies: [550 nm, 700 nm], angles: {theta_count: 5, phi_count: 4}}
  - decay_rate: {name: rate, radiated: far}
stop:
  after: 6 fs
)";

solver::Scene scene_with(const std::string& text) { return io::read_scene_text(text, "checkpoint_test.yaml", {}); }

const io::CheckpointInfo info{"test-version", {}};

struct TempDir {
  fs::path path = fs::temp_directory_path() / fmt::format("yeegap_checkpoint_test_{}", ::getpid());
  TempDir() { fs::create_directories(path); }
  ~TempDir() { fs::remove_all(path); }
};

// Runs `scene` until `steps` steps are done, then writes a checkpoint to `file`; returns the partial results.
solver::RunResults run_and_checkpoint(const solver::Scene& scene, long steps, const std::string& file) {
  solver::Simulation sim(scene);
  solver::RunResults partial = sim.run({}, [&] { return sim.steps_done() >= steps; });
  EXPECT_EQ(partial.summary.stop_reason, "interrupted");
  EXPECT_EQ(partial.summary.steps, steps);
  io::write_checkpoint(file, sim, scene, info);
  return partial;
}

template <class T>
bool same_bits(const std::vector<T>& a, const std::vector<T>& b) {
  return a.size() == b.size() && (a.empty() || std::memcmp(a.data(), b.data(), a.size() * sizeof(T)) == 0);
}

template <class T>
bool same_bits(const std::vector<std::vector<T>>& a, const std::vector<std::vector<T>>& b) {
  if (a.size() != b.size()) return false;
  for (std::size_t i = 0; i < a.size(); ++i)
    if (!same_bits(a[i], b[i])) return false;
  return true;
}

// Every number of the results except the wall-clock figures; `where` names the first difference.
void expect_identical(const solver::RunResults& a, const solver::RunResults& b) {
  EXPECT_EQ(a.summary.steps, b.summary.steps);
  EXPECT_EQ(a.summary.stop_reason, b.summary.stop_reason);
  EXPECT_TRUE(same_bits(std::vector{a.summary.final_energy_fraction, a.summary.simulated_time},
                        std::vector{b.summary.final_energy_fraction, b.summary.simulated_time}));
  EXPECT_TRUE(same_bits(a.source_spectra, b.source_spectra)) << "dipole spectra";
  EXPECT_TRUE(same_bits(a.incident_spectra, b.incident_spectra)) << "incident spectra";
  ASSERT_EQ(a.probes.size(), b.probes.size());
  for (std::size_t i = 0; i < a.probes.size(); ++i) {
    EXPECT_TRUE(same_bits(a.probes[i].time, b.probes[i].time)) << "probe times";
    EXPECT_TRUE(same_bits(a.probes[i].values, b.probes[i].values)) << "probe values";
  }
  ASSERT_EQ(a.field_maps.size(), b.field_maps.size());
  for (std::size_t i = 0; i < a.field_maps.size(); ++i)
    for (std::size_t q = 0; q < a.field_maps[i].values.size(); ++q)
      EXPECT_TRUE(same_bits(a.field_maps[i].values[q], b.field_maps[i].values[q])) << "field map, frequency " << q;
  ASSERT_EQ(a.fluxes.size(), b.fluxes.size());
  for (std::size_t i = 0; i < a.fluxes.size(); ++i) EXPECT_TRUE(same_bits(a.fluxes[i].power, b.fluxes[i].power)) << "flux";
  ASSERT_EQ(a.cross_sections.size(), b.cross_sections.size());
  for (std::size_t i = 0; i < a.cross_sections.size(); ++i) {
    EXPECT_TRUE(same_bits(a.cross_sections[i].scattering, b.cross_sections[i].scattering)) << "scattering";
    EXPECT_TRUE(same_bits(a.cross_sections[i].absorption, b.cross_sections[i].absorption)) << "absorption";
    EXPECT_TRUE(same_bits(a.cross_sections[i].incident_intensity, b.cross_sections[i].incident_intensity));
  }
  ASSERT_EQ(a.far_fields.size(), b.far_fields.size());
  for (std::size_t i = 0; i < a.far_fields.size(); ++i) {
    EXPECT_TRUE(same_bits(a.far_fields[i].e_theta, b.far_fields[i].e_theta)) << "far field E_theta";
    EXPECT_TRUE(same_bits(a.far_fields[i].e_phi, b.far_fields[i].e_phi)) << "far field E_phi";
    EXPECT_TRUE(same_bits(a.far_fields[i].power, b.far_fields[i].power)) << "far-field power";
  }
  ASSERT_EQ(a.decay_rates.size(), b.decay_rates.size());
  for (std::size_t i = 0; i < a.decay_rates.size(); ++i) {
    EXPECT_TRUE(same_bits(a.decay_rates[i].total, b.decay_rates[i].total)) << "decay rate";
    EXPECT_TRUE(same_bits(a.decay_rates[i].radiative, b.decay_rates[i].radiative)) << "radiative rate";
  }
}

class Checkpoint : public ::testing::Test {
 protected:
  const solver::Scene scene_ = scene_with(scene_text);
  TempDir dir_;
};

TEST_F(Checkpoint, ResumedRunEqualsUninterruptedRunBitForBit) {
  // The uninterrupted run and the first half on one thread, the second half on two: the results
  // depend on neither the interruption nor the thread count. (One thread where it can: on a
  // machine busier than its cores, waiting threads cost more than the work of this small grid.)
  omp_set_num_threads(1);
  solver::Simulation whole_sim(scene_);
  const solver::RunResults whole = whole_sim.run();
  ASSERT_EQ(whole.summary.stop_reason, "time");
  const long half = whole.summary.steps / 2;
  ASSERT_GT(half, 500);
  const std::string file = (dir_.path / "run.checkpoint.h5").string();
  const solver::RunResults partial = run_and_checkpoint(scene_, half, file);
  EXPECT_FALSE(fs::exists(file + ".partial"));

  omp_set_num_threads(2);
  solver::Simulation resumed(scene_);
  io::read_checkpoint(file, resumed, scene_, info);
  EXPECT_EQ(resumed.steps_done(), half);
  double currents = 0;  // the gold's pole currents at half-way: state that must carry over
  for (const auto& a : resumed.state_arrays().list())
    if (a.name.rfind("dispersive/", 0) == 0 && a.type == solver::StateArray::Type::f32)
      for (std::size_t i = 0; i < a.count; ++i) currents = std::max(currents, std::abs(double(static_cast<float*>(a.data)[i])));
  EXPECT_GT(currents, 0);
  const solver::RunResults rest = resumed.run();
  omp_set_num_threads(omp_get_num_procs());
  expect_identical(whole, rest);

  // The comparison discriminates: the outputs are not zero, and the half-way results differ.
  double peak = 0;
  for (const auto& v : whole.field_maps[0].values[0][0]) peak = std::max(peak, std::abs(v));
  EXPECT_GT(peak, 0);
  EXPECT_NE(partial.fluxes[0].power[0], whole.fluxes[0].power[0]);
}

TEST_F(Checkpoint, CoversEveryStatefulPartOfTheLoop) {
  solver::Simulation sim(scene_);
  const solver::StateArrays s = sim.state_arrays();
  for (const char* prefix : {"fields/Ex", "fields/Hz", "cpml/", "dispersive/", "plane_wave0/e", "plane_wave0/h",
                             "spectra/dipole0", "spectra/plane_wave0", "probe0/time", "probe0/Hy", "field_map0/",
                             "flux0/", "cross_sections0/inner", "cross_sections0/outer", "far_field0/", "decay_rate0/box"}) {
    bool found = false;
    for (const auto& a : s.list()) found = found || a.name.rfind(prefix, 0) == 0;
    EXPECT_TRUE(found) << "no state array starts with " << prefix;
  }
}

// ---- refusals ----

std::string refusal(const std::string& file, const solver::Scene& scene, const io::CheckpointInfo& i) {
  solver::Simulation sim(scene);
  try {
    io::read_checkpoint(file, sim, scene, i);
  } catch (const RunError& e) {
    return e.what();
  }
  return "<accepted>";
}

// A smaller scene (24^3 cells of 4 nm, about 800 steps) where the whole run is cheap.
const char* small_text = R"(scene: {version: 1}
materials:
  vacuum: {index: 1}
  gold: {library: Au}
domain: {size: [96 nm, 96 nm, 96 nm], step: 4 nm, edges: cpml, cpml: {cells: 6}}
bodies:
  - {shape: sphere, material: gold, center: [0, 0, 0], radius: 12 nm}
excitation:
  - dipole: {position: [0, 0, 20 nm], direction: z, band: {from: 400 nm, to: 1000 nm}}
outputs:
  - probe: {name: p, position: [0, 0, 16 nm], components: [Ez]}
stop: {after: 6 fs}
)";

TEST_F(Checkpoint, MissingStateChangesTheResult) {
  // Shows that a bitwise comparison catches a forgotten array: the small scene resumed exactly
  // matches its whole run, and resumed with its pole currents zeroed after loading does not.
  const solver::Scene small = scene_with(small_text);
  solver::Simulation whole_sim(small);
  const solver::RunResults whole = whole_sim.run();
  const std::string file = (dir_.path / "small.checkpoint.h5").string();
  run_and_checkpoint(small, whole.summary.steps / 2, file);
  for (bool drop_currents : {false, true}) {
    solver::Simulation resumed(small);
    io::read_checkpoint(file, resumed, small, info);
    const solver::StateArrays state = resumed.state_arrays();
    for (const auto& a : state.list())
      if (drop_currents && a.name.rfind("dispersive/", 0) == 0) std::memset(a.data, 0, a.bytes());
    const solver::RunResults rest = resumed.run();
    EXPECT_EQ(same_bits(rest.probes[0].values, whole.probes[0].values), !drop_currents)
        << (drop_currents ? "zeroed pole currents went unnoticed" : "resume differs");
  }
}

TEST_F(Checkpoint, DecayStopRuleResumesWithItsMemory) {
  // The `energy_below` rule compares the energy with its peak so far: a resume that forgot the peak
  // would stop at another step. Stopped half-way between the end of the source (the 400-1000 nm
  // pulse lasts 18.3 fs: waveform.cpp) and the end of the run.
  std::string text = small_text;
  text.replace(text.find("stop: {after: 6 fs}"), 19, "stop: {energy_below: 1e-6}");
  const solver::Scene decaying = scene_with(text);
  solver::Simulation whole_sim(decaying);
  const solver::RunResults whole = whole_sim.run();
  ASSERT_EQ(whole.summary.stop_reason, "energy_below");
  const long source_end = static_cast<long>(std::ceil(18.3e-15 / whole.summary.time_step));
  const long at = (source_end + whole.summary.steps) / 2;
  ASSERT_GT(whole.summary.steps - source_end, 2 * 20) << "the decay should span a few energy checks (every 20 steps) after the source";
  const std::string file = (dir_.path / "decay.checkpoint.h5").string();
  run_and_checkpoint(decaying, at, file);
  solver::Simulation resumed(decaying);
  io::read_checkpoint(file, resumed, decaying, info);
  const solver::RunResults rest = resumed.run();
  EXPECT_EQ(rest.summary.steps, whole.summary.steps);
  EXPECT_EQ(rest.summary.stop_reason, "energy_below");
  EXPECT_TRUE(same_bits(rest.probes[0].values, whole.probes[0].values));
  EXPECT_EQ(rest.summary.final_energy_fraction, whole.summary.final_energy_fraction);
  // Without the peak the rule would judge the decay against later, smaller energies only and stop
  // later (capped here at twice the steps, so the check stays short).
  solver::Scene capped = decaying;
  capped.stop.max_steps = 2 * whole.summary.steps;
  solver::Simulation forgetful(capped);
  io::read_checkpoint(file, forgetful, capped, info);
  solver::StateCounters c = forgetful.state_counters();
  ASSERT_LT(c.last_energy, c.peak_energy);
  c.peak_energy = c.last_energy;
  forgetful.restore_counters(c);  // same step count: the probe series keep their samples
  const solver::RunResults wrong = forgetful.run();
  EXPECT_GT(wrong.summary.steps, whole.summary.steps);
  std::printf("decayed rule: whole run %ld steps, checkpoint at %ld, resumed %ld, resumed without the peak %ld (%s)\n",
              whole.summary.steps, at, rest.summary.steps, wrong.summary.steps, wrong.summary.stop_reason.c_str());
}

TEST_F(Checkpoint, RefusesMismatchedCheckpointsNamingWhatDiffers) {
  const solver::Scene small = scene_with(small_text);
  const std::string file = (dir_.path / "small.checkpoint.h5").string();
  run_and_checkpoint(small, 50, file);
  EXPECT_EQ(refusal(file, small, info), "<accepted>");

  std::string other = small_text;
  other.replace(other.find("radius: 12 nm"), 13, "radius: 10 nm");
  const std::string scene_msg = refusal(file, scene_with(other), info);
  EXPECT_NE(scene_msg.find(file), std::string::npos) << scene_msg;
  EXPECT_NE(scene_msg.find("scene text differs"), std::string::npos) << scene_msg;
  EXPECT_NE(scene_msg.find("line 7"), std::string::npos) << scene_msg;
  EXPECT_NE(scene_msg.find("radius: 10 nm"), std::string::npos) << scene_msg;

  const std::string version_msg = refusal(file, small, {"other-version", {}});
  EXPECT_NE(version_msg.find("written by yeegap test-version, this is yeegap other-version"), std::string::npos)
      << version_msg;
  const std::string set_msg = refusal(file, small, {"test-version", {"domain.step=2 nm"}});
  EXPECT_NE(set_msg.find("--set overrides differ"), std::string::npos) << set_msg;

  // Same scene text, different grid (as a changed default or a different build would give): the
  // checkpoint's grid is compared node by node.
  solver::Scene finer = scene_with(small_text);
  finer.domain.step = {3e-9, 3e-9, 3e-9};
  const std::string grid_msg = refusal(file, finer, info);
  EXPECT_NE(grid_msg.find("the grid differs"), std::string::npos) << grid_msg;

  // Same text and grid, one output more (a different model): the state arrays differ.
  solver::Scene more = scene_with(small_text);
  more.probes.push_back(more.probes[0]);
  more.probes.back().name = "q";
  const std::string state_msg = refusal(file, more, info);
  EXPECT_NE(state_msg.find("no state array 'probe1/time'"), std::string::npos) << state_msg;

  EXPECT_NE(refusal((dir_.path / "none.h5").string(), small, info).find("no such file"), std::string::npos);
}

TEST_F(Checkpoint, RefusesTruncatedAndCorruptedCheckpoints) {
  const solver::Scene small = scene_with(small_text);
  const std::string file = (dir_.path / "small.checkpoint.h5").string();
  run_and_checkpoint(small, 50, file);

  // One flipped byte inside the stored Ez field: the chunk's Fletcher32 checksum catches it.
  haddr_t address = 0;
  {
    const hid_t f = H5Fopen(file.c_str(), H5F_ACC_RDONLY, H5P_DEFAULT);
    const hid_t d = H5Dopen2(f, "/state/fields/Ez", H5P_DEFAULT);
    const hid_t space = H5Dget_space(d);
    hsize_t offset[1];
    unsigned mask = 0;
    hsize_t size = 0;
    ASSERT_GE(H5Dget_chunk_info(d, space, 0, offset, &mask, &address, &size), 0);
    ASSERT_GT(size, 100u);
    address += size / 2;
    H5Sclose(space);
    H5Dclose(d);
    H5Fclose(f);
  }
  const std::string corrupted = (dir_.path / "corrupted.checkpoint.h5").string();
  fs::copy_file(file, corrupted);
  {
    std::fstream io(corrupted, std::ios::in | std::ios::out | std::ios::binary);
    io.seekg(static_cast<std::streamoff>(address));
    char c = 0;
    io.get(c);
    io.seekp(static_cast<std::streamoff>(address));
    io.put(static_cast<char>(c ^ 0x10));
  }
  const std::string damaged = refusal(corrupted, small, info);
  EXPECT_NE(damaged.find(corrupted), std::string::npos) << damaged;
  EXPECT_NE(damaged.find("damaged"), std::string::npos) << damaged;
  EXPECT_NE(damaged.find("fields/Ez"), std::string::npos) << damaged;

  const std::string truncated = (dir_.path / "truncated.checkpoint.h5").string();
  fs::copy_file(file, truncated);
  fs::resize_file(truncated, fs::file_size(truncated) / 2);
  const std::string cut = refusal(truncated, small, info);
  EXPECT_NE(cut.find(truncated), std::string::npos) << cut;
  EXPECT_NE(cut.find("damaged or unreadable"), std::string::npos) << cut;
}

TEST(CheckpointPath, SitsNextToTheResultsFile) {
  EXPECT_EQ(io::checkpoint_path("out/run.h5"), "out/run.checkpoint.h5");
  EXPECT_EQ(io::checkpoint_path("run"), "run.checkpoint.h5");
}

}  // namespace
