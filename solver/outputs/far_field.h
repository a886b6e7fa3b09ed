// Near-to-far-field transform by surface equivalence (Love / Schelkunoff; Taflove & Hagness 2005,
// ch. 8; Balanis, Antenna Theory, 3rd ed., 2005, ch. 12; formulas and exp(-i omega t) signs in
// physics.md 3.10): running DFTs of the tangential E and H on a closed box give the currents
// J = n x H and M = -n x E, whose radiation integrals N and L give the field at infinity.
#pragma once

#include <array>
#include <vector>

#include "solver/outputs/dft_box.h"
#include "solver/outputs/recorder.h"
#include "solver/engine/grid.h"
#include "solver/results.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

class FarFieldRecorder : public DftRecorder {
 public:
  /// Refuses (RunError) what the transform cannot handle: an invariant axis (2D), a face of the
  /// domain that is not an absorber, a dispersive, lossy or conducting background, a box that
  /// reaches into the absorbers or crosses a plane-wave box, and any body on or outside the box
  /// (including a substrate: the free-space Green's function would be wrong there).
  FarFieldRecorder(const FarFieldSpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L,
                   const MaterialIndex& mi);
  void record(const Fields& f, bool electric, const std::vector<Complex>& phase) override;
  /// The transform itself; costs (surface points) x (directions) per frequency, so call it once.
  FarFieldResult result() const;
  const std::string& name() const { return spec_.name; }

  const std::vector<double>& result_omegas() const override { return spec_.omegas; }
  std::size_t memory_bytes() const override;
  const char* state_kind() const override { return "far_field"; }
  void add_state(StateArrays& s, const std::string& prefix) override;
  void add_result(RunResults& r, const ResultInputs&, const Recorder*) const override {
    r.far_fields.push_back(result());
  }

 private:
  // Points of one face come in two sets, each holding an E and an H component at the same place
  // (H averaged over the half cells either side of the face, as in the flux recorder):
  // set 0 at (b half, c node) holds E_b and H_c, set 1 at (b node, c half) holds E_c and H_b,
  // with b = a+1, c = a+2 (cyclic) and a the face's normal axis.
  struct Face {
    int axis = 0;
    double sign = 1;                                  // outward normal along +axis (+1) or -axis (-1)
    double at = 0;                                    // m, coordinate of the face
    double h_gap = 0;                                 // m, distance between the two H planes averaged
    std::array<DftBox, 4> dft;                        // E_b, H_c, E_c, H_b
    std::array<std::vector<double>, 2> xb, xc, wb, wc;  // [set] positions (m) and trapezoid weights
  };
  void check_scene(const Scene& scene, const Grid& g, const MaterialIndex& mi, const BlockLayout& L) const;
  // Weighted currents of one face and set: a = w H (the H of J = n x H), b = w E (the E of
  // M = -n x E), [ic * nb + ib].
  struct WeightedCurrents {
    std::vector<Complex> a, b;
  };
  using FaceCurrents = std::array<WeightedCurrents, 2>;
  /// The currents of every face at frequency q; `surface` gets the outward flux through the box.
  std::vector<FaceCurrents> weighted_currents(std::size_t q, double& surface) const;
  /// The radiation integrals N (of J) and L (of M) in each direction.
  void radiation_vectors(const std::vector<FaceCurrents>& cur, double k, const std::vector<Vec3>& dirs,
                         std::vector<std::array<Complex, 3>>& n_vec, std::vector<std::array<Complex, 3>>& l_vec) const;

  FarFieldSpec spec_;
  double index_ = 1;
  std::array<std::array<int, 2>, 3> nodes_{};         // node range of the box per axis
  Region box_;
  Vec3 centre_;
  std::vector<Face> faces_;
};

}  // namespace yeegap::solver
