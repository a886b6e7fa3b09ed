// Work a run takes from outside its own scene (the plane wave of a Bloch cell, whose incident field
// comes from a second, auxiliary problem): called after the bulk update, the CPML and the scene's
// own sources of each half step, before the dispersive correction and the recorders.
#pragma once

#include "solver/engine/fields.h"

namespace yeegap::solver {

class Stage {
 public:
  virtual ~Stage() = default;
  /// After the H update to n+1/2 (E is at step n).
  virtual void after_h(Fields& f) = 0;
  /// After the E update to n+1; t_h = (n + 1/2) dt is the time of the H values just used.
  virtual void after_e(Fields& f, double t_h) = 0;
};

}  // namespace yeegap::solver
