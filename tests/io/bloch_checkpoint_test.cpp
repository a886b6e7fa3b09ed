// Checkpoint and resume of a Bloch run (four Simulations: real and imaginary parts of the fields and
// of the incident problem) and of an angle scan, which keeps whole angles: a film over a Drude metal,
// stopped half-way and resumed in a fresh BlochRun or AngleScan, matches the uninterrupted run bit for
// bit, and a scan's partial results hold its finished rows only. Invented numbers.
#include <fmt/format.h>
#include <gtest/gtest.h>
#include <omp.h>
#include <unistd.h>

#include <cmath>
#include <cstring>
#include <filesystem>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "io/results/checkpoint.h"
#include "solver/runs/angle_scan.h"
#include "solver/runs/bloch_run.h"

namespace fs = std::filesystem;
using namespace yeegap;
using namespace yeegap::solver;

namespace {

constexpr double nm = 1e-9;
constexpr double deg = constants::pi / 180;
double omega_of(double lambda) { return 2 * constants::pi * constants::c0 / lambda; }

Scene film_scene() {
  Scene s;
  s.file = "bloch_checkpoint_test";
  s.text = "bloch checkpoint test scene";  // what the checkpoint compares; the Scene is built in code
  const double step = 4 * nm;
  const int absorber = 20;
  s.domain.step = {step, step, step};
  s.domain.size = {step, step, 400 * nm + 2 * absorber * step};
  s.domain.edges = {EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic,
                    EdgeKind::periodic, EdgeKind::cpml, EdgeKind::cpml};
  s.domain.bloch = {true, true, false};
  s.domain.cpml.cells = absorber;
  s.domain.gap_cells = 0;
  MaterialSpec air, glass, metal;
  air.name = "air";
  glass.name = "glass";
  glass.poles.eps_inf = 2.25;
  metal.name = "metal";
  metal.poles.eps_inf = 1;
  metal.poles.drude.push_back({1.2e16, 1e14});  // rad/s: plasma frequency, damping
  s.materials = {air, glass, metal};
  s.bodies.push_back({geometry::make_slab(2, 0.0, 40 * nm), 1, {}, "film"});
  s.bodies.push_back({geometry::make_slab(2, 40 * nm, 1.0), 2, {}, "metal"});
  BlochWaveSpec w;
  w.axis = 2;
  w.sign = +1;
  w.angle = 30 * constants::pi / 180;
  w.p_polarized = true;
  w.waveform.omega_min = omega_of(700 * nm);
  w.waveform.omega_max = omega_of(500 * nm);
  w.omegas = {omega_of(550 * nm), omega_of(650 * nm)};
  w.reference_omega = omega_of(600 * nm);
  s.bloch_waves.push_back(w);
  s.stop.after = 60e-15;
  return s;
}

template <class T>
bool same_bits(const std::vector<T>& a, const std::vector<T>& b) {
  return a.size() == b.size() && (a.empty() || std::memcmp(a.data(), b.data(), a.size() * sizeof(T)) == 0);
}

TEST(BlochCheckpoint, ResumedBlochRunEqualsUninterruptedRunBitForBit) {
  const Scene scene = film_scene();
  BlochRun whole_run(scene);
  ASSERT_NE(whole_run.imaginary_part(), nullptr) << "the wave is oblique: complex fields";
  const RunResults whole = whole_run.run();
  const long half = whole.summary.steps / 2;

  const fs::path file = fs::temp_directory_path() / fmt::format("yeegap_bloch_checkpoint_{}.h5", ::getpid());
  const io::CheckpointInfo info{"test", {}};
  {
    BlochRun first(scene);
    const RunResults partial = first.run({}, [&] { return first.steps_done() >= half; });
    ASSERT_EQ(partial.summary.stop_reason, "interrupted");
    io::write_checkpoint(file.string(), first, scene, info);
    bool parts = false;
    for (const auto& a : first.state_arrays().list()) parts = parts || a.name.rfind("incident_imaginary/", 0) == 0;
    EXPECT_TRUE(parts) << "the incident problem's imaginary part must be in the checkpoint";
  }
  BlochRun resumed(scene);
  io::read_checkpoint(file.string(), resumed, scene, info);
  fs::remove(file);
  EXPECT_EQ(resumed.steps_done(), half);
  const RunResults rest = resumed.run();

  ASSERT_EQ(rest.reflectance.size(), 1u);
  EXPECT_TRUE(same_bits(rest.reflectance[0].reflectance, whole.reflectance[0].reflectance));
  EXPECT_TRUE(same_bits(rest.reflectance[0].transmittance, whole.reflectance[0].transmittance));
  EXPECT_EQ(rest.summary.steps, whole.summary.steps);
  // Not trivially equal: the film and metal reflect a fair part of the wave.
  EXPECT_GT(whole.reflectance[0].reflectance[0], 0.05);
}

TEST(AngleScanCheckpoint, ResumedScanKeepsFinishedAnglesAndEqualsUninterruptedScan) {
  const int threads = omp_get_max_threads();
  omp_set_num_threads(1);  // the angles run in order: which are finished at the stop is known
  Scene scene = film_scene();
  scene.text = "angle scan checkpoint test scene";
  BlochWaveSpec& w = scene.bloch_waves.front();
  w.omegas = {w.reference_omega};
  w.single_frequency = true;
  w.scan_angles = {20 * deg, 30 * deg, 40 * deg, 50 * deg};
  scene.stop.after = 40e-15;
  const RunResults whole = AngleScan(scene).run();
  ASSERT_EQ(whole.reflectance.size(), 1u);
  ASSERT_EQ(whole.reflectance[0].reflectance.size(), 4u);
  const long steps_per_angle = whole.summary.steps / 4;  // the same stop time; nearly the same steps

  const fs::path file = fs::temp_directory_path() / fmt::format("yeegap_angle_scan_checkpoint_{}.h5", ::getpid());
  const io::CheckpointInfo info{"test", {}};
  {
    AngleScan first(scene);
    long calls = 0;  // one per step of the run under way: stop half-way through the second angle
    const RunResults partial = first.run({}, [&] { return ++calls > steps_per_angle * 3 / 2; });
    EXPECT_EQ(partial.summary.stop_reason, "interrupted");
    EXPECT_EQ(first.finished_count(), 1u);
    ASSERT_EQ(partial.reflectance.size(), 1u);
    ASSERT_EQ(partial.reflectance[0].reflectance.size(), 1u) << "partial results hold the finished angle only";
    EXPECT_EQ(partial.reflectance[0].reflectance[0], whole.reflectance[0].reflectance[0]);
    io::write_checkpoint(file.string(), first, scene, info);
  }
  AngleScan resumed(scene);
  io::read_checkpoint(file.string(), resumed, scene, info);
  fs::remove(file);
  EXPECT_EQ(resumed.finished_count(), 1u);
  const RunResults rest = resumed.run();
  omp_set_num_threads(threads);

  ASSERT_EQ(rest.reflectance.size(), 1u);
  const ReflectanceResult &a = whole.reflectance[0], &b = rest.reflectance[0];
  EXPECT_TRUE(same_bits(a.reflectance, b.reflectance));
  EXPECT_TRUE(same_bits(a.transmittance, b.transmittance));
  EXPECT_TRUE(same_bits(a.angles, b.angles));
  EXPECT_TRUE(same_bits(a.k_parallel, b.k_parallel));
  EXPECT_EQ(rest.summary.steps, whole.summary.steps);
  EXPECT_EQ(rest.summary.final_energy_fraction, whole.summary.final_energy_fraction);
  EXPECT_TRUE(same_bits(rest.material_map, whole.material_map));
  EXPECT_TRUE(same_bits(rest.grid_z, whole.grid_z));
  // Not trivially equal: the rows differ from angle to angle, and the film reflects a fair part.
  EXPECT_NE(a.reflectance[0], a.reflectance[3]);
  EXPECT_GT(a.reflectance[0], 0.05);
}

}  // namespace
