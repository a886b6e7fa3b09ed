// Storage type of the field arrays: float by default (the update is memory-bound, so half the
// bytes is nearly twice the speed), double with -DYEEGAP_DOUBLE=ON. Accumulators (DFT, energy,
// flux) are always double.
#pragma once

namespace yeegap::solver {
#ifdef YEEGAP_DOUBLE
using real = double;
#else
using real = float;
#endif
}  // namespace yeegap::solver
