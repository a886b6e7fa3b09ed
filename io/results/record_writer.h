// Writes one output's record (solver/outputs/record.h) as a group under /outputs: the record's kind
// and attributes on the group, each quantity a dataset with its `units` and `description`. Knows
// no kind of output by name.
#pragma once

#include "io/h5.h"
#include "solver/outputs/record.h"

namespace yeegap::io {

/// Throws std::invalid_argument when the name cannot be a group name or is taken, or when a
/// quantity's values do not fill its shape (our bug, reported with the output's name).
void write_record(const h5::Group& outputs, const solver::Record& record);

/// The same check the writer makes on a name before it creates the group.
void check_output_name(const h5::Group& outputs, const std::string& name);

}  // namespace yeegap::io
