// One run: builds the model from a Scene and advances it. Per step (Taflove & Hagness 2005, ch. 3):
//   E halos, H update, CPML(H), record H; H halos, pole currents J^{n+1/2} (dispersive.h), E update,
//   CPML(E), sources, E -= cb J, record E.
// Nothing global: a test may hold two Simulations at once.
#pragma once

#include <functional>
#include <memory>
#include <optional>
#include <vector>

#include "solver/engine/cpml.h"
#include "solver/sources/dipole_source.h"
#include "solver/media/dispersive.h"
#include "solver/engine/fields.h"
#include "solver/media/tunnelling_cells.h"
#include "solver/engine/grid.h"
#include "solver/outputs/recorder.h"
#include "solver/results.h"
#include "solver/scene.h"
#include "solver/engine/simulation_state.h"
#include "solver/engine/stage.h"
#include "solver/media/subcell_average.h"
#include "solver/sources/tfsf.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

/// Figures `yeegap check` prints, known before any step runs.
struct ModelSummary {
  std::array<int, 3> cells{};
  long long cell_count = 0;
  double time_step = 0;            // s
  double courant_limit = 0;        // s
  long steps = 0;                  // planned (or estimated) steps
  bool steps_estimated = false;    // true when the stop rule is a decay, so the count is a guess
  std::size_t memory_bytes = 0;    // fields, material index, absorbers, recorders
  double smallest_cell = 0, largest_cell = 0;  // m
  std::array<double, 3> min_cell{}, max_cell{};  // m, smallest and largest cell per axis
  struct RefinedGap {
    int body_a = 0, body_b = 0;    // indices into Scene::bodies
    double width = 0;              // m
    Vec3 middle;                   // m
    int cells_across = 0;          // along the axis the gap spans most
  };
  std::vector<RefinedGap> gaps;      // gaps between bodies found and refined by the mesh builder
  std::vector<std::string> mesh_notes;  // what the mesh builder dropped or changed
  std::vector<std::string> warnings;    // settings that run but will disappoint (a step cap reached)
  long long mixed_cells = -1;      // E locations with an averaged permittivity; -1 = not counted
};

struct Progress {
  long step = 0;
  long planned_steps = 0;          // best current estimate
  double steps_per_second = 0;
  double cells_per_second = 0;
  double eta_seconds = 0;          // < 0 when unknown
};

class Simulation : public Checkpointable {
 public:
  /// Builds everything; throws RunError for settings that cannot run (unstable time step, ...).
  explicit Simulation(const Scene& scene);
  Simulation(const Simulation&) = delete;
  Simulation& operator=(const Simulation&) = delete;
  ~Simulation() override;

  ModelSummary summary() const;
  /// The same figures without allocating the fields (for `yeegap check` on scenes too big to
  /// build here); memory of recorders is estimated from their extents.
  static ModelSummary plan(const Scene& scene);
  /// Builds what the constructor builds short of the field arrays (material map, gap cells,
  /// sources, recorders) and drops it: every placement rule a run would refuse at its start
  /// (a box in an absorber, a dipole in a metal, ...) is refused here too, for `yeegap check`.
  static void check_placements(const Scene& scene);
  /// Advances one full step (H then E).
  void step();
  /// The two halves of step(), for runs that fill halos between them (Bloch cells: the real and
  /// imaginary parts exchange their periodic copies, bloch_halos.h). step() = step_h(); step_e().
  void step_h();
  void step_e();
  /// Adds work done after each half step's sources (see stage.h); the run shares ownership.
  void add_stage(std::shared_ptr<Stage> s) { stages_.push_back(std::move(s)); }
  /// Adds an output that the caller reads itself (a Bloch run's own planes): sampled, counted and
  /// checkpointed like the scene's outputs, but left out of results(). Before the first step.
  Recorder& add_recorder(std::unique_ptr<Recorder> r);
  /// Runs until the stop rule holds; `progress` is called about twice a second. `between_steps`,
  /// if given, is called after every step that the stop rule lets pass (a checkpoint may be taken
  /// there); returning true ends the run at once with stop reason "interrupted", leaving the
  /// state exactly as a checkpoint needs it (the final energy measurement is skipped).
  RunResults run(const std::function<void(const Progress&)>& progress = {},
                 const std::function<bool()>& between_steps = {});
  /// Collects the results at the current time (also usable after step()).
  RunResults results() const;
  /// The same with the flux and field-map spectra of a complex (Bloch) field whose imaginary part
  /// ran in `imaginary` (the same scene): E(omega) = E_re(omega) + i E_im(omega).
  RunResults results(const Simulation* imaginary) const;

  // Access for tests and tools.
  const Grid& grid() const override { return grid_; }
  Fields& fields() { return fields_; }
  double dt() const override { return dt_; }
  /// Steps between running-DFT samples (recorders sum their DFTs on every such step only).
  long dft_sample_stride() const { return dft_stride_; }
  const Scene& scene() const { return scene_; }
  const CurlCoefficients& curls() const { return curls_; }
  const ECoefficients& e_update_coefficients() const { return ecoef_; }
  const MaterialIndex& material_index() const { return mindex_; }
  long steps_done() const { return n_; }
  /// Field energy 1/2 sum (eps E^2 + mu0 H^2) dV over the interior, J (per unit length along
  /// invariant axes scaled by their cell size).
  /// The polarization (kinetic and bound-charge) energy of dispersive media is not included.
  double field_energy() const;
  /// Where the fields have gone wrong: the first location holding a non-finite value, else the
  /// largest |E| or |H| (scaled by the impedance of free space): component, cell, position in nm,
  /// material. For the message of a diverged run.
  std::string describe_largest_field() const;
  /// Polarization currents of the dispersive materials (per-cell damping of gap cells goes here).
  DispersiveCurrents& dispersive() { return *dispersive_; }
  /// The averaged update of mixed E locations, or null (averaging off, or no mixed location).
  const SubcellAverage* subcell_average() const { return subcell_.get(); }

  // Checkpoints (simulation_state.h; defined in simulation_state.cpp).
  StateCounters state_counters() const override;
  void restore_counters(const StateCounters& c) override;
  StateArrays state_arrays() override;

 private:
  void fill_periodic_halos(bool electric);
  /// The source spectra's frequencies (every output's), their DFT stride and accumulators.
  void plan_spectra();
  template <class F> void for_each_recorder(F&& f) {
    for (auto& r : recorders_) f(*r);
    for (auto& r : run_recorders_) f(*r);
  }
  template <class F> void for_each_recorder(F&& f) const {
    for (const auto& r : recorders_) f(*r);
    for (const auto& r : run_recorders_) f(*r);
  }
  double sources_end_time() const;

  Scene scene_;
  Grid grid_;
  double dt_ = 0;
  Fields fields_;
  CurlCoefficients curls_;
  ECoefficients ecoef_;
  MaterialIndex mindex_;
  std::unique_ptr<Cpml> cpml_;
  std::unique_ptr<DispersiveCurrents> dispersive_;
  std::unique_ptr<SubcellAverage> subcell_;       // null with averaging off or no mixed locations
  std::vector<TunnellingGap> tunnelling_gaps_;
  std::vector<DipoleSource> dipoles_;
  std::vector<PlaneWaveSource> plane_waves_;
  std::vector<std::unique_ptr<Recorder>> recorders_;      // the scene's outputs, in the order results are made
  std::vector<std::unique_ptr<Recorder>> run_recorders_;  // outputs of the run itself (add_recorder)
  std::vector<std::shared_ptr<Stage>> stages_;
  std::vector<double> all_omegas_;                 // union of output frequencies, for source spectra
  std::vector<std::vector<Complex>> source_dft_;   // per dipole
  std::vector<std::vector<Complex>> incident_dft_; // per plane wave
  long n_ = 0;
  long dft_stride_ = 1;               // steps between running-DFT samples
  double wall_seconds_ = 0;
  std::string stop_reason_;
  double peak_energy_ = 0, last_energy_ = 0;
};

}  // namespace yeegap::solver
