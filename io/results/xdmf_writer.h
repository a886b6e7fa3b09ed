// The viewer sidecar of a results file: an XDMF 3 text file (<results>.xmf, next to the .h5) that
// describes the results file's grids and arrays so ParaView opens them without any plug-in. The
// heavy data stays in the HDF5 file; the sidecar only points into it (docs/results_file.md, "Viewing in
// ParaView", says why XDMF and which ParaView reader to use).
#pragma once

#include <string>

namespace yeegap::io {

/// Where the sidecar of `results_path` goes: the same path with the extension `.xmf`.
std::string xdmf_path(const std::string& results_path);

/// The sidecar's text for the results file at `results_path`, read from that file. Heavy-data
/// references name the file as `heavy_data_name` (relative to the sidecar's directory, so the pair
/// can be moved together). Describes the material map as cell data of the whole grid ("materials")
/// and one grid per field map and frequency ("<map> <wavelength> nm") holding each component's
/// `_re` and `_im` parts and `E_squared` as node data; graded grids are given by their node
/// coordinates (3DRectMesh with VXVYVZ). Throws std::runtime_error naming the file if it is not a
/// yeegap results file of a version this program reads, or cannot be read.
std::string xdmf_text(const std::string& results_path, const std::string& heavy_data_name);

/// Writes the sidecar of `results_path` to xdmf_path(results_path) atomically (via a `.partial`
/// file and a rename, so a viewer never sees half a file) and returns its path. Throws
/// std::runtime_error naming the file on failure.
std::string write_xdmf(const std::string& results_path);

}  // namespace yeegap::io
