// Test helper: the domain of a planar stack run as a one-dimensional Bloch cell along z (one
// lateral cell, Bloch phase across it): `below` of the incident medium from the entry side, the
// films from z = 0, `above` of the exit medium, `cpml` cells at each end, subcell averaging on
// so the film faces see the mean of their two media. Materials and bodies are the caller's.
#pragma once

#include <utility>
#include <vector>

#include "solver/scene.h"

namespace yeegap::solver::testing {

inline Scene film_stack_domain(double step, double below, double above, int absorber = 20) {
  Scene s;
  s.file = "test";
  s.domain.step = {step, step, step};
  s.domain.size = {step, step, below + above + 2 * absorber * step};
  s.domain.center = {0, 0, 0.5 * (above - below)};
  s.domain.edges = {EdgeKind::periodic, EdgeKind::periodic, EdgeKind::periodic,
                    EdgeKind::periodic, EdgeKind::cpml, EdgeKind::cpml};
  s.domain.bloch = {true, true, false};
  s.domain.cpml.cells = absorber;
  s.domain.gap_cells = 0;
  s.domain.averaging = true;
  return s;
}

/// A p-polarized plane wave scanned over `angles` (rad) at one angular frequency: one R, T, A row
/// per angle, each run with a pulse narrowed around omega (the program picks its band).
inline BlochWaveSpec p_angle_scan(double omega, std::vector<double> angles) {
  BlochWaveSpec w;
  w.p_polarized = true;
  w.reference_omega = omega;
  w.omegas = {omega};
  w.single_frequency = true;
  w.scan_angles = std::move(angles);
  w.angle = w.scan_angles.front();
  return w;
}

}  // namespace yeegap::solver::testing
