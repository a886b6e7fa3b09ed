// The six Yee field components of the local block (structure of arrays) and their layout.
#pragma once

#include <array>

#include "solver/engine/field.h"
#include "solver/real.h"
#include "solver/scene.h"

namespace yeegap::solver {

struct Fields {
  BlockLayout layout;
  std::array<AlignedVector<real>, 6> c;  // indexed by Component: Ex, Ey, Ez, Hx, Hy, Hz

  explicit Fields(const BlockLayout& l) : layout(l) {
    for (auto& f : c) f.assign(l.total, real(0));
  }
  AlignedVector<real>& operator[](Component k) { return c[static_cast<int>(k)]; }
  const AlignedVector<real>& operator[](Component k) const { return c[static_cast<int>(k)]; }
  real& at(Component k, int i, int j, int m) { return c[static_cast<int>(k)][layout.at(i, j, m)]; }
  real at(Component k, int i, int j, int m) const { return c[static_cast<int>(k)][layout.at(i, j, m)]; }
};

}  // namespace yeegap::solver
