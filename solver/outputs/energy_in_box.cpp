// The energy-in-a-box output (energy_in_box.h): a sum over the box's cells after every half step,
// plane by plane in a fixed order so any thread count gives the same bits; its result is a record.
#include "solver/outputs/energy_in_box.h"

#include <algorithm>

#include <fmt/format.h>

#include "base/constants.h"
#include "base/errors.h"
#include "solver/engine/simulation_state.h"

namespace yeegap::solver {

EnergyRecorder::EnergyRecorder(const EnergySpec& spec, const Scene& scene, const Grid& g, const BlockLayout& L,
                               const MaterialIndex& mi)
    : spec_(spec), grid_(g), layout_(L), mindex_(mi) {
  for (const auto& m : scene.materials) eps_.push_back(constants::eps0 * m.poles.eps_inf);
  for (int a = 0; a < 3; ++a) {
    first_[a] = g.n[a];
    last_[a] = -1;
    for (int i = 0; i < g.n[a]; ++i) {
      const double centre = 0.5 * (g.nodes[a][i] + g.nodes[a][i + 1]);
      if (g.invariant(a) || (centre >= spec.region.lo[a] && centre <= spec.region.hi[a]))
        first_[a] = std::min(first_[a], i), last_[a] = std::max(last_[a], i);
    }
    YG_CHECK(first_[a] <= last_[a], fmt::format("energy '{}': no cell centre lies inside the box along {}", spec.name,
                                                "xyz"[a]));
  }
}

double EnergyRecorder::sum(const Fields& f, bool electric) const {
  const int planes = last_[2] - first_[2] + 1;
  std::vector<double>& per_plane = per_plane_;
  per_plane.assign(planes, 0.0);
#pragma omp parallel for schedule(static)
  for (int p = 0; p < planes; ++p) {
    const int k = first_[2] + p;
    double s = 0;
    for (int j = first_[1]; j <= last_[1]; ++j)
      for (int i = first_[0]; i <= last_[0]; ++i) {
        const std::ptrdiff_t o = layout_.at(i, j, k);
        double w = 0;
        for (int c = 0; c < 3; ++c) {
          const double v = f.c[electric ? c : 3 + c][o];
          w += (electric ? eps_[mindex_.e[c][o]] : constants::mu0) * v * v;
        }
        s += 0.5 * w * grid_.primal(0, i) * grid_.primal(1, j) * grid_.primal(2, k);
      }
    per_plane[p] = s;
  }
  double total = 0;
  for (double s : per_plane) total += s;
  return total;
}

void EnergyRecorder::sample(const Fields& f, bool electric, const SampleTime& when) {
  (electric ? time_ : magnetic_time_).push_back(when.t);
  (electric ? electric_ : magnetic_).push_back(sum(f, electric));
}

void EnergyRecorder::add_state(StateArrays& s, const std::string& prefix) {
  s.add_vector(prefix + "/time", time_);
  s.add_vector(prefix + "/electric", electric_);
  s.add_vector(prefix + "/magnetic_time", magnetic_time_);
  s.add_vector(prefix + "/magnetic", magnetic_);
}

void EnergyRecorder::prepare_resume(long steps) {
  for (auto* v : {&time_, &electric_, &magnetic_time_, &magnetic_}) v->resize(static_cast<std::size_t>(steps));
}

void EnergyRecorder::add_result(RunResults& r, const ResultInputs&, const Recorder*) const {
  Record rec("energy", spec_.name);
  // H is stepped half a step before E: the total at an E time takes the mean of the H energies
  // half a step either side (the last one only the one before).
  std::vector<double> total(electric_.size());
  for (std::size_t n = 0; n < total.size(); ++n)
    total[n] = electric_[n] + (n + 1 < magnetic_.size() ? 0.5 * (magnetic_[n] + magnetic_[n + 1]) : magnetic_[n]);
  const std::vector<double> from{grid_.nodes[0][first_[0]], grid_.nodes[1][first_[1]], grid_.nodes[2][first_[2]]};
  const std::vector<double> to{grid_.nodes[0][last_[0] + 1], grid_.nodes[1][last_[1] + 1], grid_.nodes[2][last_[2] + 1]};
  rec.set("box_from", from);
  rec.set("box_to", to);
  rec.add("time", "s", time_, "times of the E updates");
  rec.add("electric", "J", electric_, "1/2 sum eps E^2 dV over the box's cells, at time");
  rec.add("magnetic_time", "s", magnetic_time_, "times of the H updates, half a step before time");
  rec.add("magnetic", "J", magnetic_, "1/2 sum mu0 H^2 dV over the box's cells, at magnetic_time");
  rec.add("total", "J", total, "electric + the mean of the magnetic energies half a step either side, at time");
  std::size_t peak = 0;
  for (std::size_t n = 1; n < total.size(); ++n)
    if (total[n] > total[peak]) peak = n;
  const double peak_value = total.empty() ? 0.0 : total[peak], peak_time = total.empty() ? 0.0 : time_[peak];
  const double final_value = total.empty() ? 0.0 : total.back();
  rec.headlines = {{"total_peak", "J", "largest energy in the box", peak_value},
                   {"total_peak_time", "s", "when the energy in the box is largest", peak_time},
                   {"total_final", "J", "energy in the box when the run ended", final_value}};
  rec.summary.heading = fmt::format("  energy {}: {} samples, cells {}..{} x {}..{} x {}..{}", spec_.name, time_.size(),
                                    first_[0], last_[0], first_[1], last_[1], first_[2], last_[2]);
  rec.summary.rows.push_back(SummaryRow({{"peak", peak_value, "{:.5g}", 1, "    peak ", " J"},
                                        {"peak_time", peak_time, "{:.4g}", 1e15, " at ", " fs"},
                                        {"final", final_value, "{:.5g}", 1, ", at the end ", " J"}},
                                       false));  // the terminal shows the headlines instead
  rec.summary.json_object = true;
  r.records.push_back(std::move(rec));
}

}  // namespace yeegap::solver
