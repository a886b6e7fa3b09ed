// Checkpoint and resume of an angle scan (solver/angle_scan.h): whole angles are kept. On one thread
// the angles run in order, so stopping during the second run leaves exactly one finished angle; its
// checkpoint, read into a fresh AngleScan, runs the other three and ends with a table equal to an
// uninterrupted scan's bit for bit, and its partial results hold the finished row only.
// A p wave on a glass film over a Drude metal; invented numbers, chosen only to be small.
#include <fmt/format.h>
#include <gtest/gtest.h>
#include <omp.h>
#include <unistd.h>

#include <cstring>
#include <filesystem>

#include "base/constants.h"
#include "geometry/shapes.h"
#include "io/checkpoint.h"
#include "solver/angle_scan.h"

namespace fs = std::filesystem;
using namespace yeegap;
using namespace yeegap::solver;

namespace {

constexpr double nm = 1e-9;
constexpr double deg = constants::pi / 180;

Scene scan_scene() {
  Scene s;
  s.file = "angle_scan_checkpoint_test";
  s.text = "angle scan checkpoint test scene";  // what the checkpoint compares; the Scene is built in code
  const double step = 5 * nm;
  const int absorber = 20;
  s.domain.step = {step, step, step};
  s.domain.size = {step, step, 300 * nm + 2 * absorber * step};
  s.domain.edges = {EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic,
                    EdgeKind::periodic, EdgeKind::absorber, EdgeKind::absorber};
  s.domain.bloch = {true, true, false};
  s.domain.absorber.cells = absorber;
  s.domain.gap_cells = 0;
  MaterialSpec air, glass, metal;
  air.name = "air";
  glass.name = "glass";
  glass.poles.eps_inf = 2.25;
  metal.name = "metal";
  metal.poles.eps_inf = 1;
  metal.poles.drude.push_back({1.2e16, 1e14});  // rad/s: plasma frequency, damping
  s.materials = {air, glass, metal};
  s.bodies.push_back({geometry::make_slab(2, -1.0, 0.0), 1, {}, "prism"});
  s.bodies.push_back({geometry::make_slab(2, 0.0, 40 * nm), 2, {}, "metal"});
  BlochWaveSpec w;
  w.axis = 2;
  w.sign = +1;
  w.p_polarised = true;
  w.reference_omega = 2 * constants::pi * constants::c0 / (633 * nm);
  w.omegas = {w.reference_omega};
  w.single_frequency = true;
  w.scan_angles = {20 * deg, 30 * deg, 40 * deg, 50 * deg};
  s.bloch_waves.push_back(w);
  s.stop.after = 40e-15;
  return s;
}

template <class T>
bool same_bits(const std::vector<T>& a, const std::vector<T>& b) {
  return a.size() == b.size() && (a.empty() || std::memcmp(a.data(), b.data(), a.size() * sizeof(T)) == 0);
}

}  // namespace

TEST(AngleScanCheckpoint, ResumedScanKeepsFinishedAnglesAndEqualsUninterruptedScan) {
  const int threads = omp_get_max_threads();
  omp_set_num_threads(1);  // the angles run in order: which are finished at the stop is known
  const Scene scene = scan_scene();
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
