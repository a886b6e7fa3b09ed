// Quadrature over directions: Gauss-Legendre in cos(theta) times equal steps in phi, over the whole
// sphere or over a cone about an axis (a collection aperture). With n nodes in cos(theta) and more
// than 2n steps in phi it integrates every spherical harmonic of degree below 2n exactly
// (Press et al., Numerical Recipes, 3rd ed., 2007, sec. 4.6; Abramowitz & Stegun 1964, 25.4.29).
#pragma once

#include <vector>

#include "base/vec3.h"

namespace yeegap::solver {

/// Nodes x_i in (-1, 1) and weights w_i (summing to 2) of the n-point Gauss-Legendre rule.
void gauss_legendre(int n, std::vector<double>& x, std::vector<double>& w);

struct DirectionSet {
  std::vector<Vec3> directions;   // unit vectors
  std::vector<double> weights;    // solid angle each stands for, sr (they sum to the set's solid angle)
};

/// The whole sphere: `n_theta` Gauss-Legendre nodes in cos(theta) by `n_phi` equal phi steps.
DirectionSet sphere_directions(int n_theta, int n_phi);

/// The cone of half angle `half_angle` (rad, in (0, pi]) about the unit vector `axis`, with the
/// same kind of rule in the cone's own polar angle.
DirectionSet cone_directions(const Vec3& axis, double half_angle, int n_theta, int n_phi);

}  // namespace yeegap::solver
