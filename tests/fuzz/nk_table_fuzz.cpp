// Fuzzes the n,k table reader (materials/nk_table.h) and the pole fit a `table:` material feeds it to
// (materials/fit.h). A table the reader accepts must be one the fit can take: every row at a finite,
// positive frequency, since the fit YG_CHECKs that; and the fitted poles must be finite numbers.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "fuzz_support.h"
#include "materials/fit.h"
#include "materials/nk_table.h"

namespace {

using yeegap::fuzz::broken_promise;
using namespace yeegap::materials;

bool finite_poles(const PoleSet& p) {
  bool ok = std::isfinite(p.eps_inf) && std::isfinite(p.conductivity);
  for (const DrudePole& d : p.drude) ok = ok && std::isfinite(d.omega_p) && std::isfinite(d.gamma);
  for (const LorentzPole& l : p.lorentz)
    ok = ok && std::isfinite(l.delta_eps) && std::isfinite(l.omega_0) && std::isfinite(l.gamma);
  return ok;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  yeegap::fuzz::expect_only_user_errors([&] {
    const NkTable table = parse_nk_table(text, "fuzz.csv");
    for (std::size_t i = 0; i < table.size(); ++i) {
      if (!(table.n[i] >= 0 && table.k[i] >= 0)) broken_promise("the table holds a negative or NaN n or k");
      const double omega = table.omega(i);
      if (!(omega > 0 && std::isfinite(omega))) broken_promise("the table holds a row at no finite frequency");
    }
    // The scene's default pole counts, with fewer starts and iterations than a scene's fit: the
    // checks on the samples come first, and a fuzz input should take milliseconds.
    FitOptions options;
    options.starts = 2;
    options.max_iterations = 40;
    const FitResult fit = fit_poles(table, options);
    if (!finite_poles(fit.poles)) broken_promise("the fit of an accepted table gave poles that are not finite");
  });
  return 0;
}
