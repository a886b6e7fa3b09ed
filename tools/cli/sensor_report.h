// The sensor output's headline for `yeegap run`: one human paragraph on stderr and one JSON object
// (figures in degrees, as sensor papers quote them; definitions in docs/sensor.md).
#pragma once

#include <string>

#include "solver/results.h"

namespace yeegap::cli {

/// Prints the figures to stderr and returns them as an encoded JSON object.
std::string report_sensor(const solver::SensorResult& s);

}  // namespace yeegap::cli
