// Fuzzes the number-and-unit parser (io/written_units.h) that every value of a scene goes through: any text
// must split or be refused, never crash; a split value must be finite as the header promises, and so
// must every SI value made from it (an infinite frequency would pass the reader's "> 0" checks).
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "fuzz_support.h"
#include "io/written_units.h"

namespace {

using yeegap::fuzz::broken_promise;
using namespace yeegap::io;

constexpr Dimension linear_kinds[] = {Dimension::length, Dimension::time, Dimension::conductivity,
                                      Dimension::dipole_moment};

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  const auto split = split_number_unit(text);
  if (!split) return 0;
  if (!std::isfinite(split->value)) broken_promise("split_number_unit returned a value that is not finite");
  const auto kind = dimension_of_unit(split->unit);
  if (kind) dimension_name(*kind);
  for (Dimension d : linear_kinds) {
    const auto si = to_si(d, split->value, split->unit);
    if (!si) continue;
    if (kind != d) broken_promise("to_si converted a unit that dimension_of_unit puts in another kind");
    if (!std::isfinite(*si)) broken_promise("to_si made a finite number infinite");
    if (d == Dimension::length) format_length(*si);
  }
  const auto omega = spectral_to_omega(split->value, split->unit);
  if (omega && !std::isfinite(*omega)) broken_promise("spectral_to_omega made a finite number infinite");
  return 0;
}
