#pragma once
// The assignment bound for asymmetric tours: the cheapest way to give every city exactly one
// successor (no city its own), solved by the Hungarian method (Kuhn 1955; the O(n^3)
// shortest-augmenting-path form with potentials). A tour is such an assignment, so the value
// is a lower bound on any tour.

#include "planners/matrices/cost_matrix.hpp"

namespace ringroad::planners::tours {

double assignment_bound(const matrices::CostMatrix& costs);

} // namespace ringroad::planners::tours
