// Metals of the built-in library: the Lorentz-Drude fits of Rakic, Djurisic, Elazar, Majewski,
// Appl. Opt. 37, 5271 (1998), and the critical-points gold model of Etchegoin, Le Ru, Meyer,
// J. Chem. Phys. 125, 164705 (2006). Rakic's tables use exp(+j omega t); the model below is the
// complex conjugate, i.e. the same numbers in yeegap's exp(-i omega t) form (physics.md 0).
#include <cmath>
#include <initializer_list>

#include "base/constants.h"
#include "base/units.h"
#include "materials/library.h"

namespace yeegap::materials::detail {

namespace {

constexpr const char* rakic_source =
    "A. D. Rakic, A. B. Djurisic, J. M. Elazar, M. L. Majewski, Appl. Opt. 37, 5271 (1998), "
    "Lorentz-Drude model";

struct RakicOscillator {
  double f;         // oscillator strength f_j
  double gamma_eV;  // Gamma_j
  double omega_eV;  // omega_j
};

// eps = 1 - f0 wp^2/(w (w + i G0)) + sum_j f_j wp^2/(w_j^2 - w^2 - i w G_j)   (physics.md 2.1)
// maps exactly onto one Drude pole (plasma frequency sqrt(f0) wp) and Lorentz poles with
// delta_eps_j = f_j wp^2 / w_j^2; eps_inf = 1 in all of Rakic's fits.
PoleSet rakic_lorentz_drude(double omega_p_eV, double f0, double gamma0_eV,
                            std::initializer_list<RakicOscillator> oscillators) {
  PoleSet p;
  p.eps_inf = 1.0;
  p.drude.push_back({units::eV_to_omega(std::sqrt(f0) * omega_p_eV), units::eV_to_omega(gamma0_eV)});
  for (const RakicOscillator& o : oscillators) {
    const double ratio = omega_p_eV / o.omega_eV;
    p.lorentz.push_back({o.f * ratio * ratio, units::eV_to_omega(o.omega_eV), units::eV_to_omega(o.gamma_eV)});
  }
  return p;
}

// Wavelength in metres of a photon energy in eV, for the fit ranges that papers quote in eV.
double wavelength_of(double energy_eV) { return units::eV_to_wavelength_nm(energy_eV) * units::nm; }

LibraryEntry rakic_entry(const char* name, const char* metal, double e_min_eV, double e_max_eV,
                         PoleSet poles, const char* notes) {
  LibraryEntry e;
  e.name = name;
  e.summary = std::string(metal) + ", Lorentz-Drude fit to film data (Rakic 1998)";
  e.source = rakic_source;
  e.wavelength_min = wavelength_of(e_max_eV);
  e.wavelength_max = wavelength_of(e_min_eV);
  e.poles = std::move(poles);
  e.notes = notes;
  return e;
}

constexpr const char* checked_four =
    "Parameters as in the yeegap physics notes (section 2.2): Rakic's table as transcribed in "
    "S. J. Orfanidis's textbook code, cross-checked against several independent public code "
    "transcriptions; known transcription typos (Ag f0 = 0.84 and f3 = 0.111, Al omega3 = 1.188) "
    "avoided. Fit range about 0.1-5 eV (Al: 0.1-20 eV) from memory, not checked against the paper. "
    "The Lorentz-Drude fit is known to be poor for Au in the visible; prefer Au_critical_points there.";

LibraryEntry etchegoin_gold() {
  // physics.md 2.3: eps(lambda) = eps_inf - 1/(lambda_p^2 (1/lambda^2 + i/(gamma_p lambda)))
  //   + sum_i (A_i/lambda_i)[e^{i phi_i}/(1/lambda_i - 1/lambda - i/gamma_i) + e^{-i phi_i}/(1/lambda_i + 1/lambda + i/gamma_i)]
  // Multiplying each 1/length by 2 pi c turns it into an angular frequency, so the Drude part has
  // omega_p = 2 pi c/lambda_p, gamma = 2 pi c/gamma_p, and each term is a CriticalPoint with
  // Omega = 2 pi c/lambda_i, Gamma = 2 pi c/gamma_i, the same A and phi: an exact mapping.
  const double quarter_turn = constants::pi / 4.0;
  LibraryEntry e;
  e.name = "Au_critical_points";
  e.summary = "gold, Drude plus two critical points fitted to Johnson & Christy data";
  e.source = "P. G. Etchegoin, E. C. Le Ru, M. Meyer, J. Chem. Phys. 125, 164705 (2006); "
             "erratum J. Chem. Phys. 127, 189901 (2007)";
  e.wavelength_min = 400 * units::nm;
  e.wavelength_max = 1000 * units::nm;
  e.poles.eps_inf = 1.54;
  e.poles.drude.push_back({units::wavelength_to_omega(143 * units::nm), units::wavelength_to_omega(14500 * units::nm)});
  e.poles.critical_points.push_back({1.27, -quarter_turn, units::wavelength_to_omega(470 * units::nm),
                                     units::wavelength_to_omega(1900 * units::nm)});
  e.poles.critical_points.push_back({1.10, -quarter_turn, units::wavelength_to_omega(325 * units::nm),
                                     units::wavelength_to_omega(1060 * units::nm)});
  e.notes =
      "Parameters as in the yeegap physics notes (section 2.3): every value except lambda_p = 143 nm "
      "read in two public transcriptions of Le Ru & Etchegoin, Principles of SERS (Elsevier 2009), "
      "Eqs. E.1-E.2, whose Drude part eps_inf (1 - 1/(lambda_p'^2 ...)) with lambda_p' = 177.5 nm equals "
      "lambda_p = 177.5/sqrt(1.54) = 143.0 nm. Each critical point is a pair of poles with complex "
      "residues; the solver steps it with the second-order ADE of discrete_permittivity.h. "
      "Range 400-1000 nm is where the check table was computed; the paper's own fit range is wider "
      "on the ultraviolet side but is not recorded here. The individual critical-point terms have "
      "Im < 0 below about 1.5 eV; the Drude term keeps the sum passive at every frequency.";
  return e;
}

}  // namespace

std::vector<LibraryEntry> metal_entries() {
  std::vector<LibraryEntry> m;
  // Rakic Table 2 (Lorentz-Drude), eV: omega_p, f0, Gamma0, then (f_j, Gamma_j, omega_j).
  m.push_back(rakic_entry("Ag", "silver", 0.1, 5.0,
                          rakic_lorentz_drude(9.01, 0.845, 0.048,
                                              {{0.065, 3.886, 0.816},
                                               {0.124, 0.452, 4.481},
                                               {0.011, 0.065, 8.185},
                                               {0.840, 0.916, 9.083},
                                               {5.646, 2.419, 20.29}}),
                          checked_four));
  m.push_back(rakic_entry("Au", "gold", 0.1, 5.0,
                          rakic_lorentz_drude(9.03, 0.760, 0.053,
                                              {{0.024, 0.241, 0.415},
                                               {0.010, 0.345, 0.830},
                                               {0.071, 0.870, 2.969},
                                               {0.601, 2.494, 4.304},
                                               {4.384, 2.214, 13.32}}),
                          checked_four));
  m.push_back(rakic_entry("Cu", "copper", 0.1, 5.0,
                          rakic_lorentz_drude(10.83, 0.575, 0.030,
                                              {{0.061, 0.378, 0.291},
                                               {0.104, 1.056, 2.957},
                                               {0.723, 3.213, 5.300},
                                               {0.638, 4.305, 11.18}}),
                          checked_four));
  m.push_back(rakic_entry("Al", "aluminium", 0.1, 20.0,
                          rakic_lorentz_drude(14.98, 0.523, 0.047,
                                              {{0.227, 0.333, 0.162},
                                               {0.050, 0.312, 1.544},
                                               {0.166, 1.351, 1.808},
                                               {0.030, 3.382, 3.473}}),
                          checked_four));
  m.push_back(rakic_entry("Cr", "chromium", 0.1, 5.0,
                          rakic_lorentz_drude(10.75, 0.168, 0.047,
                                              {{0.151, 3.175, 0.121},
                                               {0.150, 1.305, 0.543},
                                               {1.149, 2.676, 1.970},
                                               {0.825, 1.335, 8.775}}),
                          "Read in two independent public transcriptions of Rakic's Table 2 (a "
                          "refractive-index database script and a published MATLAB function by B. Ung, "
                          "2012); they agree. Fit range 0.1-5 eV from memory."));
  m.push_back(rakic_entry("Ti", "titanium", 0.062, 2.64,
                          rakic_lorentz_drude(7.29, 0.148, 0.082,
                                              {{0.899, 2.276, 0.777},
                                               {0.393, 2.518, 1.545},
                                               {0.187, 1.663, 2.509},
                                               {0.001, 1.762, 19.43}}),
                          "Read in two public code transcriptions of Rakic's Table 2 (one a Julia "
                          "package); they agree. A third (B. Ung's MATLAB function) has omega4 = 1.943 "
                          "eV, taken here as a typo; the term is weak (f4 = 0.001), so the choice moves "
                          "eps by at most 0.017 over the range. Range 470 nm-20 um as quoted by one "
                          "transcription, not checked against the paper."));
  m.push_back(rakic_entry("Pt", "platinum", 0.1, 5.0,
                          rakic_lorentz_drude(9.59, 0.333, 0.080,
                                              {{0.191, 0.517, 0.780},
                                               {0.659, 1.838, 1.314},
                                               {0.547, 3.668, 3.141},
                                               {3.576, 8.517, 9.249}}),
                          "Read in two independent public transcriptions of Rakic's Table 2 (a "
                          "refractive-index database script and B. Ung's MATLAB function); they agree. "
                          "Fit range 0.1-5 eV as the database script uses it."));
  m.push_back(rakic_entry("Pd", "palladium", 0.1, 5.0,
                          rakic_lorentz_drude(9.72, 0.330, 0.008,
                                              {{0.649, 2.950, 0.336},
                                               {0.121, 0.555, 0.501},
                                               {0.638, 4.621, 1.659},
                                               {0.453, 3.236, 5.715}}),
                          "Read in one public transcription of Rakic's Table 2 (B. Ung's MATLAB "
                          "function, 2012); omega_p = 9.72 eV and f0 = 0.330 also match a separate "
                          "transcription of the paper's Brendel-Bormann table. Not cross-checked "
                          "further. Fit range 0.1-5 eV from memory."));
  m.push_back(etchegoin_gold());
  return m;
}

}  // namespace yeegap::materials::detail
