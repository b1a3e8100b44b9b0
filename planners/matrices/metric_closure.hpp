#pragma once
// metric_closure: replaces every entry by the cheapest chain of entries between the same two
// stops (Floyd–Warshall), so the result satisfies the triangle inequality and fills missing entries
// that some chain connects. A tour or network over the closure uses "c(a,b)" to mean "the cheapest
// way from a to b through other stops"; the output must say the closure was used.
// O(n^3) time: about a second for 1000 stops; n^2 extra memory for the copy.

#include "planners/matrices/cost_matrix.hpp"

#include <cstddef>

namespace ringroad::planners::matrices {

struct MetricClosure {
    CostMatrix costs;
    std::size_t entries_shortened = 0;   // finite entries that a chain beats
    std::size_t entries_filled = 0;      // missing entries that a chain connects
};

MetricClosure metric_closure(const CostMatrix& costs);

} // namespace ringroad::planners::matrices
