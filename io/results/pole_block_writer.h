// Writes a PoleSet back as scene text: a `materials:` block with one material and its `poles`
// (docs/scene.md), spectral values in eV. Used to print the result of a pole fit so that it can be
// pasted into a scene as is; reading the text back gives the same model to the printed precision.
#pragma once

#include <string>

#include "materials/pole_set.h"

namespace yeegap::io {

/// Significant digits of every number written: the read-back permittivity then agrees with the
/// original to about 1e-8 relative, far below any fit error.
inline constexpr int pole_text_digits = 9;

/// "materials:\n  NAME:\n    poles:\n      eps_inf: ...\n" with drude, lorentz and critical_points
/// lists as present, and `conductivity` beside `poles` when it is not zero. `name` must be a valid
/// material name (a letter, then letters, digits, '_' or '-').
std::string material_block_text(const std::string& name, const materials::PoleSet& poles);

}  // namespace yeegap::io
