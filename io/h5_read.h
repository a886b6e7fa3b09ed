// Reading back small HDF5 datasets written by io/h5.h (the sweep merge reads each point's figures
// and scene text): whole 1-d or scalar datasets of doubles, int64 and fixed-length ASCII strings.
// Failures throw std::runtime_error naming the file and the object, as the writer does.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "io/h5.h"

namespace yeegap::io::h5 {

/// Does `path` ("/sweep/figure_values") name an object in the file? Checks each link on the way.
bool exists(const File& file, const std::string& path);
std::vector<double> read_doubles(const File& file, const std::string& path);
std::vector<std::int64_t> read_int64s(const File& file, const std::string& path);
/// A 1-d dataset of fixed-length strings, or a scalar one as a list of one; NUL padding removed.
std::vector<std::string> read_strings(const File& file, const std::string& path);
/// A scalar fixed-length string dataset (the scene text).
std::string read_string(const File& file, const std::string& path);

}  // namespace yeegap::io::h5
