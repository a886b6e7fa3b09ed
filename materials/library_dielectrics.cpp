// Dielectrics of the built-in library: published Sellmeier fits, mapped exactly onto lossless
// Lorentz poles by sellmeier_poles(). Being lossless, these are transparent only inside their
// range; outside it a pole can sit in the band and eps is meaningless there.
#include "materials/library.h"
#include "materials/sellmeier.h"

#include "base/units.h"

namespace yeegap::materials::detail {

namespace {

LibraryEntry dielectric(const char* name, const char* summary, const char* source, double lambda_min_um,
                        double lambda_max_um, PoleSet poles, const char* notes) {
  LibraryEntry e;
  e.name = name;
  e.summary = summary;
  e.source = source;
  e.wavelength_min = lambda_min_um * units::um;
  e.wavelength_max = lambda_max_um * units::um;
  e.poles = std::move(poles);
  e.notes = notes;
  return e;
}

}  // namespace

std::vector<LibraryEntry> dielectric_entries() {
  std::vector<LibraryEntry> d;
  d.push_back(dielectric(
      "fused_silica", "fused silica (SiO2 glass), three-term Sellmeier fit at 20 C",
      "I. H. Malitson, J. Opt. Soc. Am. 55, 1205 (1965)", 0.21, 3.71,
      sellmeier_poles(1.0, {{0.6961663, 0.0684043 * 0.0684043},
                            {0.4079426, 0.1162414 * 0.1162414},
                            {0.8974794, 9.896161 * 9.896161}}),
      "Coefficients read in a public refractive-index database page citing Malitson 1965 and in "
      "several public code transcriptions; they agree. Index relative to air, as published; the "
      "infrared term (9.90 um) makes the static permittivity 3.0, far from the optical 2.1."));
  d.push_back(dielectric(
      "N-BK7", "borosilicate crown glass N-BK7, Schott three-term Sellmeier fit",
      "SCHOTT AG, optical glass data sheet N-BK7 (Sellmeier coefficients)", 0.3, 2.5,
      sellmeier_poles(1.0, {{1.03961212, 0.00600069867}, {0.231792344, 0.0200179144}, {1.01046945, 103.560653}}),
      "Coefficients read in a public refractive-index database page citing the Schott data sheets "
      "and in public code transcriptions; they agree. Schott gives indices relative to air at the "
      "data-sheet temperature; the absolute index is larger by about 3e-4. Wavelength treated as vacuum."));
  d.push_back(dielectric(
      "water", "liquid water at 20 C, four-term Sellmeier fit, absolute index",
      "M. Daimon, A. Masumura, Appl. Opt. 46, 3811 (2007)", 0.182, 1.129,
      sellmeier_poles(1.0, {{5.684027565e-1, 5.101829712e-3},
                            {1.726177391e-1, 1.821153936e-2},
                            {2.086189578e-2, 2.620722293e-2},
                            {1.130748688e-1, 1.069792721e1}}),
      "20 C coefficients as transcribed on a public refractive-index database page citing Daimon & "
      "Masumura 2007 (HPLC distilled water, index relative to vacuum). Absorption is ignored: water is "
      "transparent only in this range, and its infrared bands are not in the model."));
  const double devore_c = 0.0803;          // um^2
  const double devore_b = 0.2441 / devore_c;  // 0.2441/(l^2 - C) = B [l^2/(l^2 - C) - 1], B = 0.2441/C
  d.push_back(dielectric(
      "TiO2", "rutile TiO2, ordinary ray, one-term Sellmeier fit",
      "J. R. DeVore, J. Opt. Soc. Am. 41, 416 (1951)", 0.43, 1.53,
      sellmeier_poles(5.913 - devore_b, {{devore_b, devore_c}}),
      "DeVore's n_o^2 = 5.913 + 0.2441/(lambda^2 - 0.0803) rewritten exactly as eps_inf = 5.913 - "
      "0.2441/0.0803 = 2.873 plus one Lorentz pole of strength 0.2441/0.0803 at 283 nm. Formula read in "
      "several public code transcriptions. Rutile is birefringent (n_e is about 0.29 higher); this entry "
      "is the ordinary index only, an isotropic stand-in. Thin-film TiO2 (anatase, amorphous) is lower."));
  d.push_back(dielectric(
      "Si3N4", "stoichiometric LPCVD silicon nitride, two-term Sellmeier fit",
      "K. Luke, Y. Okawachi, M. R. E. Lamont, A. L. Gaeta, M. Lipson, Opt. Lett. 40, 4823 (2015)", 0.310, 5.504,
      sellmeier_poles(1.0, {{3.0249, 0.1353406 * 0.1353406}, {40314.0, 1239.842 * 1239.842}}),
      "Coefficients read in several public code transcriptions citing Luke et al. 2015; they agree. The "
      "second term (B = 40314 at 1.24 mm) acts as a -0.026 lambda^2 correction in the optical range but "
      "gives a static permittivity near 4e4 and a resonance at 1.5e12 rad/s: a pulse with a DC "
      "component will ring at that frequency, so sources should have no DC content."));
  d.push_back(dielectric(
      "PMMA", "poly(methyl methacrylate), one-term Sellmeier fit",
      "N. Sultanova, S. Kasarova, I. Nikolov, Acta Phys. Pol. A 116, 585 (2009)", 0.4368, 1.052,
      sellmeier_poles(1.0, {{1.1819, 0.011313}}),
      "Coefficients (B = 1.1819, C = 0.011313 um^2) read in public code transcriptions of a "
      "refractive-index database entry citing Sultanova et al. 2009; the formula reproduces the "
      "paper's measured indices (436.8-1052 nm, +-0.001) to within 0.001."));
  return d;
}

}  // namespace yeegap::materials::detail
