// Near-to-far-field transform (see far_field.h): radiation integrals N and L summed with trapezoid
// weights, the phase factorised per axis along a face. H is averaged onto each face's E plane and that
// averaging undone per direction; the DFTs keep each component's true sample time (dft_box.h), so no
// half-step phase is needed. Formulas: docs/physics.md 3.10.
#include "solver/outputs/far_field.h"
#include "solver/engine/simulation_state.h"
#include "solver/outputs/surface_weights.h"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "base/units.h"
#include "solver/outputs/result_records.h"
#include "solver/outputs/sphere_quadrature.h"

namespace yeegap::solver {

namespace {

// Distance of the box from the absorbing layers when the scene gives none: the H values of a face
// lie half a cell either side of it, so two cells keep them clear of the graded layer.
constexpr int default_margin_cells = 2;
// Extra Gauss-Legendre nodes beyond k R: the pattern of currents within radius R holds spherical
// harmonics up to degree about k R, and a few more make the quadrature converge to round-off
// (common practice for band-limited patterns).
constexpr int extra_theta_nodes = 10;

using CVec = std::array<Complex, 3>;


std::vector<int> range(int first, int last) {
  std::vector<int> v;
  for (int i = first; i <= last; ++i) v.push_back(i);
  return v;
}

// Phase factors exp(-i k s_t (x - x0)) for the positions of one axis.
void phases(const std::vector<double>& x, double ks, double x0, std::vector<Complex>& out) {
  out.resize(x.size());
  for (std::size_t i = 0; i < x.size(); ++i) out[i] = std::polar(1.0, -ks * (x[i] - x0));
}

}  // namespace

FarFieldRecorder::FarFieldRecorder(const FarFieldSpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L,
                                   const MaterialIndex& mi)
    : spec_(spec) {
  const std::string who = fmt::format("{}: far_field '{}'", spec.where.location(), spec.name);
  for (int a = 0; a < 3; ++a)
    if (g.invariant(a))
      throw RunError(fmt::format("{}: the domain is invariant along {} (2D); the 2D far-field transform is not "
                                 "available yet. Use a flux box around everything for the radiated power.",
                                 who, "xyz"[a]));
  for (int f = 0; f < 6; ++f)
    if (scene.domain.edges[f] != EdgeKind::cpml)
      throw RunError(fmt::format("{}: every face of the domain must be an absorber (face {}_{} is not): the "
                                 "transform assumes the background fills all space outside the box, and a metal, "
                                 "periodic or mirror face sends back light it does not see", who, "xyz"[f / 2],
                                 f % 2 ? "high" : "low"));
  const MaterialSpec& bg = scene.materials[scene.domain.background];
  if (bg.perfect_conductor || bg.poles.dispersive() || bg.poles.conductivity != 0)
    throw RunError(fmt::format("{}: the background '{}' must be a lossless medium without poles (a plain index or "
                               "permittivity); the far field of a lossy or dispersive background is not defined here",
                               who, bg.name));
  index_ = std::sqrt(bg.poles.eps_inf);
  if (spec.numerical_aperture < 0 || spec.numerical_aperture > index_ * (1 + 1e-12))
    throw RunError(fmt::format("{}: the numerical aperture {} must lie between 0 and the background index {}", who,
                               spec.numerical_aperture, index_));

  const int margin = scene.domain.cpml.cells;
  for (int a = 0; a < 3; ++a) {
    int lo = margin + default_margin_cells, hi = g.n[a] - margin - default_margin_cells;
    if (spec.box_given) {
      lo = g.nearest_node(a, spec.box.lo[a]);
      hi = g.nearest_node(a, spec.box.hi[a]);
      if (lo < margin + 1 || hi > g.n[a] - margin - 1)
        throw RunError(fmt::format("{}: the box reaches into the absorbing layer along {}; keep it at least one cell "
                                   "inside ({} to {})", who, "xyz"[a], g.nodes[a][margin + 1],
                                   g.nodes[a][g.n[a] - margin - 1]));
    }
    if (hi - lo < 2)
      throw RunError(fmt::format("{}: the box is {} cells across along {}; it needs at least 2 (is the domain too "
                                 "small for the absorbing layers?)", who, hi - lo, "xyz"[a]));
    nodes_[a] = {lo, hi};
    box_.lo[a] = g.nodes[a][lo];
    box_.hi[a] = g.nodes[a][hi];
    centre_[a] = 0.5 * (box_.lo[a] + box_.hi[a]);
  }
  check_scene(scene, g, mi, L);

  const std::size_t nf = spec.omegas.size();
  const std::array<Component, 3> E = {Component::Ex, Component::Ey, Component::Ez};
  const std::array<Component, 3> H = {Component::Hx, Component::Hy, Component::Hz};
  for (int a = 0; a < 3; ++a) {
    const int b = (a + 1) % 3, c = (a + 2) % 3;
    const std::array<int, 2>& rb = nodes_[b];
    const std::array<int, 2>& rc = nodes_[c];
    for (int side = 0; side < 2; ++side) {
      const int node = nodes_[a][side];
      auto make = [&](Component comp, int staggered_axis, std::ptrdiff_t avg) {
        std::array<std::vector<int>, 3> idx;
        idx[a] = {node};
        idx[b] = staggered_axis == b ? range(rb[0], rb[1] - 1) : range(rb[0], rb[1]);
        idx[c] = staggered_axis == c ? range(rc[0], rc[1] - 1) : range(rc[0], rc[1]);
        return DftBox(comp, L, std::move(idx), avg, nf);
      };
      const std::ptrdiff_t below = -L.stride(a);
      Face face{a, side ? 1.0 : -1.0, g.nodes[a][node], g.dual(a, node),
                {make(E[b], b, 0), make(H[c], b, below), make(E[c], c, 0), make(H[b], c, below)}, {}, {}, {}, {}};
      for (int i = rb[0]; i < rb[1]; ++i) face.xb[0].push_back(g.position(b, i, true));
      for (int i = rc[0]; i <= rc[1]; ++i) face.xc[0].push_back(g.nodes[c][i]);
      for (int i = rb[0]; i <= rb[1]; ++i) face.xb[1].push_back(g.nodes[b][i]);
      for (int i = rc[0]; i < rc[1]; ++i) face.xc[1].push_back(g.position(c, i, true));
      face.wb = {cell_weights(g, b, rb[0], rb[1]), node_weights(g, b, rb[0], rb[1])};
      face.wc = {node_weights(g, c, rc[0], rc[1]), cell_weights(g, c, rc[0], rc[1])};
      faces_.push_back(std::move(face));
    }
  }
}

// Everything on or outside the box must be background: scanned over the E locations the run
// actually uses (so a body is judged as the grid sees it, staircase and all).
void FarFieldRecorder::check_scene(const Scene& scene, const Grid& g, const MaterialIndex& mi,
                                   const BlockLayout& L) const {
  const std::string who = fmt::format("{}: far_field '{}'", spec_.where.location(), spec_.name);
  for (const PlaneWaveSpec& w : scene.plane_waves) {
    bool inside = true, outside = true;  // the plane-wave box inside the far-field box, or around it
    for (int a = 0; a < 3; ++a) {
      const int lo = g.nearest_node(a, w.box.lo[a]), hi = g.nearest_node(a, w.box.hi[a]);
      inside = inside && lo > nodes_[a][0] && hi < nodes_[a][1];
      outside = outside && lo < nodes_[a][0] && hi > nodes_[a][1];
    }
    if (!inside && !outside)
      throw RunError(fmt::format("{}: the box crosses the plane-wave box; put it wholly outside (scattered far "
                                 "field) or wholly inside the plane-wave box", who));
  }
  const auto background = static_cast<std::uint8_t>(scene.domain.background);
  const auto wall = static_cast<std::uint8_t>(scene.materials.size());
  for (int comp = 0; comp < 3; ++comp)
    for (int k = 0; k < g.n[2]; ++k)
      for (int j = 0; j < g.n[1]; ++j)
        for (int i = 0; i < g.n[0]; ++i) {
          const std::uint8_t m = mi.e[comp][L.at(i, j, k)];
          if (m == background) continue;
          const std::array<int, 3> idx{i, j, k};
          bool strictly_inside = true, on_domain_face = false;
          for (int a = 0; a < 3; ++a) {
            strictly_inside = strictly_inside && (a == comp ? idx[a] >= nodes_[a][0] && idx[a] < nodes_[a][1]
                                                            : idx[a] > nodes_[a][0] && idx[a] < nodes_[a][1]);
            on_domain_face = on_domain_face || (a != comp && idx[a] == 0);
          }
          if (strictly_inside || (m == wall && on_domain_face)) continue;
          const Vec3 p = yee_position(g, static_cast<Component>(comp), i, j, k);
          const std::string what = m == wall ? std::string("a perfect conductor") : "'" + scene.materials[m].name + "'";
          throw RunError(fmt::format(
              "{}: {} lies on or outside the box, at ({:.4g}, {:.4g}, {:.4g}) nm. The transform needs the background "
              "all around the box: enclose every body in it (a substrate or other layered background is not "
              "supported yet; close the box in one medium)", who, what, p.x * 1e9, p.y * 1e9, p.z * 1e9));
        }
}

void FarFieldRecorder::record(const Fields& f, bool electric, const std::vector<Complex>& phase) {
  for (Face& face : faces_)
    for (DftBox& d : face.dft)
      if (is_electric(d.component()) == electric) d.accumulate(f, phase);
}

std::size_t FarFieldRecorder::memory_bytes() const {
  std::size_t s = 0;
  for (const Face& face : faces_)
    for (const DftBox& d : face.dft) s += d.memory_bytes();
  return s;
}

std::vector<FarFieldRecorder::FaceCurrents> FarFieldRecorder::weighted_currents(std::size_t q, double& surface) const {
  std::vector<FaceCurrents> cur(faces_.size());
  surface = 0;
  for (std::size_t fi = 0; fi < faces_.size(); ++fi) {
    const Face& face = faces_[fi];
    const int b = (face.axis + 1) % 3, c = (face.axis + 2) % 3;
    for (int set = 0; set < 2; ++set) {
      const DftBox& e = face.dft[2 * set];
      const DftBox& h = face.dft[2 * set + 1];
      const std::size_t nb = face.wb[set].size(), nc = face.wc[set].size();
      WeightedCurrents& wt = cur[fi][set];
      wt.a.resize(nb * nc);
      wt.b.resize(nb * nc);
      for (std::size_t ic = 0; ic < nc; ++ic)
        for (std::size_t ib = 0; ib < nb; ++ib) {
          std::array<std::size_t, 3> p{0, 0, 0};
          p[b] = ib;
          p[c] = ic;
          const double w = face.wb[set][ib] * face.wc[set][ic];
          const Complex ev = e.at(p[0], p[1], p[2], q), hv = h.at(p[0], p[1], p[2], q);
          wt.a[ic * nb + ib] = w * hv;
          wt.b[ic * nb + ib] = w * ev;
          // Poynting flux along the normal: E_b H_c* (set 0) - E_c H_b* (set 1).
          surface += 0.5 * face.sign * (set == 0 ? 1.0 : -1.0) * w * std::real(ev * std::conj(hv));
        }
    }
  }
  return cur;
}

namespace {

// The directions one frequency is evaluated in: the requested ones, then the sphere rule for the
// radiated power, then the collection cone (if any).
struct Directions {
  std::vector<Vec3> all;
  std::size_t requested = 0;
  DirectionSet sphere, cone;
};

Directions directions_for(const FarFieldSpec& spec, double index, double k, double radius) {
  Directions d;
  const int n_theta = static_cast<int>(std::ceil(k * radius)) + extra_theta_nodes, n_phi = 2 * n_theta + 2;
  d.sphere = sphere_directions(n_theta, n_phi);
  if (spec.numerical_aperture > 0) {
    const double s = std::min(1.0, spec.numerical_aperture / index);
    d.cone = cone_directions((1.0 / norm(spec.collection_axis)) * spec.collection_axis, std::asin(s), n_theta, n_phi);
  }
  d.requested = spec.theta.size();
  for (std::size_t i = 0; i < d.requested; ++i) {
    const double st = std::sin(spec.theta[i]), ct = std::cos(spec.theta[i]);
    d.all.push_back({st * std::cos(spec.phi[i]), st * std::sin(spec.phi[i]), ct});
  }
  d.all.insert(d.all.end(), d.sphere.directions.begin(), d.sphere.directions.end());
  d.all.insert(d.all.end(), d.cone.directions.begin(), d.cone.directions.end());
  return d;
}

// F = eta N_perp - s x L; r exp(-ikr) E = (i k / 4 pi) F.
CVec far_vector(const Vec3& s, const CVec& N, const CVec& Lm, double eta) {
  const Complex sn = s.x * N[0] + s.y * N[1] + s.z * N[2];
  CVec F;
  for (int t = 0; t < 3; ++t) {
    const int u = (t + 1) % 3, v = (t + 2) % 3;
    F[t] = eta * (N[t] - s[t] * sn) - (s[u] * Lm[v] - s[v] * Lm[u]);
  }
  return F;
}

}  // namespace

void FarFieldRecorder::radiation_vectors(const std::vector<FaceCurrents>& cur, double k, const std::vector<Vec3>& dirs,
                                         std::vector<CVec>& n_vec, std::vector<CVec>& l_vec) const {
  n_vec.assign(dirs.size(), CVec{});
  l_vec.assign(dirs.size(), CVec{});
#pragma omp parallel for schedule(dynamic, 4)
  for (std::size_t d = 0; d < dirs.size(); ++d) {
    const Vec3 s = dirs[d];
    CVec N{}, Lm{};
    std::vector<Complex> pb, pc;
    for (std::size_t fi = 0; fi < faces_.size(); ++fi) {
      const Face& face = faces_[fi];
      const int a = face.axis, b = (a + 1) % 3, c = (a + 2) % 3;
      const Complex pa = std::polar(1.0, -k * s[a] * (face.at - centre_[a]));
      for (int set = 0; set < 2; ++set) {
        phases(face.xb[set], k * s[b], centre_[b], pb);
        phases(face.xc[set], k * s[c], centre_[c], pc);
        const WeightedCurrents& wt = cur[fi][set];
        const std::size_t nb = pb.size();
        Complex sa = 0, sb = 0;
        for (std::size_t ic = 0; ic < pc.size(); ++ic) {
          Complex ra = 0, rb = 0;
          const Complex* ar = &wt.a[ic * nb];
          const Complex* br = &wt.b[ic * nb];
          for (std::size_t ib = 0; ib < nb; ++ib) {
            ra += ar[ib] * pb[ib];
            rb += br[ib] * pb[ib];
          }
          sa += ra * pc[ic];
          sb += rb * pc[ic];
        }
        // Undo the averaging of H across the face: a wave with normal wavenumber k s_a keeps
        // cos(k s_a h/2) of itself in the mean of two planes h apart, and only that wave adds to
        // this direction (the face sum is its transverse Fourier transform); uncorrected, a
        // dipole's pattern ripples with box size and wavelength (docs/measurements.md).
        sa *= pa / std::cos(0.5 * k * s[a] * face.h_gap);
        sb *= pa;
        // n = sign a: J = n x H gives J_b = -sign H_c, J_c = sign H_b; M = -n x E gives
        // M_c = -sign E_b, M_b = sign E_c.
        if (set == 0) {
          N[b] -= face.sign * sa;
          Lm[c] -= face.sign * sb;
        } else {
          N[c] += face.sign * sa;
          Lm[b] += face.sign * sb;
        }
      }
    }
    n_vec[d] = N;
    l_vec[d] = Lm;
  }
}

FarFieldResult FarFieldRecorder::result() const {
  FarFieldResult r;
  r.name = spec_.name;
  r.omegas = spec_.omegas;
  r.box = box_;
  r.index = index_;
  r.theta = spec_.theta;
  r.phi = spec_.phi;
  r.theta_count = spec_.theta_count;
  r.phi_count = spec_.phi_count;
  r.collection_axis = spec_.collection_axis;
  r.numerical_aperture = spec_.numerical_aperture;
  const double eta = constants::eta0 / index_;
  for (std::size_t q = 0; q < r.omegas.size(); ++q) {
    const double k = index_ * r.omegas[q] / constants::c0;
    double surface = 0;
    const std::vector<FaceCurrents> cur = weighted_currents(q, surface);
    r.surface_power.push_back(surface);
    const Directions dirs = directions_for(spec_, index_, k, 0.5 * norm(box_.hi - box_.lo));
    std::vector<CVec> n_vec, l_vec;
    radiation_vectors(cur, k, dirs.all, n_vec, l_vec);
    const double to_intensity = k * k / (32 * constants::pi * constants::pi * eta);
    auto intensity = [&](std::size_t d) {
      const CVec F = far_vector(dirs.all[d], n_vec[d], l_vec[d], eta);
      return to_intensity * (std::norm(F[0]) + std::norm(F[1]) + std::norm(F[2]));
    };
    const std::size_t n_req = dirs.requested;
    double total = 0;
    for (std::size_t d = 0; d < dirs.sphere.weights.size(); ++d) total += dirs.sphere.weights[d] * intensity(n_req + d);
    r.power.push_back(total);
    if (spec_.numerical_aperture > 0) {
      double in_cone = 0;
      for (std::size_t d = 0; d < dirs.cone.weights.size(); ++d)
        in_cone += dirs.cone.weights[d] * intensity(n_req + dirs.sphere.weights.size() + d);
      r.collected.push_back(in_cone);
    }
    std::vector<Complex> et(n_req), ep(n_req);
    std::vector<double> in(n_req), di(n_req);
    const Complex ik4pi(0, k / (4 * constants::pi));
    for (std::size_t d = 0; d < n_req; ++d) {
      const double th = spec_.theta[d], ph = spec_.phi[d];
      const Vec3 t_hat{std::cos(th) * std::cos(ph), std::cos(th) * std::sin(ph), -std::sin(th)};
      const Vec3 p_hat{-std::sin(ph), std::cos(ph), 0};
      const CVec F = far_vector(dirs.all[d], n_vec[d], l_vec[d], eta);
      et[d] = ik4pi * (t_hat.x * F[0] + t_hat.y * F[1] + t_hat.z * F[2]);
      ep[d] = ik4pi * (p_hat.x * F[0] + p_hat.y * F[1] + p_hat.z * F[2]);
      in[d] = intensity(d);
      di[d] = total > 0 ? 4 * constants::pi * in[d] / total : 0.0;
    }
    r.e_theta.push_back(std::move(et));
    r.e_phi.push_back(std::move(ep));
    r.intensity.push_back(std::move(in));
    r.directivity.push_back(std::move(di));
  }
  return r;
}

void FarFieldRecorder::add_state(StateArrays& s, const std::string& prefix) {
  for (std::size_t f = 0; f < faces_.size(); ++f)
    for (std::size_t t = 0; t < faces_[f].dft.size(); ++t) faces_[f].dft[t].add_state(s, fmt::format("{}/face{}/dft{}", prefix, f, t));
}

Record record_of(const FarFieldResult& x, const RunResults& run, const Scene& scene) {
  Record r("far_field", x.name);
  const std::size_t nf = x.omegas.size(), nd = x.theta.size();
  require_rows(r, nf, {x.power.size(), x.surface_power.size(), x.e_theta.size(), x.e_phi.size(), x.intensity.size(),
                       x.directivity.size()}, "frequencies");
  if (!x.collected.empty()) require_rows(r, nf, {x.collected.size()}, "frequencies");
  require_rows(r, nd, {x.phi.size()}, "directions");
  if (x.theta_count != 0) require_rows(r, nd, {std::size_t(x.theta_count) * x.phi_count}, "directions (theta x phi)");
  std::vector<std::complex<double>> et, ep;
  std::vector<double> in, di;
  for (std::size_t q = 0; q < nf; ++q) {
    require_rows(r, nd, {x.e_theta[q].size(), x.e_phi[q].size(), x.intensity[q].size(), x.directivity[q].size()},
                 "directions");
    et.insert(et.end(), x.e_theta[q].begin(), x.e_theta[q].end());
    ep.insert(ep.end(), x.e_phi[q].begin(), x.e_phi[q].end());
    in.insert(in.end(), x.intensity[q].begin(), x.intensity[q].end());
    di.insert(di.end(), x.directivity[q].begin(), x.directivity[q].end());
  }
  r.set("theta_count", std::int32_t{x.theta_count});
  r.set("phi_count", std::int32_t{x.phi_count});
  r.set("index", x.index);
  r.set("box_from", std::vector<double>{x.box.lo.x, x.box.lo.y, x.box.lo.z});
  r.set("box_to", std::vector<double>{x.box.hi.x, x.box.hi.y, x.box.hi.z});
  r.set("numerical_aperture", x.numerical_aperture);
  r.set("collection_axis", std::vector<double>{x.collection_axis.x, x.collection_axis.y, x.collection_axis.z});
  add_frequency_axes(r, x.omegas);
  r.add("theta", "rad", x.theta, "polar angle from +z of each direction");
  r.add("phi", "rad", x.phi, "azimuth from +x of each direction");
  const char* amplitude = "r exp(-i k r) E at large r from DFT spectra, [frequency, direction]";
  r.add("E_theta", "V s", std::move(et), amplitude).shape = {nf, nd};
  r.add("E_phi", "V s", std::move(ep), amplitude).shape = {nf, nd};
  r.add("intensity", "W s^2/sr", std::move(in), "radiated power per solid angle dP/dOmega, [frequency, direction]")
      .shape = {nf, nd};
  r.add("directivity", "1", std::move(di), "4 pi (dP/dOmega) / power, [frequency, direction]").shape = {nf, nd};
  r.add("power", "W s^2", x.power, "radiated power: dP/dOmega integrated over the whole sphere");
  r.add("surface_power", "W s^2", x.surface_power,
        "outward Poynting flux through the box the transform used (a check on power)");
  if (!x.collected.empty())
    r.add("collected", "W s^2", x.collected, "power into the cone of numerical_aperture about collection_axis");
  add_peak_headlines(r, "power", x.omegas, x.power, "W s^2");

  const bool one_dipole = run.source_spectra.size() == 1;
  r.summary.heading = fmt::format("  far field {}: wavelength, radiated power{}, peak directivity{}", x.name,
                                  one_dipole ? " (x the dipole alone)" : "",
                                  x.collected.empty() ? "" : ", fraction collected");
  for (std::size_t q = 0; q < nf; ++q) {
    const double peak =
        x.directivity[q].empty() ? 0.0 : std::max(0.0, *std::max_element(x.directivity[q].begin(), x.directivity[q].end()));
    SummaryRow row({wavelength_cell(x.omegas[q])});
    // The terminal shows the power relative to the dipole alone when there is one dipole.
    row.cells.push_back(Cell("power", x.power[q], one_dipole ? "" : "{:.5g}"));
    if (one_dipole)
      row.cells.push_back(Cell("relative_to_dipole_alone", relative_to_dipole_alone(run, scene, x.omegas[q], x.power[q])));
    row.cells.push_back(Cell("peak_directivity", peak, "{:.3f}"));
    if (!x.collected.empty())
      row.cells.push_back(Cell("collected_fraction", x.collected[q] / x.power[q], "{:.4f}"));
    r.summary.rows.push_back(std::move(row));
  }
  return r;
}

}  // namespace yeegap::solver
