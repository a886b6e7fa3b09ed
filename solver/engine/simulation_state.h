// The state of a run as named raw arrays viewed in place, for checkpoints: everything a later step
// reads that an earlier step wrote (fields with their halos, pole currents, CPML psi terms, the
// incident lines of plane waves, every running DFT and probe series, the source spectra) plus a few
// counters. io/ writes and reads these views; the solver never sees a file format (DEVELOPERS.md).
#pragma once

#include <complex>
#include <cstddef>
#include <span>
#include <string>
#include <vector>

namespace yeegap::solver {

/// One array of the state, not owned: the view stays valid until the Simulation changes size
/// (restore_counters resizes the probe series).
struct StateArray {
  enum class Type { f32, f64, c128 };
  std::string name;        // stable, path-like: "fields/Ex", "cpml/slab0/psi2", "outputs/3/box1"
  Type type = Type::f64;
  void* data = nullptr;
  std::size_t count = 0;   // elements of `type`
  std::size_t bytes() const { return count * (type == Type::f32 ? 4 : type == Type::f64 ? 8 : 16); }
};

const char* type_name(StateArray::Type t);

/// Collects the views; each part of a run adds its arrays under a prefix it is given.
class StateArrays {
 public:
  void add(std::string name, std::span<float> data) { add(std::move(name), StateArray::Type::f32, data.data(), data.size()); }
  void add(std::string name, std::span<double> data) { add(std::move(name), StateArray::Type::f64, data.data(), data.size()); }
  void add(std::string name, std::span<std::complex<double>> data) {
    add(std::move(name), StateArray::Type::c128, data.data(), data.size());
  }
  /// Any contiguous container of float, double or complex<double>.
  template <class Vector>
  void add_vector(std::string name, Vector& v) {
    add(std::move(name), std::span(v.data(), v.size()));
  }
  /// Adds every array of `other` with `prefix` + "/" before its name: the parts of a run made of
  /// several Simulations ("real/fields/Ex", "imaginary/fields/Ex").
  void add_all(const std::string& prefix, StateArrays&& other) {
    for (StateArray& a : other.list_) add(prefix + "/" + a.name, a.type, a.data, a.count);
  }
  const std::vector<StateArray>& list() const& { return list_; }
  std::vector<StateArray> list() && { return std::move(list_); }  // safe on a temporary
  std::size_t bytes() const;

 private:
  void add(std::string name, StateArray::Type type, void* data, std::size_t count);
  std::vector<StateArray> list_;
};

/// The counters of a run between two steps.
struct StateCounters {
  long step = 0;               // steps done
  double peak_energy = 0;      // J, the decay stop rule's memory: largest field energy measured
  double last_energy = 0;      // J, the last one measured
  double wall_seconds = 0;     // s, run time so far (reports only; never changes a result)
};

struct Grid;

/// What a checkpoint needs of a run (style.md: an optional ability gets its own small interface).
/// A run made of several Simulations (the real and imaginary parts of Bloch fields) lists all of
/// their arrays under one prefix each. A run built from the same scene and given the counters and
/// arrays of another between two steps continues bit for bit as the other would.
class Checkpointable {
 public:
  virtual ~Checkpointable() = default;
  virtual const Grid& grid() const = 0;
  virtual double dt() const = 0;                 // s
  virtual StateCounters state_counters() const = 0;
  /// Sets the counters and sizes the arrays that grow with the step count (probe series), so that
  /// state_arrays() can then be filled from a checkpoint.
  virtual void restore_counters(const StateCounters& c) = 0;
  /// Views of every array of the state in a fixed order, sized for the current step count.
  virtual StateArrays state_arrays() = 0;
};

}  // namespace yeegap::solver
