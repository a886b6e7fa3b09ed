// A plane wave in a Bloch-periodic cell, injected one way through a TFSF plane normal to the stack
// axis (Taflove & Hagness 2005, secs. 5.9-5.10, ch. 13). The incident field comes from an auxiliary
// one-cell problem on the same cells, step and Bloch phase, an exact solution of the grid's own
// equations: the plane does not leak, and it gives the incident power. docs/physics.md 3.7.
#pragma once

#include <array>
#include <memory>
#include <vector>

#include "solver/engine/fields.h"
#include "solver/engine/grid.h"
#include "solver/engine/stage.h"
#include "solver/sources/waveform.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

/// Where a Bloch plane wave sits on the grid and what it meets, resolved once.
struct BlochWavePlan {
  int axis = 2, sign = +1;
  int lateral_b = 0, lateral_c = 1;  // the two lateral axes: axis+1, axis+2 (cyclic)
  int entry = 0;                   // node of the TFSF plane: the first total-field E node along the travel
  int reflected = 0;               // node of the plane that sees the reflected wave alone
  int transmitted = 0;             // node of the plane just before the far absorber
  int sheet = 0;                   // node of the current sheet in the auxiliary problem
  int aux_offset = 0;              // main node index - incident problem's node index along the axis
  int material = 0;                // the incident medium (index into Scene::materials)
  double index = 1;                // its refractive index
  double reference_omega = 0;      // rad/s
  Vec3 k_parallel;                 // rad/m
  Vec3 current;                    // unit tangential direction of the exciting sheet: p or s
};

/// In-plane wavevector n (omega_ref / c) sin(angle) along the azimuth, for a wave in `index`.
Vec3 bloch_wave_k_parallel(const BlochWaveSpec& w, double index);
/// The angle (rad) in the incident medium at which frequency omega travels with in-plane wavevector
/// k_par: sin theta = c |k_par| / (n omega) (physics.md 3.7); NaN where no wave propagates.
double bloch_wave_angle(double k_parallel, double index, double omega);

/// Resolves the planes and the incident medium; throws RunError when the entry plane does not lie
/// in one lossless, non-dispersive material, is too close to the absorbers, or the lateral axes are
/// not uniform Bloch axes.
BlochWavePlan plan_bloch_wave(const BlochWaveSpec& w, const Scene& s, const Grid& g);

/// The current sheet of the auxiliary problem (part 0 real, 1 imaginary): a surface current
/// K(t) = -(2 / eta) s(t) u exp(i k_par . r) on the sheet node, s(t) the waveform's moment.
class BlochWaveSheet : public Stage {
 public:
  BlochWaveSheet(const BlochWavePlan& p, const Grid& g, const BlockLayout& L, const CurlCoefficients& curls,
                 const ECoefficients& ec, const DomainSpec& d, const Waveform& w, int part);
  void after_h(Fields&) override {}
  void after_e(Fields& f, double t_h) override;
  double end_time() const { return time_.end_time(); }

 private:
  SourceTime time_;
  std::array<int, 2> comp_{};       // the two tangential E components
  std::array<double, 2> weight_{};  // -cb (2/eta) u_t Re or Im of exp(i psi_t) / dual
  std::array<std::ptrdiff_t, 2> offset_{};
};

/// The TFSF plane of the main problem, for one part (0 real, 1 imaginary): corrects the tangential
/// E just inside and the tangential H just outside with the auxiliary problem's fields, each
/// lateral cell taking the Bloch phase exp(i (phi_b i + phi_c j)) of its position.
class BlochWaveEntry : public Stage {
 public:
  /// aux_re, aux_im: the auxiliary problem's two parts (aux_im null when k_par = 0).
  BlochWaveEntry(const BlochWavePlan& p, const Grid& g, const BlockLayout& L, const CurlCoefficients& curls,
                 const ECoefficients& ec, const MaterialIndex& mi, const DomainSpec& d, int part,
                 const Fields* aux_re, const Fields* aux_im);
  void after_h(Fields& f) override;
  void after_e(Fields& f, double t_h) override;

 private:
  struct Fix {
    int target;                     // component corrected, 0..5
    int source;                     // incident component read from the auxiliary problem, 0..5
    std::ptrdiff_t aux_offset;      // where it is read
    double coefficient;             // update coefficient of the missing neighbour, with its sign
  };
  void apply(Fields& f, const std::vector<Fix>& fixes, std::ptrdiff_t base) const;
  std::vector<Fix> e_fix_, h_fix_;
  int part_;
  const Fields* aux_re_;
  const Fields* aux_im_;
  BlockLayout layout_;
  int nb_ = 1, nc_ = 1;             // lateral cells
  std::vector<double> cos_, sin_;   // Bloch phase per lateral cell, (j_c * nb + i_b)
  std::array<int, 3> lateral_stride_axis_{};  // axis, b, c
  std::ptrdiff_t e_base_ = 0, h_base_ = 0;    // flat index of lateral cell (0, 0) on the E and H planes
};

}  // namespace yeegap::solver
