// The `sensor` output's group in the results file (layout in docs/results_file.md): the two reflectance
// curves and the dip and sensor figures (docs/sensor.md), angles both in rad and in degrees.
#pragma once

#include "io/h5.h"
#include "solver/results.h"

namespace yeegap::io {

void write_sensor(const h5::Group& outputs, const solver::SensorResult& s);

}  // namespace yeegap::io
