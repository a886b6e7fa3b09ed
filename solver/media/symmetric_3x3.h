// Eigenvalues of a real symmetric 3x3 matrix, for the positivity and step bounds of the averaged
// tensors (subcell_cross_terms.h, subcell_dispersive_cross_terms.h).
#pragma once

#include <array>

namespace yeegap::solver {

using Matrix3 = std::array<std::array<double, 3>, 3>;

/// Ascending eigenvalues (the trigonometric closed form; the matrix must be symmetric).
std::array<double, 3> symmetric_eigenvalues(const Matrix3& a);

}  // namespace yeegap::solver
