// The electromagnetic energy inside a box against time: 1/2 sum (eps E^2 + mu0 H^2) dV over the
// box's cells after every half step, E and H parts at their own times. eps is eps0 eps_inf of the
// material at each E location; the polarisation energy of dispersive media is not counted.
#pragma once

#include <array>
#include <vector>

#include "solver/engine/grid.h"
#include "solver/engine/yee_kernels.h"
#include "solver/outputs/recorder.h"

namespace yeegap::solver {

class EnergyRecorder : public Recorder {
 public:
  EnergyRecorder(const EnergySpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L,
                 const MaterialIndex& mi);
  void sample(const Fields& f, bool electric, const SampleTime& when) override;
  const std::vector<double>& result_omegas() const override { return no_omegas_; }
  std::size_t memory_bytes() const override { return 0; }  // the series grow as the run goes
  const char* state_kind() const override { return "energy"; }
  void add_state(StateArrays& s, const std::string& prefix) override;
  void prepare_resume(long steps) override;
  void add_result(RunResults& r, const ResultInputs&, const Recorder*) const override;

 private:
  double sum(const Fields& f, bool electric) const;

  EnergySpec spec_;
  const Grid& grid_;
  const BlockLayout& layout_;
  const MaterialIndex& mindex_;
  std::vector<double> eps_;                 // F/m per material index
  std::array<int, 3> first_{}, last_{};     // cells counted, inclusive
  std::vector<double> time_, electric_, magnetic_time_, magnetic_;
  mutable std::vector<double> per_plane_;   // the sum's partial results, kept between samples
  std::vector<double> no_omegas_;
};

}  // namespace yeegap::solver
