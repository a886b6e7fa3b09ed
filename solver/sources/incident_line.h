// The 1D auxiliary grid that carries a TFSF plane wave: E1 on the 3D grid's nodes along the axis, H1
// on its half nodes, same step and spacing, so the wave has exactly the 3D scheme's dispersion
// (Taflove & Hagness 2005, sec. 5.9). A soft current sheet launches it; matched 1D layers absorb it at
// both ends (reflection below 1e-8). Equations: docs/physics.md 3.6.
#pragma once

#include <vector>

#include "solver/engine/grid.h"
#include "solver/sources/waveform.h"

namespace yeegap::solver {

class StateArrays;  // simulation_state.h

class IncidentLine {
 public:
  /// `first`..`last`: 3D node indices along `axis` the line must cover (it extends beyond them
  /// with the source and absorbers); `eps_r` of the background.
  IncidentLine(const Grid& g, int axis, int sign, double eps_r, double amplitude, const Waveform& w, int first,
               int last, double dt);
  void advance_h();
  /// Advances E to the next integer step; `t_h` is the half step the source current belongs to.
  void advance_e(double t_h);
  /// E1 at 3D node index i (an integer time), H1 at half node i + 1/2 (a half-integer time).
  double e_at(int i) const { return e_[i - offset_]; }
  double h_at(int i) const { return h_[i - offset_]; }
  int axis() const { return axis_; }
  int sign() const { return sign_; }
  double end_time() const { return time_.end_time(); }
  /// E1 and H1 along the line, for checkpoints.
  void add_state(StateArrays& s, const std::string& prefix);

 private:
  int axis_, sign_, offset_ = 0;  // offset_: 3D index of the line's first node
  SourceTime time_;
  double amplitude_, eta_;
  int source_ = 0;                // line position of the current sheet
  std::vector<double> e_, h_;     // E1 at nodes, H1 at half nodes (index i: between i and i+1)
  std::vector<double> ce_a_, ce_b_, ch_a_, ch_b_;  // lossy update coefficients per node / half node
  std::vector<double> inv_dual_, inv_primal_;
};

}  // namespace yeegap::solver
