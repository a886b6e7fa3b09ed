// A run on a Bloch-periodic cell with a non-zero in-plane wavevector (physics.md 3.7): two
// Simulations of the same scene hold the real and imaginary parts of the complex fields and meet
// only at the periodic copies (bloch_halos.h); with k = 0 the imaginary part is never built. A
// plane_wave adds a third and fourth, small, auxiliary problem (the incident wave alone, one
// lateral cell: bloch_wave.h) that feeds the entry plane and measures the incident power, so the
// fluxes become reflectance, transmittance and absorptance without a separate reference run.
#pragma once

#include <array>
#include <functional>
#include <memory>
#include <string>
#include <vector>

#include "solver/sources/bloch_wave.h"
#include "solver/engine/simulation.h"
#include "solver/outputs/recorders.h"

namespace yeegap::solver {

class BlochRun : public Checkpointable {
 public:
  /// `scene` may hold one plane_wave (bloch_waves) without an angle list, dipoles, probes, field
  /// maps, fluxes and an `orders` output (diffraction_orders.h, on the reflected and transmitted
  /// planes); cross sections, far fields, decay rates and tfsf boxes are refused when the
  /// wavevector is not zero (they assume real fields).
  explicit BlochRun(const Scene& scene);
  BlochRun(const BlochRun&) = delete;
  BlochRun& operator=(const BlochRun&) = delete;
  ~BlochRun() override;

  /// The scene as it runs: the Bloch wavevector set from the plane wave's angle, a time step that
  /// is stable with it, the CPML shift from the wave's band. The run's own reflected and
  /// transmitted planes are not in it: the run adds them to its Simulations. Throws RunError for
  /// what cannot run.
  static Scene prepare(const Scene& scene);
  /// Figures for `yeegap check`, with notes on the complex fields and the auxiliary problem.
  static ModelSummary plan(const Scene& scene);

  void step();
  /// As Simulation::run, `between_steps` included (a checkpoint may be taken there).
  RunResults run(const std::function<void(const Progress&)>& progress = {},
                 const std::function<bool()>& between_steps = {});
  RunResults results() const;

  Simulation& real_part() { return *re_; }
  Simulation* imaginary_part() { return im_.get(); }
  Simulation* incident_real_part() { return inc_re_.get(); }
  Simulation* incident_imaginary_part() { return inc_im_.get(); }
  const BlochWavePlan* wave_plan() const { return wave_ ? &plan_ : nullptr; }
  long steps_done() const { return n_; }
  double dt() const override { return re_->dt(); }

  // Checkpoints (bloch_state.cpp): every part's arrays under "real", "imaginary", "incident_real",
  // "incident_imaginary", with the run's own counters.
  const Grid& grid() const override;
  StateCounters state_counters() const override;
  void restore_counters(const StateCounters& c) override;
  StateArrays state_arrays() override;

 private:
  double sources_end_time() const;  // s: when the last dipole or wave has ended
  Scene scene_;
  bool wave_ = false;
  BlochWavePlan plan_;
  // The run's own outputs, in the real [0] and imaginary [1] parts (owned by those Simulations):
  // the reflected and transmitted power planes, and the planes the diffraction orders come from.
  std::vector<FluxSpec> plane_specs_;
  std::array<std::vector<const FluxRecorder*>, 2> planes_;
  std::array<std::vector<const FieldMapRecorder*>, 2> order_maps_;
  double orders_index_ = 0;        // medium of the transmitted orders; 0: absorbing, none
  DiffractionOrdersResult orders(const std::function<double(double)>& intensity) const;
  std::unique_ptr<Simulation> re_, im_, inc_re_, inc_im_;
  long n_ = 0;
  double wall_seconds_ = 0;
  std::string stop_reason_;
  double peak_energy_ = 0, last_energy_ = 0;
};

}  // namespace yeegap::solver
