// A point electric dipole: its current moment I l(t) = p0 u dp/dt enters Ampere's law as a current
// density J = I l / V at the E locations around the point, spread with trilinear weights so the
// total moment is exact wherever the point sits (E^{n+1} = ... - cb J^{n+1/2}). Next to a metal or
// mirror face the share of a location beyond the face goes to its image inside (dipole_source.cpp).
#pragma once

#include <array>
#include <vector>

#include "solver/engine/fields.h"
#include "solver/engine/grid.h"
#include "solver/sources/waveform.h"
#include "solver/engine/yee_kernels.h"

namespace yeegap::solver {

class DipoleSource {
 public:
  /// `edges` are the domain's faces (x-, x+, y-, y+, z-, z+): metal and mirror faces fold the
  /// trilinear share of a location beyond them onto its image.
  DipoleSource(const DipoleSpec& spec, const Grid& g, const BlockLayout& L, const std::array<EdgeKind, 6>& edges);
  /// Adds -cb J at time t (the half step n+1/2 of the E update that is running).
  void apply_e(Fields& f, const ECoefficients& ec, const MaterialIndex& mi, double t) const;
  /// Current moment I l(t) along the dipole direction, A m.
  double current_moment(double t) const { return moment_ * time_.current(t); }
  const SourceTime& time() const { return time_; }

 private:
  struct Tap {
    int component;          // 0..2 for Ex, Ey, Ez
    std::ptrdiff_t offset;  // flat index
    double weight;          // direction component * trilinear weight / dual volume, 1/m^3
  };
  SourceTime time_;
  double moment_;
  std::vector<Tap> taps_;
};

}  // namespace yeegap::solver
