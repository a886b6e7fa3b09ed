// Catalog access: the entry list is built once from the per-family files and then only read.
#include "materials/library.h"

#include <algorithm>
#include <cctype>

#include "base/errors.h"

namespace yeegap::materials {

namespace {

std::string lower(std::string_view s) {
  std::string out(s);
  for (char& ch : out) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  return out;
}

std::vector<LibraryEntry> build_library() {
  std::vector<LibraryEntry> all = detail::metal_entries();
  std::vector<LibraryEntry> dielectrics = detail::dielectric_entries();
  all.insert(all.end(), dielectrics.begin(), dielectrics.end());
  for (size_t a = 0; a < all.size(); ++a)
    for (size_t b = a + 1; b < all.size(); ++b)
      YG_CHECK(lower(all[a].name) != lower(all[b].name), "two library entries share the name " + all[a].name);
  return all;
}

size_t edit_distance(const std::string& a, const std::string& b) {
  std::vector<size_t> row(b.size() + 1);
  for (size_t j = 0; j <= b.size(); ++j) row[j] = j;
  for (size_t i = 1; i <= a.size(); ++i) {
    size_t diagonal = row[0];
    row[0] = i;
    for (size_t j = 1; j <= b.size(); ++j) {
      const size_t above = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diagonal = above;
    }
  }
  return row[b.size()];
}

}  // namespace

const std::vector<LibraryEntry>& library() {
  static const std::vector<LibraryEntry> entries = build_library();  // immutable after first use
  return entries;
}

const LibraryEntry* find_material(std::string_view name) {
  for (const LibraryEntry& e : library())
    if (e.name == name) return &e;
  const std::string wanted = lower(name);
  for (const LibraryEntry& e : library())
    if (lower(e.name) == wanted) return &e;
  return nullptr;
}

std::vector<std::string> material_names() {
  std::vector<std::string> names;
  for (const LibraryEntry& e : library()) names.push_back(e.name);
  return names;
}

std::string nearest_material_name(std::string_view name) {
  const std::string wanted = lower(name);
  std::string best;
  size_t best_distance = static_cast<size_t>(-1);
  for (const LibraryEntry& e : library()) {
    const size_t d = edit_distance(wanted, lower(e.name));
    if (d < best_distance) {
      best_distance = d;
      best = e.name;
    }
  }
  return best;
}

}  // namespace yeegap::materials
