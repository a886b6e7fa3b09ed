// A table of measured optical constants (wavelength, n, k) read from a CSV file, as input to the
// pole fit (fit.h). The header names the columns and the wavelength unit, e.g.
//   wavelength_nm,n,k        or  wavelength_um,n,k   (also wavelength_m)
// Lines starting with '#' and blank lines are ignored. Mistakes throw SceneError with the line,
// the column and the column name, before anything is fitted.
#pragma once

#include <complex>
#include <string>
#include <string_view>
#include <vector>

namespace yeegap::materials {

struct NkTable {
  std::string file;                // as given, for messages
  std::vector<double> wavelength;  // m, vacuum, strictly monotonic (either direction)
  std::vector<double> n;           // real index, >= 0
  std::vector<double> k;           // extinction, >= 0 (exp(-i omega t): k > 0 absorbs)
  std::vector<int> line;           // 1-based line of each row in the file

  size_t size() const { return wavelength.size(); }
  double omega(size_t i) const;                       // rad/s of row i
  std::complex<double> permittivity(size_t i) const;  // (n + i k)^2 of row i
};

/// Reads and checks a table file. `min_rows`: fewer data rows than this is an error.
NkTable read_nk_table(const std::string& path, size_t min_rows = 2);

/// The same from text already in memory; `file` is the name used in messages.
NkTable parse_nk_table(std::string_view text, const std::string& file, size_t min_rows = 2);

}  // namespace yeegap::materials
