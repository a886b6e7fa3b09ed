// Branch media of averaged E locations (see subcell_branch.h).
#include "solver/media/subcell_branch.h"

#include "base/constants.h"
#include "materials/discrete_permittivity.h"

namespace yeegap::solver {

BranchResponse branch_response(const materials::PoleSet& p, double dt) {
  BranchResponse r;
  r.eps_inf = p.eps_inf;
  r.loss = p.conductivity * dt / constants::eps0;
  for (const materials::DrudePole& d : p.drude) {
    const double half = 0.5 * d.gamma * dt, wdt = d.omega_p * dt;
    PoleStep s;
    s.cq = static_cast<real>((1 - half) / (1 + half));
    s.ce = static_cast<real>(wdt * wdt / (1 + half));
    r.poles.push_back(s);
  }
  for (const materials::LorentzPole& l : p.lorentz) {
    const double den = 1 + 0.5 * l.gamma * dt, w0dt2 = l.omega_0 * dt * l.omega_0 * dt;
    PoleStep s;
    s.cq = static_cast<real>((1 - 0.5 * l.gamma * dt) / den);
    s.cp = static_cast<real>(-w0dt2 / den);
    s.ce = static_cast<real>(l.delta_eps * w0dt2 / den);
    s.keeps_p = true;
    r.poles.push_back(s);
  }
  for (const materials::CriticalPoint& cp : p.critical_points) {
    const materials::CriticalPointAde a = materials::critical_point_ade(cp);
    const double half = 0.5 * a.damping * dt, den = 1 + half;
    PoleStep s;
    s.cq = static_cast<real>((1 - half) / den);
    s.cp = static_cast<real>(-a.omega0_sq * dt * dt / den);
    s.ce = static_cast<real>(a.a0 * dt * dt / den);
    s.cm = static_cast<real>(-0.5 * a.a1 * dt / den);
    s.implicit = static_cast<real>(0.5 * a.a1 * dt / den);
    s.keeps_p = true;
    r.poles.push_back(s);
  }
  return r;
}

double step_branch(const BranchResponse& a, const BranchResponse* b, double wa, real& e, real& e_previous, real* q,
                   real* p, double dD) {
  const double wb = 1 - wa;
  const real en = e, ep = e_previous;
  double sum_q = 0, implicit = 0;
  auto poles = [&](const BranchResponse& r, double w, std::size_t first) {
    for (std::size_t k = 0; k < r.poles.size(); ++k) {
      const PoleStep& st = r.poles[k];
      real qn = st.cq * q[first + k] + st.ce * en + st.cm * ep;
      if (st.keeps_p) qn += st.cp * p[first + k];
      q[first + k] = qn;
      if (st.keeps_p && st.implicit == 0) p[first + k] += qn;  // Lorentz: P^{n+1} now; critical points after E
      sum_q += w * qn;
      implicit += w * st.implicit;
    }
  };
  poles(a, wa, 0);
  if (b) poles(*b, wb, a.poles.size());
  const double eps = wa * a.eps_inf + (b ? wb * b->eps_inf : 0);
  const double loss = wa * a.loss + (b ? wb * b->loss : 0);
  const double e_new = ((eps - 0.5 * loss) * en + dD - sum_q) / (eps + 0.5 * loss + implicit);
  auto finish = [&](const BranchResponse& r, std::size_t first) {
    for (std::size_t k = 0; k < r.poles.size(); ++k) {
      const PoleStep& st = r.poles[k];
      if (st.implicit == 0) continue;
      q[first + k] += st.implicit * static_cast<real>(e_new);
      p[first + k] += q[first + k];
    }
  };
  finish(a, 0);
  if (b) finish(*b, a.poles.size());
  e_previous = en;
  e = static_cast<real>(e_new);
  return e_new;
}

}  // namespace yeegap::solver
