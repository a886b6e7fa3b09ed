// Cross sections from a TFSF box (Taflove & Hagness 2005, sec. 5.x; Bohren & Huffman 1983, sec.
// 3.4 for the definitions): C_sca = P_scattered / I0 from the outward flux of the scattered field
// two cells outside the box, C_abs = -P_total / I0 from the outward flux of the total field two
// cells inside it, C_ext = C_sca + C_abs, with I0 = |E_inc|^2 / (2 eta) from the incident line.
#pragma once

#include <memory>

#include "solver/outputs/recorders.h"

namespace yeegap::solver {

class CrossSectionRecorder : public DftRecorder {
 public:
  CrossSectionRecorder(const CrossSectionSpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L);
  void record(const Fields& f, bool electric, const std::vector<Complex>& phase) override;
  /// `incident` is the DFT of the incident E at this recorder's frequencies.
  CrossSectionResult result(const std::vector<Complex>& incident) const;
  int plane_wave() const { return spec_.plane_wave; }

  const std::vector<double>& result_omegas() const override { return spec_.omegas; }
  std::size_t memory_bytes() const override { return inner_->memory_bytes() + outer_->memory_bytes(); }
  const char* state_kind() const override { return "cross_sections"; }
  void add_state(StateArrays& s, const std::string& prefix) override {
    inner_->add_state(s, prefix + "/inner");
    outer_->add_state(s, prefix + "/outer");
  }
  /// The incident spectrum of its plane wave, picked out of the run's at these frequencies.
  void add_result(RunResults& r, const ResultInputs& in, const Recorder* twin) const override;

 private:
  CrossSectionSpec spec_;
  double eta_ = 0;             // wave impedance of the background, ohm
  double length_ = 1;          // cell length along an invariant axis (2D), else 1
  bool per_length_ = false;
  std::unique_ptr<FluxRecorder> inner_, outer_;
};

}  // namespace yeegap::solver
