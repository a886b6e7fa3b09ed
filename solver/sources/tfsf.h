// Total-field/scattered-field plane-wave source (Taflove & Hagness 2005, ch. 5). Every Yee location
// is classed total (inside the box) or scattered; wherever an update reads a neighbour of the
// other class, the incident field at that neighbour is added (total reads scattered) or removed
// (scattered reads total). The corrections are found once by scanning the box surface, so edges
// and corners need no special cases. The incident field comes from an IncidentLine.
#pragma once

#include <array>
#include <vector>

#include "solver/outputs/dft_box.h"
#include "solver/engine/fields.h"
#include "solver/engine/grid.h"
#include "solver/sources/incident_line.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

/// The placement rules of the plane-wave box on a grid (inside the domain, clear of absorbers, one
/// cell across at least, polarization across the direction, a mirror plane's symmetry kept);
/// throws RunError naming the scene location. Needs no fields: `check` runs it before any run.
void check_plane_wave_box(const PlaneWaveSpec& spec, const Scene& scene, const Grid& g);

class PlaneWaveSource {
 public:
  /// Throws RunError when the box is not inside the domain clear of absorbers, or its surface
  /// touches anything but the background material.
  PlaneWaveSource(const PlaneWaveSpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L,
                  const CurlCoefficients& curls, const ECoefficients& ec, const MaterialIndex& mi, double dt);
  /// After the H update (uses E_inc at the integer time), then advances the line's H.
  void apply_h(Fields& f);
  /// After the E update (uses H_inc at the half step), then advances the line's E.
  void apply_e(Fields& f, double t_h);
  /// Incident E1 at the box centre (an integer time): for the incident spectrum.
  double reference_e() const { return line_.e_at(reference_node_); }
  double end_time() const { return line_.end_time(); }
  /// The incident line's fields, for checkpoints.
  void add_state(StateArrays& s, const std::string& prefix) { line_.add_state(s, prefix); }

 private:
  struct Correction {
    int component;          // field updated, 0..5
    std::ptrdiff_t offset;  // its flat index
    int line_index;         // 3D index along the axis where the incident value is read
    double coefficient;     // update coefficient of the neighbour times the incident direction part
  };
  IncidentLine line_;
  std::vector<Correction> e_fix_, h_fix_;
  int reference_node_ = 0;
};

}  // namespace yeegap::solver
