// Notes on where things sit that run but are probably not what was meant: a body wholly outside
// the domain (it changes nothing), a bounded body reaching into an absorbing layer (the layer is
// designed for the background, so the body's part there is absorbed imperfectly and reflects), and
// a dipole inside a conducting body (its power goes into the metal). For `check` to print.
#pragma once

#include <string>
#include <vector>

#include "solver/grid.h"
#include "solver/scene.h"

namespace yeegap::solver {

std::vector<std::string> placement_notes(const Scene& s, const Grid& g);

}  // namespace yeegap::solver
