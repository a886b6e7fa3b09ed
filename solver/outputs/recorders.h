// The outputs that watch a run: probes (time series at a point), field maps (DFT fields on a plane
// or volume, interpolated to grid nodes) and flux planes/boxes (power through a surface from DFT
// fields). Each records after the half step that produces its samples and hands plain results over
// at the end (results.h).
#pragma once

#include <array>
#include <vector>

#include "solver/outputs/dft_box.h"
#include "solver/outputs/recorder.h"
#include "solver/engine/grid.h"
#include "solver/results.h"

namespace yeegap::solver {

/// Node index range [first, last] covered by [lo, hi] on axis a (the whole axis if invariant).
std::array<int, 2> node_range(const Grid& g, int a, double lo, double hi);

class ProbeRecorder : public Recorder {
 public:
  ProbeRecorder(const ProbeSpec& spec, const Grid& g, const BlockLayout& L);
  void record(const Fields& f, bool electric, double t);
  ProbeResult result() const { return result_; }
  /// Sizes the series for `samples` steps (before a checkpoint is read into them).
  void resize(std::size_t samples);

  void sample(const Fields& f, bool electric, const SampleTime& when) override { record(f, electric, when.t); }
  const std::vector<double>& result_omegas() const override { return no_omegas_; }
  /// Nothing when built: the series grow as the run goes.
  std::size_t memory_bytes() const override { return 0; }
  const char* state_kind() const override { return "probe"; }
  void add_state(StateArrays& s, const std::string& prefix) override;
  void prepare_resume(long steps) override { resize(static_cast<std::size_t>(steps)); }
  void add_result(RunResults& r, const ResultInputs&, const Recorder*) const override { r.probes.push_back(result_); }

 private:
  std::vector<std::ptrdiff_t> offsets_;
  ProbeResult result_;
  std::vector<double> no_omegas_;
};

class FieldMapRecorder : public DftRecorder {
 public:
  FieldMapRecorder(const FieldMapSpec& spec, const Grid& g, const BlockLayout& L);
  void record(const Fields& f, bool electric, const std::vector<Complex>& phase) override;
  /// With `imaginary` (the same map in the imaginary part of a Bloch run) the values are
  /// re + i im: the complex field's spectrum. A sample taken across a periodic edge (node n, or
  /// the half-cell below node 0 that interpolation reads) is the stored value times
  /// exp(i m bloch_phase[a]), m the periods it was wrapped by (bloch_halos.h).
  FieldMapResult result(const FieldMapRecorder* imaginary = nullptr, const std::array<double, 3>& bloch_phase = {}) const;

  const std::vector<double>& result_omegas() const override { return spec_.omegas; }
  std::size_t memory_bytes() const override;
  const char* state_kind() const override { return "field_map"; }
  void add_state(StateArrays& s, const std::string& prefix) override;
  void add_result(RunResults& r, const ResultInputs& in, const Recorder* twin) const override {
    r.field_maps.push_back(result(static_cast<const FieldMapRecorder*>(twin), in.bloch_phases));
  }

 private:
  FieldMapSpec spec_;
  std::array<std::array<int, 2>, 3> nodes_;  // node range per axis
  std::array<bool, 3> periodic_{};
  std::vector<DftBox> boxes_;                // one per component
  std::vector<std::array<std::vector<int>, 3>> wraps_;  // per component, axis, list entry: periods wrapped
  std::vector<double> x_, y_, z_;
};

class FluxRecorder : public DftRecorder {
 public:
  FluxRecorder(const FluxSpec& spec, const Grid& g, const BlockLayout& L);
  void record(const Fields& f, bool electric, const std::vector<Complex>& phase) override;
  /// With `imaginary` (the same surface in the imaginary part of a Bloch run) the power is that of
  /// the complex field E = E_re + i E_im, H likewise.
  FluxResult result(const FluxRecorder* imaginary = nullptr) const;

  const std::vector<double>& result_omegas() const override { return spec_.omegas; }
  std::size_t memory_bytes() const override;
  const char* state_kind() const override { return "flux"; }
  void add_state(StateArrays& s, const std::string& prefix) override;
  void add_result(RunResults& r, const ResultInputs&, const Recorder* twin) const override {
    r.fluxes.push_back(result(static_cast<const FluxRecorder*>(twin)));
  }

 private:
  struct Face {
    int axis;
    double sign;                    // +1: flux towards +axis counts positive
    std::array<DftBox, 4> dft;      // E_b, H_c (averaged), E_c, H_b (averaged)
    std::array<std::vector<double>, 2> weight_b, weight_c;  // [term][list position] area weights
  };
  Face make_face(const Grid& g, const BlockLayout& L, int axis, int node, const std::array<std::array<int, 2>, 3>& r,
                 double sign, std::size_t nf);
  FluxSpec spec_;
  double mirror_factor_ = 1;        // 2 per symmetry plane the region starts on: the whole structure
  bool closed_ = false;
  int normal_ = -1;
  std::vector<Face> faces_;
};

}  // namespace yeegap::solver
