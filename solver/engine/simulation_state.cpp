// The run's state for checkpoints (see simulation_state.h and Simulation::state_arrays). Kept out of
// simulation.cpp so the time loop and this list change independently; a new stateful part of the
// loop adds its arrays here, or a checkpoint silently loses it (the resume test compares every
// output bit for bit, so it would notice).
#include "solver/engine/simulation_state.h"

#include <map>

#include <fmt/format.h>

#include "base/errors.h"
#include "solver/engine/simulation.h"

namespace yeegap::solver {

const char* type_name(StateArray::Type t) {
  switch (t) {
    case StateArray::Type::f32: return "float32";
    case StateArray::Type::f64: return "float64";
    case StateArray::Type::c128: return "complex128";
  }
  return "?";
}

void StateArrays::add(std::string name, StateArray::Type type, void* data, std::size_t count) {
  for (const StateArray& a : list_) YG_CHECK(a.name != name, fmt::format("two state arrays are named '{}'", name));
  list_.push_back({std::move(name), type, data, count});
}

std::size_t StateArrays::bytes() const {
  std::size_t n = 0;
  for (const StateArray& a : list_) n += a.bytes();
  return n;
}

StateCounters Simulation::state_counters() const {
  return {.step = n_, .peak_energy = peak_energy_, .last_energy = last_energy_, .wall_seconds = wall_seconds_};
}

void Simulation::restore_counters(const StateCounters& c) {
  YG_CHECK(c.step >= 0, fmt::format("a step count cannot be negative, got {}", c.step));
  n_ = c.step;
  peak_energy_ = c.peak_energy;
  last_energy_ = c.last_energy;
  wall_seconds_ = c.wall_seconds;
  stop_reason_.clear();
  for_each_recorder([&](Recorder& r) { r.prepare_resume(n_); });
}

StateArrays Simulation::state_arrays() {
  StateArrays s;
  // Whole arrays with their halos: the halos hold periodic copies and mirror images the next
  // step reads before refilling some of them.
  for (int c = 0; c < 6; ++c) s.add_vector(fmt::format("fields/{}", component_names[c]), fields_.c[c]);
  if (cpml_) cpml_->add_state(s, "cpml");
  dispersive_->add_state(s, "dispersive");
  if (subcell_) subcell_->add_state(s, "subcell");
  for (std::size_t i = 0; i < plane_waves_.size(); ++i) plane_waves_[i].add_state(s, fmt::format("plane_wave{}", i));
  for (std::size_t i = 0; i < source_dft_.size(); ++i) s.add_vector(fmt::format("spectra/dipole{}", i), source_dft_[i]);
  for (std::size_t i = 0; i < incident_dft_.size(); ++i)
    s.add_vector(fmt::format("spectra/plane_wave{}", i), incident_dft_[i]);
  std::map<std::string, int> of_kind;  // "flux" -> how many fluxes are saved already
  for_each_recorder([&](Recorder& r) { r.add_state(s, fmt::format("{}{}", r.state_kind(), of_kind[r.state_kind()]++)); });
  return s;
}

}  // namespace yeegap::solver
