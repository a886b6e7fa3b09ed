// Storage of one scalar field on the local block with one halo layer on every side, x fastest,
// 64-byte aligned. Index (i, j, k) runs over [-1, n] per axis; (0..n-1) is the interior. The halo
// holds periodic copies, the wall nodes of bounded axes (always zero for tangential E), and in a
// decomposed run the neighbour's values.
#pragma once

#include <array>
#include <cstddef>
#include <cstdlib>
#include <memory>
#include <new>
#include <vector>

namespace yeegap::solver {

template <class T>
struct AlignedAllocator {
  using value_type = T;
  static constexpr std::size_t alignment = 64;
  AlignedAllocator() = default;
  template <class U>
  AlignedAllocator(const AlignedAllocator<U>&) {}
  T* allocate(std::size_t n) {
    const std::size_t bytes = ((n * sizeof(T) + alignment - 1) / alignment) * alignment;
    void* p = std::aligned_alloc(alignment, bytes);
    if (!p) throw std::bad_alloc();
    return static_cast<T*>(p);
  }
  void deallocate(T* p, std::size_t) { std::free(p); }
  template <class U>
  bool operator==(const AlignedAllocator<U>&) const { return true; }
};

/// Strides of a block with one halo layer: flat = (i+1) + (j+1)*sy + (k+1)*sz.
struct BlockLayout {
  std::array<int, 3> n{};
  std::ptrdiff_t sy = 0, sz = 0;
  std::size_t total = 0;

  static BlockLayout of(std::array<int, 3> cells) {
    BlockLayout l;
    l.n = cells;
    l.sy = cells[0] + 2;
    l.sz = l.sy * (cells[1] + 2);
    l.total = static_cast<std::size_t>(l.sz) * (cells[2] + 2);
    return l;
  }
  std::ptrdiff_t at(int i, int j, int k) const { return (i + 1) + (j + 1) * sy + (k + 1) * sz; }
  /// The cell index (i, j, k) of a flat offset: the inverse of at().
  std::array<int, 3> index_of(std::ptrdiff_t o) const {
    const std::ptrdiff_t r = o % sz;
    return {static_cast<int>(r % sy) - 1, static_cast<int>(r / sy) - 1, static_cast<int>(o / sz) - 1};
  }
  std::ptrdiff_t stride(int axis) const { return axis == 0 ? 1 : (axis == 1 ? sy : sz); }
};

template <class T>
using AlignedVector = std::vector<T, AlignedAllocator<T>>;

}  // namespace yeegap::solver

namespace yeegap::solver {
/// Whether a loop over this many cells is worth an OpenMP team: below about 32k cell updates the
/// fork/join costs more than it saves (measured on small test grids; common practice).
inline bool parallel_worth(long long cells) { return cells >= 32768; }
inline bool parallel_worth(int nx, int ny, int nz) { return parallel_worth(1LL * nx * ny * nz); }

/// body(i) for i from lo to hi - 1: over the threads when `parallel`, else on the calling thread
/// without entering an OpenMP region. `omp parallel for if(false)` still builds and ends a team of
/// one (2 to 4 us each with GCC 12's libgomp, measured), and a step of a 1D problem (an angle-scan
/// run) passes dozens of such loops, each far smaller than that.
template <class Index, class Body>
inline void for_each_index(bool parallel, Index lo, Index hi, const Body& body) {
  if (parallel) {
#pragma omp parallel for schedule(static)
    for (Index i = lo; i < hi; ++i) body(i);
  } else {
    for (Index i = lo; i < hi; ++i) body(i);
  }
}
}  // namespace yeegap::solver
