// Polarization-current passes (see dispersive.h): the updates of materials/discrete_permittivity.cpp
// scaled to Q = dt J/eps0 and Pt = P/eps0 (V/m), written out in docs/physics.md 3.4. A critical
// point's E^{n+1} share is implicit: folded into ca, cb (material_map.cpp), completed after update_e.
// Stable for any damping: the Drude factor tends to -1 from above as g dt grows (physics.md 1.4).
#include "solver/media/dispersive.h"

#include <algorithm>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "materials/discrete_permittivity.h"
#include "solver/engine/simulation_state.h"

namespace yeegap::solver {

namespace {

struct DrudeCoefficients {
  double cq, ce;
};

DrudeCoefficients drude_coefficients(double omega_p, double gamma, double dt) {
  const double half = 0.5 * gamma * dt;
  const double wdt = omega_p * dt;
  return {(1.0 - half) / (1.0 + half), wdt * wdt / (1.0 + half)};
}

std::vector<real> one(double v) { return {static_cast<real>(v)}; }

}  // namespace

DispersiveCurrents::DispersiveCurrents(const Scene& s, const BlockLayout& L, const MaterialIndex& mi,
                                       const ECoefficients& ec, double dt)
    : layout_(L), dt_(dt) {
  for (std::size_t m = 0; m < s.materials.size(); ++m) {
    const materials::PoleSet& poles = s.materials[m].poles;
    if (!poles.dispersive() || s.materials[m].perfect_conductor) continue;
    Group g;
    g.material = static_cast<int>(m);
    // Interior E locations of this material in layout order (k, j, i), component by component.
    for (int c = 0; c < 3; ++c) {
      g.start[c] = g.offset.size();
      const std::uint8_t* idx = mi.e[c].data();
      for (int k = 0; k < L.n[2]; ++k)
        for (int j = 0; j < L.n[1]; ++j)
          for (int i = 0; i < L.n[0]; ++i) {
            const std::ptrdiff_t o = L.at(i, j, k);
            if (idx[o] == m) g.offset.push_back(o);
          }
    }
    g.start[3] = g.offset.size();
    if (g.offset.empty()) continue;
    const std::size_t n = g.offset.size();
    g.correction = static_cast<real>(ec.cb[m] * constants::eps0 / dt);

    for (const materials::DrudePole& d : poles.drude) {
      Pole p;
      const DrudeCoefficients dc = drude_coefficients(d.omega_p, d.gamma, dt);
      p.cq.value = one(dc.cq);
      p.ce.value = one(dc.ce);
      p.omega_p = d.omega_p;
      p.q.assign(n, real(0));
      g.drude.push_back(std::move(p));
    }
    for (const materials::LorentzPole& l : poles.lorentz) {
      Pole p;
      const double den = 1.0 + 0.5 * l.gamma * dt;
      const double w0dt2 = l.omega_0 * dt * l.omega_0 * dt;
      p.cq.value = one((1.0 - 0.5 * l.gamma * dt) / den);
      p.cp.value = one(-w0dt2 / den);
      p.ce.value = one(l.delta_eps * w0dt2 / den);
      p.q.assign(n, real(0));
      p.p.assign(n, real(0));
      g.lorentz.push_back(std::move(p));
    }
    for (const materials::CriticalPoint& cp : poles.critical_points) {
      const materials::CriticalPointAde a = materials::critical_point_ade(cp);
      Pole p;
      const double half_damping = 0.5 * a.damping * dt;  // G dt
      const double den = 1.0 + half_damping;
      p.cq.value = one((1.0 - half_damping) / den);
      p.cp.value = one(-a.omega0_sq * dt * dt / den);
      p.ce.value = one(a.a0 * dt * dt / den);
      p.cm.value = one(-0.5 * a.a1 * dt / den);
      p.implicit = static_cast<real>(0.5 * a.a1 * dt / den);
      p.q.assign(n, real(0));
      p.p.assign(n, real(0));
      g.critical.push_back(std::move(p));
    }
    if (!g.critical.empty()) g.e_previous.assign(n, real(0));
    g.current_sum.assign(n, real(0));
    groups_.push_back(std::move(g));
  }
}

DispersiveCurrents::Group& DispersiveCurrents::group_of(int material) {
  for (Group& g : groups_)
    if (g.material == material) return g;
  throw RunError(fmt::format("material {} has no dispersive cells in this block", material));
}

namespace {

// Cells per block of the passes: each block gathers its E values once into a buffer that every
// pole then reads, so a material with six poles reads the offsets and E once per step instead of
// six times, and the pole loops run over contiguous arrays (vectorised). The arithmetic of each
// cell is the same as pole by pole, so are the bits. 256 floats: the buffers stay in L1.
constexpr std::size_t cell_block = 256;

// body(b0, b1) for the blocks of [lo, hi), over the threads when `parallel`.
template <class Body>
void for_each_block(bool parallel, std::size_t lo, std::size_t hi, const Body& body) {
  const std::size_t blocks = (hi - lo + cell_block - 1) / cell_block;
  for_each_index(parallel, std::size_t{0}, blocks, [&](std::size_t b) {
    const std::size_t b0 = lo + b * cell_block;
    body(b0, std::min(hi, b0 + cell_block));
  });
}

}  // namespace

void DispersiveCurrents::advance(const Fields& f) {
  for (Group& g : groups_) {
    for (int c = 0; c < 3; ++c) {
      const real* __restrict e = f.c[c].data();
      const std::ptrdiff_t* __restrict off = g.offset.data();
      const std::size_t lo = g.start[c], hi = g.start[c + 1];
      for_each_block(parallel_worth(static_cast<long long>(hi - lo)), lo, hi, [&](std::size_t b0, std::size_t b1) {
        const std::size_t n = b1 - b0;
        alignas(64) real eb[cell_block];
        for (std::size_t i = 0; i < n; ++i) eb[i] = e[off[b0 + i]];
        for (Pole& p : g.drude) {
          real* __restrict q = p.q.data() + b0;
          if (p.cq.stride == 0) {
            const real cq = p.cq.at(0), ce = p.ce.at(0);
            for (std::size_t i = 0; i < n; ++i) q[i] = cq * q[i] + ce * eb[i];
          } else {  // per-cell dampings (tunnelling gaps)
            const real* __restrict cq = p.cq.value.data() + b0;
            const real* __restrict ce = p.ce.value.data() + b0;
            for (std::size_t i = 0; i < n; ++i) q[i] = cq[i] * q[i] + ce[i] * eb[i];
          }
        }
        for (Pole& p : g.lorentz) {
          real* __restrict q = p.q.data() + b0;
          real* __restrict pp = p.p.data() + b0;
          const real cq = p.cq.at(0), cp = p.cp.at(0), ce = p.ce.at(0);
          for (std::size_t i = 0; i < n; ++i) {
            q[i] = cq * q[i] + cp * pp[i] + ce * eb[i];
            pp[i] += q[i];
          }
        }
        if (!g.critical.empty()) {
          real* __restrict prev = g.e_previous.data() + b0;
          for (Pole& p : g.critical) {
            // Explicit part Q*; correct() adds the E^{n+1} share and advances P.
            real* __restrict q = p.q.data() + b0;
            const real* __restrict pp = p.p.data() + b0;
            const real cq = p.cq.at(0), cp = p.cp.at(0), ce = p.ce.at(0), cm = p.cm.at(0);
            for (std::size_t i = 0; i < n; ++i) q[i] = cq * q[i] + cp * pp[i] + ce * eb[i] + cm * prev[i];
          }
          for (std::size_t i = 0; i < n; ++i) prev[i] = eb[i];  // E^n becomes next step's E^{n-1}
        }
        // Summed pole by pole in the lists' order, as one cell at a time would.
        real* __restrict sum = g.current_sum.data() + b0;
        for (std::size_t i = 0; i < n; ++i) sum[i] = 0;
        for (const auto* list : {&g.drude, &g.lorentz, &g.critical})
          for (const Pole& p : *list) {
            const real* __restrict q = p.q.data() + b0;
            for (std::size_t i = 0; i < n; ++i) sum[i] += q[i];
          }
      });
    }
  }
}

void DispersiveCurrents::correct(Fields& f) {
  for (Group& g : groups_) {
    const real corr = g.correction;
    for (int c = 0; c < 3; ++c) {
      real* __restrict e = f.c[c].data();
      const std::ptrdiff_t* __restrict off = g.offset.data();
      const std::size_t lo = g.start[c], hi = g.start[c + 1];
      for_each_block(parallel_worth(static_cast<long long>(hi - lo)), lo, hi, [&](std::size_t b0, std::size_t b1) {
        const std::size_t n = b1 - b0;
        const real* __restrict sum = g.current_sum.data() + b0;
        alignas(64) real eb[cell_block];  // E^{n+1}
        for (std::size_t i = 0; i < n; ++i) {
          eb[i] = e[off[b0 + i]] - corr * sum[i];
          e[off[b0 + i]] = eb[i];
        }
        for (Pole& p : g.critical) {
          real* __restrict q = p.q.data() + b0;
          real* __restrict pp = p.p.data() + b0;
          const real implicit = p.implicit;
          for (std::size_t i = 0; i < n; ++i) {
            q[i] += implicit * eb[i];
            pp[i] += q[i];
          }
        }
      });
    }
  }
}

std::vector<DispersiveCell> DispersiveCurrents::cells(int material) const {
  std::vector<DispersiveCell> out;
  for (const Group& g : groups_) {
    if (g.material != material) continue;
    for (int c = 0; c < 3; ++c)
      for (std::size_t q = g.start[c]; q < g.start[c + 1]; ++q) {
        const std::ptrdiff_t o = g.offset[q];
        const auto k = static_cast<int>(o / layout_.sz);
        const std::ptrdiff_t rest = o - k * layout_.sz;
        const auto j = static_cast<int>(rest / layout_.sy);
        const auto i = static_cast<int>(rest - j * layout_.sy);
        out.push_back({static_cast<Component>(c), i - 1, j - 1, k - 1});
      }
  }
  return out;
}

void DispersiveCurrents::set_drude_damping(int material, int pole, const std::vector<double>& damping) {
  Group& g = group_of(material);
  YG_CHECK(pole >= 0 && pole < static_cast<int>(g.drude.size()),
           fmt::format("material {} has {} Drude poles, asked for pole {}", material, g.drude.size(), pole));
  YG_CHECK(damping.size() == g.offset.size(),
           fmt::format("{} damping values for {} dispersive cells", damping.size(), g.offset.size()));
  Pole& p = g.drude[pole];
  p.cq.value.resize(damping.size());
  p.ce.value.resize(damping.size());
  for (std::size_t q = 0; q < damping.size(); ++q) {
    if (!(damping[q] >= 0))
      throw RunError(fmt::format("Drude damping must be >= 0 rad/s, got {} at cell {}", damping[q], q));
    const DrudeCoefficients dc = drude_coefficients(p.omega_p, damping[q], dt_);
    p.cq.value[q] = static_cast<real>(dc.cq);
    p.ce.value[q] = static_cast<real>(dc.ce);
  }
  p.cq.stride = p.ce.stride = 1;
  p.damping = damping;
}

std::vector<double> DispersiveCurrents::drude_damping(int material, int pole) const {
  for (const Group& g : groups_)
    if (g.material == material && pole >= 0 && pole < static_cast<int>(g.drude.size())) return g.drude[pole].damping;
  return {};
}

std::size_t DispersiveCurrents::memory_bytes() const {
  std::size_t bytes = 0;
  for (const Group& g : groups_) {
    bytes += g.offset.size() * sizeof(std::ptrdiff_t) + (g.e_previous.size() + g.current_sum.size()) * sizeof(real);
    for (const auto* list : {&g.drude, &g.lorentz, &g.critical})
      for (const Pole& p : *list) {
        bytes += (p.q.size() + p.p.size()) * sizeof(real);
        for (const Coefficient* c : {&p.cq, &p.cp, &p.ce, &p.cm}) bytes += c->value.size() * sizeof(real);
      }
  }
  return bytes;
}

void DispersiveCurrents::add_state(StateArrays& s, const std::string& prefix) {
  for (Group& g : groups_) {
    const std::string base = fmt::format("{}/material{}", prefix, g.material);
    const auto poles = [&](std::vector<Pole>& list, const char* kind) {
      for (std::size_t i = 0; i < list.size(); ++i) {
        s.add_vector(fmt::format("{}/{}{}/q", base, kind, i), list[i].q);
        if (!list[i].p.empty()) s.add_vector(fmt::format("{}/{}{}/p", base, kind, i), list[i].p);
      }
    };
    poles(g.drude, "drude");
    poles(g.lorentz, "lorentz");
    poles(g.critical, "critical");
    if (!g.e_previous.empty()) s.add_vector(base + "/e_previous", g.e_previous);
  }
}

}  // namespace yeegap::solver
