// A library entry is a fit over a published wavelength range (materials/library.h); outside it the
// model is an extrapolation, and lossless Sellmeier entries can even put a pole in the band. After
// the sources are read, each library material that a body or the background uses is checked
// against the band all sources cover together; a band that leaves the range gets a warning, not an
// error, since a slightly wider band is often harmless and the user may know better.
#include <algorithm>
#include <limits>
#include <vector>

#include <fmt/format.h>

#include "base/units.h"
#include "io/scene/scene_blocks.h"
#include "io/written_units.h"
#include "materials/library.h"

namespace yeegap::io {
namespace {

// Rounding slack: a band written at exactly the range's end (in eV or nm) must not warn.
constexpr double range_slack = 1e-9;

}  // namespace

void warn_outside_library_ranges(const solver::Scene& scene, const NoteSink& notes) {
  double omega_lo = std::numeric_limits<double>::infinity(), omega_hi = 0;
  const auto cover = [&](const solver::Waveform& w) {
    omega_lo = std::min(omega_lo, w.omega_min);
    omega_hi = std::max(omega_hi, w.omega_max);
  };
  for (const solver::DipoleSpec& d : scene.dipoles) cover(d.waveform);
  for (const solver::PlaneWaveSpec& p : scene.plane_waves) cover(p.waveform);
  for (const solver::BlochWaveSpec& p : scene.bloch_waves) cover(p.waveform);
  if (!(omega_hi > 0) || !(omega_lo > 0)) return;  // no source, or a band reaching zero frequency
  const double band_min = units::omega_to_wavelength(omega_hi), band_max = units::omega_to_wavelength(omega_lo);

  std::vector<bool> used(scene.materials.size(), false);
  if (scene.domain.background >= 0 && static_cast<size_t>(scene.domain.background) < used.size())
    used[scene.domain.background] = true;
  for (const solver::BodySpec& b : scene.bodies)
    if (b.material >= 0 && static_cast<size_t>(b.material) < used.size()) used[b.material] = true;

  for (size_t i = 0; i < scene.materials.size(); ++i) {
    const solver::MaterialSpec& m = scene.materials[i];
    if (!used[i] || m.library.empty()) continue;
    const materials::LibraryEntry* entry = materials::find_material(m.library);
    if (!entry) continue;  // the reader refused unknown names already
    const bool below = band_min < entry->wavelength_min * (1 - range_slack);
    const bool above = band_max > entry->wavelength_max * (1 + range_slack);
    if (!below && !above) continue;
    notes(fmt::format("{}: warning: {}: library entry '{}' is fitted over {} to {}, but the sources cover {} to {}; "
                      "outside its range the model is an extrapolation ({})",
                      m.where.location(), m.where.key_path.empty() ? m.name : m.where.key_path, entry->name,
                      format_length(entry->wavelength_min), format_length(entry->wavelength_max),
                      format_length(band_min), format_length(band_max), entry->source));
  }
}

}  // namespace yeegap::io
