// Notes on where things sit that run but are probably not what was meant: a body wholly outside
// the domain (it changes nothing), a bounded body reaching into an absorbing layer (the layer is
// designed for the background, so the body's part there is absorbed imperfectly and reflects), and
// a dipole inside a conducting body (its power goes into the metal). Warnings where the results
// themselves suffer: a curved metal body on a staircase, a Drude metal in an absorber corner.
#pragma once

#include <string>
#include <vector>

#include "solver/engine/grid.h"
#include "solver/scene.h"

namespace yeegap::solver {

std::vector<std::string> placement_notes(const Scene& s, const Grid& g);
std::vector<std::string> placement_warnings(const Scene& s, const Grid& g);

}  // namespace yeegap::solver
