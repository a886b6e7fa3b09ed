// Registry-wide claims every library entry must satisfy, plus lookup and the exactness of the
// Rakic and Sellmeier mappings onto poles.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <complex>
#include <regex>
#include <set>

#include "base/units.h"
#include "materials/library.h"
#include "materials/sellmeier.h"

namespace yeegap::materials {
namespace {

using cplx = std::complex<double>;

double largest_pole_frequency(const PoleSet& p) {
  double w = 0;
  for (const DrudePole& d : p.drude) w = std::max({w, d.omega_p, d.gamma});
  for (const LorentzPole& l : p.lorentz) w = std::max({w, l.omega_0, l.gamma});
  for (const CriticalPoint& c : p.critical_points) w = std::max({w, c.omega, c.gamma});
  return w;
}

TEST(Library, HasTheMetalsAndDielectricsTheProjectPromises) {
  for (const char* name : {"Au", "Ag", "Al", "Cu", "Cr", "Ti", "Pt", "Pd", "Au_critical_points", "fused_silica",
                           "N-BK7", "water", "TiO2", "Si3N4", "PMMA"})
    EXPECT_NE(find_material(name), nullptr) << name;
}

TEST(Library, EveryEntryIsDocumentedWithASourceAndARange) {
  const std::regex year(R"(\((19|20)\d\d\))");
  std::set<std::string> lowered;
  for (const LibraryEntry& e : library()) {
    EXPECT_FALSE(e.name.empty());
    EXPECT_FALSE(e.summary.empty()) << e.name;
    // A paper is cited with its year; a manufacturer's data sheet has none to give.
    EXPECT_TRUE(std::regex_search(e.source, year) || e.source.find("data sheet") != std::string::npos)
        << e.name << ": source needs a year: " << e.source;
    EXPECT_FALSE(e.notes.empty()) << e.name;
    EXPECT_GT(e.wavelength_min, 10 * units::nm) << e.name;
    EXPECT_GT(e.wavelength_max, e.wavelength_min) << e.name;
    std::string low = e.name;
    std::transform(low.begin(), low.end(), low.begin(), [](unsigned char c) { return std::tolower(c); });
    EXPECT_TRUE(lowered.insert(low).second) << "duplicate name " << e.name;
    // Every parameter set was read in a source (see each entry's notes); none is recalled.
    EXPECT_FALSE(e.from_memory) << e.name;
  }
}

TEST(Library, EveryEntryIsPassiveOverItsRange) {
  // exp(-i omega t): a passive medium has Im eps >= 0 (physics.md 0). 400 log-spaced wavelengths.
  for (const LibraryEntry& e : library()) {
    for (int i = 0; i <= 400; ++i) {
      const double lambda = e.wavelength_min * std::pow(e.wavelength_max / e.wavelength_min, i / 400.0);
      const cplx eps = permittivity(e.poles, units::wavelength_to_omega(lambda));
      EXPECT_GE(eps.imag(), -1e-12 * std::abs(eps)) << e.name << " at " << lambda * 1e9 << " nm";
    }
  }
}

TEST(Library, EveryEntryHasStablePassivePoleParameters) {
  // What the ADE needs to be stable and each Drude/Lorentz term to be passive: eps_inf >= 1, all
  // strengths and dampings >= 0, resonances > 0 (Taflove & Hagness ch. 9; physics.md 3.2, 3.4).
  for (const LibraryEntry& e : library()) {
    EXPECT_GE(e.poles.eps_inf, 1.0) << e.name;
    EXPECT_GE(e.poles.conductivity, 0.0) << e.name;
    for (const DrudePole& d : e.poles.drude) {
      EXPECT_GT(d.omega_p, 0.0) << e.name;
      EXPECT_GE(d.gamma, 0.0) << e.name;
    }
    for (const LorentzPole& l : e.poles.lorentz) {
      EXPECT_GE(l.delta_eps, 0.0) << e.name;
      EXPECT_GT(l.omega_0, 0.0) << e.name;
      EXPECT_GE(l.gamma, 0.0) << e.name;
    }
    for (const CriticalPoint& c : e.poles.critical_points) {
      EXPECT_GT(c.omega, 0.0) << e.name;
      EXPECT_GT(c.gamma, 0.0) << e.name;
    }
  }
}

TEST(Library, EveryEntryTendsToEpsInfAtHighFrequency) {
  // Every pole term falls off at least as 1/omega, so eps -> eps_inf. At 1e6 times the largest pole
  // frequency the remainder is below about 1e-5 for these strengths; 1e-4 leaves room.
  for (const LibraryEntry& e : library()) {
    const double omega = 1e6 * std::max(largest_pole_frequency(e.poles), units::wavelength_to_omega(e.wavelength_min));
    EXPECT_LT(std::abs(permittivity(e.poles, omega) - e.poles.eps_inf), 1e-4) << e.name;
  }
}

TEST(Library, FindsNamesIgnoringCaseAndSuggestsTheNearest) {
  ASSERT_NE(find_material("au"), nullptr);
  EXPECT_EQ(find_material("au")->name, "Au");
  EXPECT_EQ(find_material("n-bk7")->name, "N-BK7");
  EXPECT_EQ(find_material("unobtainium"), nullptr);
  EXPECT_EQ(nearest_material_name("N-BK8"), "N-BK7");
  EXPECT_EQ(nearest_material_name("fused-silica"), "fused_silica");
  EXPECT_EQ(material_names().size(), library().size());
  EXPECT_EQ(material_names().front(), library().front().name);
}

TEST(Library, RakicEntriesEqualTheRakicFormulaEvaluatedInElectronvolts) {
  // Rakic et al., Appl. Opt. 37, 5271 (1998), Eq. for the LD model (physics.md 2.1), evaluated here in
  // eV with the table values as transcribed in the entries' notes. Checks the eV -> rad/s mapping and
  // delta_eps = f wp^2/w_j^2 for all eight metals, to rounding.
  struct Osc {
    double f, g, w;
  };
  struct Metal {
    const char* name;
    double wp, f0, g0;
    std::vector<Osc> osc;
  };
  const Metal metals[] = {
      {"Ag", 9.01, 0.845, 0.048, {{0.065, 3.886, 0.816}, {0.124, 0.452, 4.481}, {0.011, 0.065, 8.185}, {0.840, 0.916, 9.083}, {5.646, 2.419, 20.29}}},
      {"Au", 9.03, 0.760, 0.053, {{0.024, 0.241, 0.415}, {0.010, 0.345, 0.830}, {0.071, 0.870, 2.969}, {0.601, 2.494, 4.304}, {4.384, 2.214, 13.32}}},
      {"Cu", 10.83, 0.575, 0.030, {{0.061, 0.378, 0.291}, {0.104, 1.056, 2.957}, {0.723, 3.213, 5.300}, {0.638, 4.305, 11.18}}},
      {"Al", 14.98, 0.523, 0.047, {{0.227, 0.333, 0.162}, {0.050, 0.312, 1.544}, {0.166, 1.351, 1.808}, {0.030, 3.382, 3.473}}},
      {"Cr", 10.75, 0.168, 0.047, {{0.151, 3.175, 0.121}, {0.150, 1.305, 0.543}, {1.149, 2.676, 1.970}, {0.825, 1.335, 8.775}}},
      {"Ti", 7.29, 0.148, 0.082, {{0.899, 2.276, 0.777}, {0.393, 2.518, 1.545}, {0.187, 1.663, 2.509}, {0.001, 1.762, 19.43}}},
      {"Pt", 9.59, 0.333, 0.080, {{0.191, 0.517, 0.780}, {0.659, 1.838, 1.314}, {0.547, 3.668, 3.141}, {3.576, 8.517, 9.249}}},
      {"Pd", 9.72, 0.330, 0.008, {{0.649, 2.950, 0.336}, {0.121, 0.555, 0.501}, {0.638, 4.621, 1.659}, {0.453, 3.236, 5.715}}},
  };
  const cplx I(0, 1);
  for (const Metal& m : metals) {
    for (double e_eV : {0.3, 1.0, 1.9, 2.6, 3.5, 4.8}) {
      cplx expected = 1.0 - m.f0 * m.wp * m.wp / (e_eV * (e_eV + I * m.g0));
      for (const Osc& o : m.osc) expected += o.f * m.wp * m.wp / (o.w * o.w - e_eV * e_eV - I * e_eV * o.g);
      const cplx got = permittivity(find_material(m.name)->poles, units::eV_to_omega(e_eV));
      EXPECT_LT(std::abs(got - expected), 1e-10 * std::abs(expected)) << m.name << " at " << e_eV << " eV";
    }
  }
}

TEST(Sellmeier, LorentzPolesReproduceTheFormulaExactly) {
  // B l^2/(l^2 - C) = B w_j^2/(w_j^2 - w^2) with w_j = 2 pi c/sqrt(C): an identity, so agreement to rounding.
  const std::vector<SellmeierTerm> terms = {{1.03961212, 0.00600069867}, {0.231792344, 0.0200179144}, {1.01046945, 103.560653}};
  const PoleSet p = sellmeier_poles(1.0, terms);
  for (double lambda_nm = 300; lambda_nm <= 2500; lambda_nm += 100) {
    const double lambda = lambda_nm * units::nm;
    const double n2 = sellmeier_index_squared(1.0, terms, lambda);
    const cplx eps = permittivity(p, units::wavelength_to_omega(lambda));
    EXPECT_NEAR(eps.real(), n2, 1e-12 * n2) << lambda_nm;
    EXPECT_EQ(eps.imag(), 0.0);
  }
  // DeVore's form a + b/(l^2 - C) (TiO2 entry) is the same with eps_inf = a - b/C and B = b/C.
  const double lambda = 633 * units::nm, l2 = 0.633 * 0.633;
  EXPECT_NEAR(permittivity(find_material("TiO2")->poles, units::wavelength_to_omega(lambda)).real(),
              5.913 + 0.2441 / (l2 - 0.0803), 1e-12);
}

}  // namespace
}  // namespace yeegap::materials
