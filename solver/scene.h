// The typed, validated description of one run, in SI units: what io/ reads from a scene file and
// what the solver builds its model from. Plain aggregates only (DEVELOPERS.md: plain data crosses
// folders), so a test builds one in a few lines without any file.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <vector>

#include "base/vec3.h"
#include "base/where.h"
#include "geometry/shape.h"
#include "materials/pole_set.h"
#include "materials/tunnelling_model.h"

namespace yeegap::solver {

enum class Component : std::uint8_t { Ex, Ey, Ez, Hx, Hy, Hz };
inline constexpr std::array<const char*, 6> component_names = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz"};

/// What happens at one face of the domain.
enum class EdgeKind : std::uint8_t {
  cpml,      // CPML (Roden & Gedney 2000) inside the domain, backed by a perfect conductor
  periodic,  // the field repeats with the domain size
  metal,     // perfect electric conductor: tangential E = 0 on the face
  // A symmetry plane at a low face: the domain stands for itself and its mirror image.
  mirror_even,  // tangential E even (symmetric) across the plane: a magnetic wall, tangential H = 0
  mirror_odd,   // tangential E odd (antisymmetric): an electric wall, tangential E = 0
};
inline constexpr std::array<const char*, 5> edge_kind_names = {"cpml", "periodic", "metal", "mirror_even",
                                                               "mirror_odd"};
inline constexpr bool is_mirror(EdgeKind k) { return k == EdgeKind::mirror_even || k == EdgeKind::mirror_odd; }

/// CPML grading (physics.md 3.5): sigma(x) = sigma_max (x/d)^m, kappa(x) = 1 + (kappa_max-1)(x/d)^m,
/// alpha(x) = alpha_max (1 - x/d). sigma_max follows from the target normal-incidence reflection.
struct CpmlSpec {
  int cells = 12;                 // layer thickness in cells
  double grading_order = 3.0;     // m
  double reflection = 1e-8;       // target R(0) of the layer for a normal plane wave
  double kappa_max = 1.0;         // coordinate stretching; > 1 helps evanescent and grazing waves
  double alpha_max = 0.0;         // CFS shift, S/m; 0 = derive from the lowest frequency of interest
};

/// A region given by two corners. A zero extent along one axis makes a plane.
struct Region {
  Vec3 lo, hi;                    // m
};

/// A box with finer cells: along each axis, the cells across box.lo..box.hi are at most `step`
/// (the graded mesh builder, geometry/graded_mesh.h).
struct RefineZone {
  Region box;                     // m
  Vec3 step;                      // m, per axis, at most the base step
};

struct DomainSpec {
  Vec3 size;                      // m, the whole domain including absorber layers
  Vec3 center;                    // m
  Vec3 step;                      // m, base cell size per axis
  std::array<EdgeKind, 6> edges{};  // faces x-, x+, y-, y+, z-, z+
  CpmlSpec cpml;
  int background = 0;             // index into Scene::materials
  double stability_fraction = 0.99;   // fraction of the Courant-limit time step
  double time_step = 0.0;         // s; 0 = stability_fraction * limit. Above the limit it is refused.
  std::vector<RefineZone> refine; // zones of finer cells
  int gap_cells = 4;              // cells across each gap between bodies narrower than this many
                                  // base cells; 0 = no gap search
  double grading_ratio = 1.2;     // largest ratio of neighbouring cells (common practice)
  bool averaging = false;         // subcell averaging at E locations an interface crosses
                                  // (solver/media/subcell_average.h); false = plain staircase
  bool averaging_cross_terms = true;  // with averaging: the off-diagonal terms between dielectrics
                                      // (solver/media/subcell_cross_terms.h); false only for comparisons
  // Bloch-periodic axes (physics.md 3.7): periodic edges whose copies carry the phase of the
  // in-plane wavevector, F(x + L) = F(x) exp(i k L). With k = 0 they are plain periodic edges.
  std::array<bool, 3> bloch{};
  Vec3 bloch_wavevector;          // rad/m, on the Bloch axes; a plane_wave sets it from its angle
  std::array<std::vector<double>, 3> nodes;  // m; when every axis is given, these nodes are the
                                             // grid and the mesh builder is skipped
};

struct MaterialSpec {
  std::string name;
  materials::PoleSet poles;       // eps_inf, conductivity, poles
  bool perfect_conductor = false; // E = 0 inside
  Where where;                    // where it was defined, for messages
  std::string library;            // the library entry's name when the model is 'library: NAME', else empty
};

struct BodySpec {
  geometry::ShapePtr shape;
  int material = 0;               // index into Scene::materials
  Where where;
  std::string name{};             // optional; how a tunnelling pair names the body
};

/// A pulse or a continuous wave, as the time dependence of a source.
struct Waveform {
  enum class Kind : std::uint8_t { pulse, continuous } kind = Kind::pulse;
  double omega_min = 0;           // rad/s: the band a pulse covers; at its edges the pulse spectrum
  double omega_max = 0;           // carries 1 % of its peak power. A continuous wave: both = its frequency
  double ramp_time = 0;           // s: smooth turn-on of a continuous wave
};

struct DipoleSpec {
  Vec3 position;                  // m
  Vec3 direction{0, 0, 1};        // unit vector of the dipole moment
  double moment = 1e-30;          // C m, peak dipole moment amplitude
  Waveform waveform;
  Where where;
};

/// A plane wave lighting a box (total-field/scattered-field, Taflove & Hagness 2005, ch. 5): inside
/// the box the grid holds the total field, outside it only what the structure scatters. The wave
/// travels along one grid axis (sign +1 or -1), so a 1D auxiliary grid with the same spacing and
/// time step reproduces the 3D grid's own dispersion exactly and the box does not leak.
struct PlaneWaveSpec {
  Region box;                     // m, the total-field region; its faces must lie in the background
  int axis = 2;                   // propagation axis 0, 1, 2
  int sign = -1;                  // +1: towards +axis
  Vec3 polarization{1, 0, 0};     // E direction, unit, perpendicular to the axis
  double amplitude = 1.0;         // V/m, scale of the incident pulse
  Waveform waveform;
  Where where;
};

/// A plane wave in a Bloch-periodic cell (films, stacks, gratings): it enters through a plane
/// normal to `axis`, travelling one way only, at `angle` from the axis in the incident medium
/// (whatever lossless material fills that plane, e.g. a glass prism). Its in-plane wavevector
/// k_par = n_inc (omega_ref / c) sin(angle) is fixed for the whole run, so each other frequency of
/// a pulse meets the structure at its own angle, sin theta(omega) = c k_par / (n_inc omega)
/// (physics.md 3.7). With `scan_angles` the run is one short problem per angle at omega_ref.
struct BlochWaveSpec {
  int axis = 2;                   // the normal of the film stack: 0, 1, 2
  int sign = +1;                  // +1: enters at the low side, travels towards +axis
  double angle = 0;               // rad, from the axis, in the incident medium
  double azimuth = 0;             // rad, plane of incidence measured from the next axis (x for z)
                                  // towards the one after (y)
  bool p_polarized = true;        // p: E in the plane of incidence (TM); s: E normal to it (TE)
  Waveform waveform;
  double reference_omega = 0;     // rad/s where the angle holds exactly; 0 = centre of the band
  double position = 0;            // m, the entry plane along `axis`
  bool position_given = false;    // false: a few cells inside the absorber on the entry side
  std::vector<double> omegas;     // rad/s, frequencies of the R, T, A table
  std::vector<double> scan_angles;  // rad; non-empty: one run per angle at reference_omega
  bool single_frequency = false;  // one output frequency: the run picks the pulse's band itself,
                                  // narrow enough to keep grazing frequencies out (bloch_run.cpp)
  Where where;
};

/// A set of angular frequencies (rad/s) at which frequency-domain outputs are accumulated.
using FrequencyList = std::vector<double>;

struct ProbeSpec {
  std::string name;
  Vec3 position;                  // m; the nearest Yee location of each component is sampled
  std::vector<Component> components;
  Where where;
};

struct FieldMapSpec {
  std::string name;
  Region region;                  // a plane or a volume
  FrequencyList omegas;
  std::vector<Component> components;
  Where where;
};

struct FluxSpec {
  std::string name;
  Region region;                  // a plane (flux along its normal, towards +) or a closed box (outward)
  FrequencyList omegas;
  Where where;
};

/// Scattering, absorption and extinction cross sections of whatever a plane-wave box holds:
/// scattering from the flux of the scattered field out of a box just outside the TFSF box,
/// absorption from the net flux of the total field into a box just inside it, both over the
/// incident intensity. Per unit length when the domain has an invariant axis (2D).
/// Power in each propagating diffraction order of a plane_wave's Bloch cell, in reflection and
/// transmission (solver/outputs/diffraction_orders.h): taken on the run's reflected and transmitted planes
/// at the plane wave's frequencies, so it needs a plane_wave and nothing else.
struct OrdersSpec {
  std::string name;
  Where where;
};

struct CrossSectionSpec {
  std::string name;
  FrequencyList omegas;
  int plane_wave = 0;             // index into Scene::plane_waves
  Where where;
};

/// Far-field radiation by surface equivalence (physics.md 3.10): running DFTs of the tangential
/// fields on a closed box around every source and body, in a homogeneous lossless background,
/// transformed to the pattern at the listed directions, the total radiated power (integrated over
/// the sphere) and the power into a collection cone.
struct FarFieldSpec {
  std::string name;
  bool box_given = false;         // false: the box lies two cells inside the absorbing layers
  Region box;                     // m, used when box_given
  FrequencyList omegas;
  std::vector<double> theta, phi; // rad, the directions of the reported pattern (paired lists)
  int theta_count = 0;            // > 0 when theta, phi form a grid: theta_count x phi_count,
  int phi_count = 0;              // phi fastest
  Vec3 collection_axis{0, 0, 1};  // unit vector, axis of the collection cone
  double numerical_aperture = 0;  // n sin(half angle) of the cone in the background; 0 = no cone
  Where where;
};

/// Decay-rate (Purcell) enhancement of one dipole: the power out of a small box around it over the
/// power of the same dipole alone in the medium around it, and (with `radiated`) the radiative part
/// from a far_field output or a closed flux box around everything, and their ratio.
struct DecayRateSpec {
  std::string name;
  int dipole = 0;                 // index into Scene::dipoles
  FrequencyList omegas;           // empty: those of the `radiated` output
  double box_size = 0;            // m, edge of the cube around the dipole; 0 = the smallest (3 cells)
  std::string radiated;           // name of a far_field or closed flux output; empty = total rate only
  Where where;
};

/// Surface-plasmon sensor figures of an angle scan (docs/sensor.md): the run is repeated with the
/// refractive index of one material raised by delta_n, and the two reflectance dips give the
/// resonance angle, minimum, width, sensitivity and figure of merit. With a binding material the
/// scan runs a third time with that material replaced by the sensing medium (the chip before the
/// layer bound), and the dip's move from then to the scene as written is the binding shift.
struct SensorSpec {
  std::string name;
  int medium = 0;                 // index into Scene::materials: the sensing medium (the analyte)
  double delta_n = 1e-3;          // raise of its refractive index (common practice: 1e-3)
  Where where;
  int binding = -1;               // index into Scene::materials: the bound layer's material; -1: none
};

/// Pairs of metal bodies whose gap may conduct by electron tunnelling. Quantum-corrected: every E
/// location outside both bodies whose local gap width l = d_A + d_B (the two signed distances) is
/// below the cut-off becomes a cell of the gap medium of Esteban et al., Nat. Commun. 3, 825 (2012),
/// with its own damping gamma_g(l). Classical: the gap keeps the background (the widths are still
/// found and reported), so the same scene runs both ways.
struct TunnellingSpec {
  std::vector<std::array<int, 2>> pairs;  // indices into Scene::bodies
  bool quantum = true;                    // quantum_corrected (true) or classical
  materials::TunnellingModel model;       // metal, barrier and gap medium, resolved
  double cutoff = 0;                      // m; 0 = model.cutoff_width
  Where where;
};

/// The electromagnetic energy inside a box against time (solver/outputs/energy_in_box.h).
struct EnergySpec {
  std::string name;
  Region region;                  // m, a box; the cells whose centres lie inside it count
  Where where;
};

struct StopSpec {
  double after = 0;               // s; 0 = not set
  double energy_below = 0;        // stop when the field energy falls below this fraction of its peak
                                  // after all sources have ended; 0 = not set
  long max_steps = 10'000'000;    // hard cap
};

/// A file the scene reads besides itself (an n,k table, an STL mesh) and a hash of its bytes as they
/// were read, so that a checkpoint can refuse to resume once the file has changed.
struct InputFile {
  std::string path;               // as opened: relative to the working directory, or absolute
  std::string key_path;           // the scene key that names it, e.g. "materials.gold.table"
  std::uint64_t content_hash = 0; // FNV-1a 64 of the bytes (io/file_hash.h)
};

struct Scene {
  int version = 1;
  std::string title;
  std::string file;               // path as given, for messages
  std::string text;               // the scene file's text, stored with the results
  DomainSpec domain;
  std::vector<MaterialSpec> materials;  // [0] is the background unless domain.background says otherwise
  std::vector<BodySpec> bodies;   // later bodies overwrite earlier ones
  std::vector<DipoleSpec> dipoles;
  std::vector<PlaneWaveSpec> plane_waves;
  std::vector<BlochWaveSpec> bloch_waves;  // at most one
  std::vector<ProbeSpec> probes;
  std::vector<FieldMapSpec> field_maps;
  std::vector<FluxSpec> fluxes;
  std::vector<CrossSectionSpec> cross_sections;
  std::vector<TunnellingSpec> tunnelling;  // at most one
  std::vector<FarFieldSpec> far_fields;
  std::vector<DecayRateSpec> decay_rates;
  std::vector<OrdersSpec> orders;  // at most one; needs a plane_wave
  std::vector<SensorSpec> sensors;  // at most one; needs an angle scan
  std::vector<EnergySpec> energies;
  StopSpec stop;
  std::vector<InputFile> input_files;  // in reading order
};

}  // namespace yeegap::solver
