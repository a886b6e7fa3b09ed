// What a run hands to io/ for writing: plain data in SI units, no file format inside.
// Complex spectra are the running DFT  F(omega) = sum_n f(t_n) exp(i omega t_n) dt  (exp(-i omega t)
// convention), with t_n the true sample time of each Yee component (H lags E by half a step).
#pragma once

#include <array>
#include <complex>
#include <cstdint>
#include <string>
#include <vector>

#include "base/vec3.h"
#include "solver/outputs/record.h"
#include "solver/outputs/reflectance_dip.h"
#include "solver/scene.h"

namespace yeegap::solver {

struct ProbeResult {
  std::string name;
  Vec3 position;                           // m, as requested
  std::vector<Component> components;
  std::vector<Vec3> sampled_at;            // m, the Yee location actually sampled, per component
  std::vector<double> time;                // s, the E sample times (H samples are at time - dt/2)
  std::vector<std::vector<double>> values; // [component][sample], V/m or A/m
};

struct FieldMapResult {
  std::string name;
  std::vector<double> x, y, z;             // m, coordinates of the sampled grid nodes per axis
  std::vector<double> omegas;              // rad/s
  std::vector<Component> components;
  /// [frequency][component] -> complex values on the nodes, x fastest: index (k*ny + j)*nx + i.
  /// Components are interpolated from their Yee locations to the nodes.
  std::vector<std::vector<std::vector<std::complex<double>>>> values;
};

struct FluxResult {
  std::string name;
  bool closed = false;                     // a closed box (outward flux) or a plane (flux towards +axis)
  int normal_axis = -1;                    // for a plane: 0, 1, 2
  std::vector<double> omegas;              // rad/s
  /// 0.5 Re of the integral of E(omega) x H(omega)* over the surface, from DFT spectra: J/Hz^2-like
  /// units (W s^2); divide by |source spectrum|^2 terms to normalise.
  std::vector<double> power;
  /// With a plane wave in a Bloch cell: power / incident power through the same area, counted
  /// positive along the incident direction (so a plane behind the stack gives T, one on the
  /// entry side, in the reflected-only region, gives -R). Empty otherwise.
  std::vector<double> fraction;
};

struct CrossSectionResult {
  std::string name;
  std::vector<double> omegas;              // rad/s
  bool per_unit_length = false;            // 2D: cross sections per unit length (m), else areas (m^2)
  std::vector<double> scattering, absorption, extinction;  // m^2 (or m)
  std::vector<double> incident_intensity;  // |E_inc|^2 / (2 eta), W s^2/m^2 (DFT units)
};

/// Far field (physics.md 3.10). Amplitudes are r exp(-ikr) E at large r, from DFT spectra (V s);
/// powers are in the flux's DFT units (W s^2): divide by |source spectrum|^2 terms to normalise.
struct FarFieldResult {
  std::string name;
  std::vector<double> omegas;              // rad/s
  Region box;                              // m, the closed surface the currents were taken on
  double index = 1;                        // refractive index of the background
  std::vector<double> theta, phi;          // rad, the reported directions
  int theta_count = 0, phi_count = 0;      // > 0 when the directions are a theta x phi grid, phi fastest
  std::vector<std::vector<std::complex<double>>> e_theta, e_phi;  // [frequency][direction], V s
  std::vector<std::vector<double>> intensity;    // [frequency][direction] dP/dOmega, W s^2/sr
  std::vector<std::vector<double>> directivity;  // [frequency][direction] 4 pi (dP/dOmega) / power
  std::vector<double> power;               // radiated power, integrated over the sphere, W s^2
  std::vector<double> surface_power;       // outward flux through the box itself, W s^2 (a check)
  Vec3 collection_axis{0, 0, 1};
  double numerical_aperture = 0;           // 0: no collection cone
  std::vector<double> collected;           // power into the cone, W s^2; empty without a cone
};

/// Decay-rate enhancement of one dipole, each entry per frequency and relative to the same dipole
/// alone in the medium around it.
struct DecayRateResult {
  std::string name;
  std::vector<double> omegas;              // rad/s
  int dipole = 0;
  double index = 1;                        // refractive index of the medium around the dipole
  std::string radiated;                    // the output the radiative part came from; empty if none
  std::vector<double> total;               // box power / alone power: the total-rate (Purcell) enhancement
  std::vector<double> radiative;           // radiated power / alone power; empty without `radiated`
  std::vector<double> efficiency;          // radiative / total (quantum efficiency of an ideal emitter)
  std::vector<double> box_power;           // W s^2, out of the small box around the dipole
  std::vector<double> alone_power;         // W s^2, n eta0 k0^2 |I l(omega)|^2 / (12 pi)
};

/// Reflectance, transmittance and absorptance of a plane wave in a Bloch cell, one row per
/// frequency (a run at fixed in-plane wavevector: each row has its own angle, physics.md 3.7) or
/// per angle (an angle scan: every row at the same frequency).
struct ReflectanceResult {
  std::string name;                        // "plane_wave"
  bool angle_scan = false;
  bool p_polarized = true;
  double incident_index = 1;               // refractive index of the incident medium
  std::vector<double> omegas;              // rad/s, per row
  std::vector<double> angles;              // rad, per row, in the incident medium
  std::vector<double> k_parallel;          // rad/m, per row
  std::vector<double> reflectance, transmittance, absorptance;  // A = 1 - R - T
};

/// Sensor figures of an angle scan (SensorSpec; definitions in docs/sensor.md): the run's own R(theta)
/// and the repeat with the sensing medium's index raised by delta_n. Angles and widths in rad;
/// sensitivity in rad per refractive-index unit.
struct SensorResult {
  std::string name;
  std::string medium;                      // the sensing medium's material name
  double delta_n = 0;
  double index = 0;                        // its refractive index (real part) at omega, before the raise
  double omega = 0;                        // rad/s of the scan
  std::vector<double> angles;              // rad, increasing, in the incident medium
  std::vector<double> reflectance;         // R at the medium's own index
  std::vector<double> reflectance_raised;  // R with the index raised by delta_n
  ReflectanceDip dip, dip_raised;          // positions and widths in rad
  SensorFigures figures;                   // shift (rad), sensitivity (rad/RIU), figure of merit (1/RIU)
  // With a binding material (SensorSpec::binding): the scan with it replaced by the sensing medium.
  std::string binding;                     // its material name; empty: no binding scan
  std::vector<double> reflectance_before_binding;
  ReflectanceDip dip_before_binding;
  double binding_shift = 0;                // rad: dip.position - dip_before_binding.position
  double binding_equivalent_index = 0;     // RIU: binding_shift / sensitivity, the bulk change that
                                           // would move the dip as far
};

/// Diffraction orders of a plane wave in a Bloch cell (solver/outputs/diffraction_orders.h): one entry per
/// propagating order (m_b, m_c) per side per row, rows as in ReflectanceResult. Order (m_b, m_c)
/// has the lateral wavevector k_par + 2 pi (m_b / period_b, m_c / period_c).
struct DiffractionOrdersResult {
  std::string name;
  bool angle_scan = false;
  int axis = 2;                            // the plane wave's axis; lateral axes are axis+1, axis+2
  std::array<double, 2> period{};          // m, the cell along the two lateral axes
  std::array<bool, 2> diffracting{};       // false along an invariant (one-cell) axis: m = 0 only
  double incident_index = 1;               // medium of the reflected orders
  double transmitted_index = 0;            // medium of the transmitted orders; 0: absorbing, none reported
  std::vector<double> omegas;              // rad/s, per row
  std::vector<double> incidence_angles;    // rad, per row, as ReflectanceResult::angles
  std::vector<double> reflected_sum, transmitted_sum;  // per row, sums of the efficiencies below
  // Per order, flat:
  std::vector<int> row;
  std::vector<int> side;                   // -1: reflected, +1: transmitted
  std::vector<int> order_b, order_c;       // m along the two lateral axes
  std::vector<Vec3> direction;             // unit vector of travel, away from the structure
  std::vector<double> angle;               // rad, polar angle of travel from the axis in its medium
  std::vector<double> efficiency;          // order power / incident power
};

/// A gap the tunnelling block found on the grid and treated (one per body pair): its gap-medium
/// cells, or in a classical run the cells it counted and left as they were.
struct TunnellingGap {
  std::array<int, 2> pair{};               // body indices
  long cells = 0;                          // E locations in the gap (below the cut-off)
  double smallest_width = 0;               // m: smallest l = d_A + d_B among them (0 if none)
  double cutoff = 0;                       // m
  bool quantum = true;                     // false: classical run, cells counted but not changed
};

struct RunSummary {
  long steps = 0;
  double time_step = 0;                    // s
  double simulated_time = 0;               // s
  double wall_seconds = 0;
  double cell_updates_per_second = 0;
  std::string stop_reason;                 // "time", "energy_below", "max_steps"; "interrupted" (run's hook);
                                           // "diverged" (fields not finite or growing without bound)
  double final_energy_fraction = 0;        // field energy at the end / its peak
  double sources_end_time = 0;             // s: when the last source has ended (a pulse's tail, or
                                           // infinity for a continuous wave); spectra of a run stopped
                                           // before it are not those of the structure
  std::string divergence;                  // with "diverged": where the largest field sits (component,
                                           // cell, position, material)
};

struct RunResults {
  RunSummary summary;
  std::vector<double> grid_x, grid_y, grid_z;    // m, cell edges (node coordinates) per axis
  std::vector<std::string> material_names;       // index -> name
  std::vector<std::uint8_t> material_map;        // per cell (material at the cell centre), x fastest
  /// DFT of each dipole's current moment I*l(t) (A m) at the union of all output frequencies,
  /// for normalising spectra: one entry per dipole, each aligned with `source_omegas`.
  std::vector<double> source_omegas;
  std::vector<std::vector<std::complex<double>>> source_spectra;
  /// DFT of each plane wave's incident E (V s/m) at the centre of its box, aligned with
  /// `source_omegas`: the incident intensity is |E|^2 / (2 eta) for normalising cross sections.
  std::vector<std::vector<std::complex<double>>> incident_spectra;
  std::vector<ProbeResult> probes;
  std::vector<FieldMapResult> field_maps;
  std::vector<FluxResult> fluxes;
  std::vector<CrossSectionResult> cross_sections;
  std::vector<FarFieldResult> far_fields;
  std::vector<DecayRateResult> decay_rates;
  std::vector<TunnellingGap> tunnelling_gaps;    // the scene's `tunnelling` block: results group `tunnelling`
  std::vector<SensorResult> sensors;
  std::vector<ReflectanceResult> reflectance;    // plane waves in Bloch cells
  std::vector<DiffractionOrdersResult> orders;   // diffraction orders of a plane wave in a Bloch cell
  std::vector<Record> records;                   // outputs that make their record directly (record.h)
};

}  // namespace yeegap::solver
