// Decay-rate (Purcell) enhancement of a dipole (Purcell 1946; Novotny & Hecht, Principles of
// Nano-Optics, 2006, ch. 8; physics.md 4.6): the power out of a small closed box around the dipole
// over P0 = n eta0 k0^2 |I l|^2 / (12 pi), the same dipole alone in the medium around it (Jackson
// 1999, eq. 9.24). With a far_field or closed flux output around everything, the radiative part
// and the quantum efficiency radiative / total of an ideal emitter follow.
#pragma once

#include <memory>
#include <vector>

#include "solver/outputs/recorders.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

class DecayRateRecorder : public DftRecorder {
 public:
  /// Refuses (RunError) a 2D domain, a missing dipole or `radiated` output, frequencies that output
  /// does not record, and a box that leaves the domain's free cells or holds more than one medium
  /// (which must be lossless and without poles, so that P0 is known in closed form).
  DecayRateRecorder(const DecayRateSpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L,
                    const MaterialIndex& mi);
  void record(const Fields& f, bool electric, const std::vector<Complex>& phase) override {
    box_->record(f, electric, phase);
  }
  /// Needs `r` to hold the source spectra and the far fields and fluxes already.
  DecayRateResult result(const RunResults& r) const;

  /// The frequencies: the scene's, or those of the `radiated` output when the scene lists none.
  const std::vector<double>& result_omegas() const override { return omegas_; }
  std::size_t memory_bytes() const override { return box_->memory_bytes(); }
  const char* state_kind() const override { return "decay_rate"; }
  void add_state(StateArrays& s, const std::string& prefix) override { box_->add_state(s, prefix + "/box"); }
  /// Listed after the far fields and fluxes it reads, so they are in `r` already.
  void add_result(RunResults& r, const ResultInputs&, const Recorder*) const override {
    r.decay_rates.push_back(result(r));
  }

 private:
  DecayRateSpec spec_;
  std::vector<double> omegas_;
  double index_ = 1;
  std::unique_ptr<FluxRecorder> box_;
};

}  // namespace yeegap::solver
