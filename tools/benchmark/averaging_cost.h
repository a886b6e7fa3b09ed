// What subcell averaging at a metal surface costs per step: a gold sphere in a periodic box of
// water, stepped staircased, with the diagonal average only, and with the whole averaged tensor
// (solver/media/subcell_dispersive_cross_terms.h), timed in the same run as rates of cell updates, so the
// figures are ratios on one machine under one load.
#pragma once

#include <cstddef>

namespace yeegap::benchmark {

struct AveragingCost {
  int cells = 0, radius_cells = 0;
  long long averaged_locations = 0;     // with the whole tensor (bulk locations joined included)
  double staircase = 0, diagonal = 0, full = 0;  // best Mcells/s of each
};

/// Times `batches` batches of `steps` steps of each treatment (after a warm-up), best rate counted.
AveragingCost measure_averaging_cost(int cells, int steps, int batches);

}  // namespace yeegap::benchmark
