#pragma once
// A quick perfect matching on a complete graph with an even number of vertices: cheapest pairs
// first (greedy), then pair exchanges ({a,b},{c,d} -> {a,c},{b,d} or {a,d},{b,c}, c among the
// ten nearest of a) until none helps. No optimality promise; sorting takes O(n^2 log n). Used by
// Christofides' construction when the odd vertices are too many for the exact matching in time,
// and by the tests as the baseline the exact matching must never exceed.

#include "planners/matrices/cost_matrix.hpp"

#include <vector>

namespace ringroad::planners::tours {

// mate[v] for every vertex; the matrix is assumed symmetric and its size even.
std::vector<int> greedy_perfect_matching(const matrices::CostMatrix& costs);

} // namespace ringroad::planners::tours
