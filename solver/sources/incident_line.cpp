// 1D incident-wave grid (see incident_line.h).
#include "solver/sources/incident_line.h"
#include "solver/engine/simulation_state.h"

#include <algorithm>
#include <cmath>

#include "base/constants.h"
#include "base/errors.h"

namespace yeegap::solver {

namespace {
// Absorber of the 1D line: 60 cells, cubic grading, design reflection 1e-12. In 1D this costs
// nothing and keeps the line's own reflections far below anything the 3D box could show.
constexpr int absorber_cells = 60;
constexpr double absorber_order = 3.0;
constexpr double absorber_reflection = 1e-12;
// Cells between the absorber and the source sheet, and between the sheet and the first 3D node.
constexpr int source_gap = 4;
}  // namespace

IncidentLine::IncidentLine(const Grid& g, int axis, int sign, double eps_r, double amplitude, const Waveform& w,
                           int first, int last, double dt)
    : axis_(axis), sign_(sign), time_(w), amplitude_(amplitude), eta_(constants::eta0 / std::sqrt(eps_r)) {
  YG_CHECK(sign == 1 || sign == -1, "propagation sign must be +1 or -1");
  // Layout along the 3D index: [absorber][gap][source][gap] first .. last [gap][absorber].
  const int pad = absorber_cells + 2 * source_gap + 1;
  offset_ = first - pad;
  const int count = (last + pad) - offset_ + 1;
  source_ = sign > 0 ? absorber_cells + source_gap : count - 1 - absorber_cells - source_gap;
  // Spacing: the 3D grid's own inside it, its edge cell repeated outside.
  auto spacing = [&](int i3) { return g.primal(axis, std::clamp(i3, 0, g.n[axis] - 1)); };
  const double eps = constants::eps0 * eps_r;
  const double d_edge = spacing(0);
  const double sigma_max = -(absorber_order + 1) * std::log(absorber_reflection) /
                           (2.0 * eta_ * absorber_cells * d_edge);
  auto sigma_at = [&](double pos) {  // pos: line position in cells (may be half-integer)
    const double depth_lo = absorber_cells - pos, depth_hi = pos - (count - 1 - absorber_cells);
    const double depth = std::max(depth_lo, depth_hi) / absorber_cells;
    return depth > 0 ? sigma_max * std::pow(std::min(depth, 1.0), absorber_order) : 0.0;
  };
  e_.assign(count, 0.0);
  h_.assign(count, 0.0);
  ce_a_.resize(count), ce_b_.resize(count), ch_a_.resize(count), ch_b_.resize(count);
  inv_dual_.resize(count), inv_primal_.resize(count);
  for (int i = 0; i < count; ++i) {
    const int i3 = i + offset_;
    inv_primal_[i] = 1.0 / spacing(i3);
    inv_dual_[i] = 2.0 / (spacing(i3 - 1) + spacing(i3));
    const double se = sigma_at(i), sh = sigma_at(i + 0.5) * constants::mu0 / eps;  // matched: sigma*/mu0 = sigma/eps
    ce_a_[i] = (1 - se * dt / (2 * eps)) / (1 + se * dt / (2 * eps));
    ce_b_[i] = (dt / eps) / (1 + se * dt / (2 * eps));
    ch_a_[i] = (1 - sh * dt / (2 * constants::mu0)) / (1 + sh * dt / (2 * constants::mu0));
    ch_b_[i] = (dt / constants::mu0) / (1 + sh * dt / (2 * constants::mu0));
  }
}

void IncidentLine::advance_h() {
  const std::size_t n = h_.size();
  for (std::size_t i = 0; i + 1 < n; ++i)
    h_[i] = ch_a_[i] * h_[i] - sign_ * ch_b_[i] * (e_[i + 1] - e_[i]) * inv_primal_[i];
}

void IncidentLine::advance_e(double t_h) {
  const std::size_t n = e_.size();
  for (std::size_t i = 1; i < n; ++i) e_[i] = ce_a_[i] * e_[i] - sign_ * ce_b_[i] * (h_[i] - h_[i - 1]) * inv_dual_[i];
  // A sheet of surface current K radiates E = -(eta/2) K to both sides; K = -(2/eta) A s(t) makes
  // the travelling wave's E follow A s(t) (up to the grid's own small dispersion, which the
  // recorded incident spectrum accounts for).
  const double k_sheet = -(2.0 / eta_) * amplitude_ * time_.moment(t_h);
  e_[source_] -= ce_b_[source_] * k_sheet * inv_dual_[source_];
}

void IncidentLine::add_state(StateArrays& s, const std::string& prefix) {
  s.add_vector(prefix + "/e", e_);
  s.add_vector(prefix + "/h", h_);
}

}  // namespace yeegap::solver
