// Bloch-periodic edges (physics.md 3.7): F(x + L) = F(x) exp(i k L) in the exp(-i omega t)
// convention, so a wave exp(i (k x - omega t)) with k > 0 travels towards +x. The complex field
// runs as two real field sets, its real and imaginary parts, each advanced by the ordinary real
// kernels, CPML, poles and recorders; they meet only here, where the periodic copy is rotated:
//   halo_re = cos(phi) re - sin(phi) im,   halo_im = sin(phi) re + cos(phi) im.
#pragma once

#include "solver/engine/fields.h"
#include "solver/engine/grid.h"

namespace yeegap::solver {

/// Whether axis a is a Bloch axis with a non-zero wavevector (then its copies need both parts).
bool carries_bloch_phase(const DomainSpec& d, int a);
/// Whether any axis does: the run then needs an imaginary part.
bool needs_imaginary_part(const DomainSpec& d);

/// Phase (rad) of the copy across axis a. On an axis of several cells it is k L. On an axis of one
/// cell (a laterally uniform stack) the cell width stands for nothing physical, so the phase is
/// chosen to make the scheme's own lateral wavenumber 2 sin(phi/2)/h equal k exactly:
/// phi = 2 asin(k h / 2) (Taflove & Hagness 2005, ch. 4: the Yee difference of exp(i k x) is
/// i (2/h) sin(k h/2) exp(i k x)). Throws RunError when k h / 2 >= 1.
double bloch_phase(const Grid& g, const DomainSpec& d, int a);

/// Largest stable time step (s) with the Bloch phases: the Yee dispersion relation
/// sin^2(omega dt/2) / (c dt)^2 = sum_a sin^2(k_a h_a / 2) / h_a^2 stays real for every wave the
/// grid carries when (c dt)^2 [sum over free axes 1/h_a^2 + sum over one-cell Bloch axes
/// sin^2(phi_a/2)/h_a^2] <= 1 (Taflove & Hagness 2005, sec. 4.7; free axes use the smallest cell).
double bloch_courant_limit(const Grid& g, const DomainSpec& d);

/// Copies the periodic halos of the Bloch axes with their phase: E (electric) into index n from
/// index 0 with exp(+i phi), H into index -1 from n-1 with exp(-i phi). Plain periodic axes are
/// left to each part's own copy.
void fill_bloch_halos(Fields& re, Fields& im, const Grid& g, const DomainSpec& d, bool electric);

}  // namespace yeegap::solver
