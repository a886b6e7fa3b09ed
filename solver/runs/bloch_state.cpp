// Checkpoints of a Bloch run (see bloch_run.h and simulation_state.h): the state of each of its
// Simulations under its own prefix (real, imaginary, and the incident problem's two parts), and
// the run's own counters, which it keeps for all of them.
#include "solver/runs/bloch_run.h"

namespace yeegap::solver {

const Grid& BlochRun::grid() const { return re_->grid(); }

StateCounters BlochRun::state_counters() const {
  return {.step = n_, .peak_energy = peak_energy_, .last_energy = last_energy_, .wall_seconds = wall_seconds_};
}

void BlochRun::restore_counters(const StateCounters& c) {
  n_ = c.step;
  peak_energy_ = c.peak_energy;
  last_energy_ = c.last_energy;
  wall_seconds_ = c.wall_seconds;
  stop_reason_.clear();
  // Each part counts its own steps (its sample times and probe series follow them).
  for (Simulation* s : {re_.get(), im_.get(), inc_re_.get(), inc_im_.get()})
    if (s) s->restore_counters({.step = c.step});
}

StateArrays BlochRun::state_arrays() {
  StateArrays s;
  s.add_all("real", re_->state_arrays());
  if (im_) s.add_all("imaginary", im_->state_arrays());
  if (inc_re_) s.add_all("incident_real", inc_re_->state_arrays());
  if (inc_im_) s.add_all("incident_imaginary", inc_im_->state_arrays());
  return s;
}

}  // namespace yeegap::solver
