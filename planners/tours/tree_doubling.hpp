#pragma once
// The tree-doubling tour (Rosenkrantz, Stearns & Lewis 1977): a minimum spanning tree (Prim,
// O(n^2) on the dense matrix), walked depth first from the start with repeated cities skipped
// ("shortcuts"). Under the triangle inequality it costs at most twice the optimum. For
// asymmetric matrices the tree is built on min(c(i,j), c(j,i)) and there is no such guarantee.

#include "planners/tours/closed_tour.hpp"

#include <cstddef>
#include <optional>
#include <vector>

namespace ringroad::planners::tours {

// parent[v] of each city in a minimum spanning tree rooted at `root` (parent[root] == -1),
// over the symmetric costs min(c(i,j), c(j,i)).
std::vector<int> minimum_tree_parents(const matrices::CostMatrix& costs, int root);

ClosedTour tree_doubling_tour(const matrices::CostMatrix& costs, int start);

// An open trip from the same tree: every stop once, starting at `start` and, when `end` is given,
// ending there (the tree path from start to end is walked once, every other branch visited on
// the way before it; the end's own branches come just before the end). Without an end, the walk
// stops wherever the depth-first order finishes. `costs` has no missing entries.
std::vector<std::size_t> tree_doubling_trip(const matrices::CostMatrix& costs, std::size_t start,
                                            std::optional<std::size_t> end);

} // namespace ringroad::planners::tours
