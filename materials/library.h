// The built-in material library: published dispersion fits, each mapped exactly onto a PoleSet,
// with its source and the wavelength range it was fitted over. Metals in library_metals.cpp,
// dielectrics in library_dielectrics.cpp; this header is the only way in.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "materials/pole_set.h"

namespace yeegap::materials {

struct LibraryEntry {
  std::string name;           // the word a scene uses (`library: Au`); unique, case-insensitively
  std::string summary;        // one line for listings
  std::string source;         // authors, journal volume, first page (year)
  double wavelength_min = 0;  // m, vacuum wavelength range the published fit covers
  double wavelength_max = 0;  // m
  PoleSet poles;              // SI: rad/s
  std::string notes;          // how the published form maps onto poles, where the numbers were read, caveats
  bool from_memory = false;   // true when the parameters could not be checked against any source
};

/// Every entry, in a fixed order (metals first). Built once; never changes.
const std::vector<LibraryEntry>& library();

/// The entry called `name` (exact match first, then ignoring case), or nullptr.
const LibraryEntry* find_material(std::string_view name);

/// All entry names, in library order.
std::vector<std::string> material_names();

/// The entry name closest to `name` (edit distance, ignoring case), for "did you mean ...?".
std::string nearest_material_name(std::string_view name);

namespace detail {
std::vector<LibraryEntry> metal_entries();       // library_metals.cpp
std::vector<LibraryEntry> dielectric_entries();  // library_dielectrics.cpp
}  // namespace detail

}  // namespace yeegap::materials
