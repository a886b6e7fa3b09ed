// What every output of a run does, as one interface: sample the fields after each half step, keep
// its running sums in the checkpoint, and add its result to the run's results. The run holds one
// list of them (each kind in the scene's order; a result may read those listed before it): adding
// an output is a new Recorder and one line where the run builds its parts, not new sites in the run.
#pragma once

#include <array>
#include <string>
#include <vector>

#include "solver/outputs/dft_box.h"
#include "solver/results.h"

namespace yeegap::solver {

class StateArrays;  // simulation_state.h

/// When a sample is taken: the time of the field just updated, and whether the running DFTs sum
/// this step (every `dft_dt / dt` steps, with weight dft_dt).
struct SampleTime {
  double t = 0;
  bool dft_now = true;
  double dft_dt = 0;
};

/// What a result may need from the run besides the recorder's own sums.
struct ResultInputs {
  const std::vector<double>& all_omegas;                 // the source spectra's frequencies
  const std::vector<std::vector<Complex>>& incident_dft;  // per plane wave, at all_omegas
  std::array<double, 3> bloch_phases{};                   // of a Bloch cell's axes (0: none)
};

class Recorder {
 public:
  virtual ~Recorder() = default;
  /// After the H update (electric = false) or the E update (true).
  virtual void sample(const Fields& f, bool electric, const SampleTime& when) = 0;
  /// The frequencies whose source spectra the result needs (none for a time series).
  virtual const std::vector<double>& result_omegas() const = 0;
  /// Memory held now, bytes.
  virtual std::size_t memory_bytes() const = 0;
  /// The kind's name in checkpoints: the n-th recorder of a kind saves as "<kind><n>".
  virtual const char* state_kind() const = 0;
  virtual void add_state(StateArrays& s, const std::string& prefix) = 0;
  /// Before a checkpoint taken after `steps` steps is read into the state.
  virtual void prepare_resume(long /*steps*/) {}
  /// Adds this output's result to `r`, after those listed before it. `twin` is the same output in
  /// the imaginary part of a Bloch run (null otherwise); its spectra join this one's as re + i im.
  virtual void add_result(RunResults& r, const ResultInputs& in, const Recorder* twin) const = 0;
};

/// A Recorder of running DFTs at its result frequencies: it samples on the steps the DFTs sum,
/// with the phases of those frequencies at that time.
class DftRecorder : public Recorder {
 public:
  void sample(const Fields& f, bool electric, const SampleTime& when) final {
    if (when.dft_now) record(f, electric, dft_phases(result_omegas(), when.t, when.dft_dt));
  }
  virtual void record(const Fields& f, bool electric, const std::vector<Complex>& phase) = 0;
};

}  // namespace yeegap::solver
