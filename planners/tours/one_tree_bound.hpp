#pragma once
// The Held–Karp lower bound (Held & Karp 1970, 1971): the cheapest 1-tree (a spanning tree on
// cities 1..n-1 plus the two cheapest edges of city 0) under city penalties pi, maximised over
// pi by subgradient optimisation with the Held–Wolfe–Crowder (1974) step
// t = lambda (upper - value) / |g|^2, lambda halved (and pi reset to the best) when the bound
// stalls. Every 1-tree value
// is a valid lower bound on any tour, whatever pi, so stopping early is safe.
// Symmetric costs only. `forced_partner[v]` (or -1) names a city whose edge to v every tour
// uses; the 1-tree is then restricted to contain those edges, which is how the asymmetric
// problem is bounded through its 2n-city symmetric transformation (see asymmetric_bound.hpp).

#include "planners/matrices/cost_matrix.hpp"

#include <cstddef>
#include <vector>

namespace ringroad::planners::tours {

struct OneTreeBound {
    double value = 0.0;
    std::vector<double> penalties;  // pi of the best bound
    bool tour_found = false;        // the best 1-tree was a tour: the bound is the optimum
    std::size_t iterations = 0;
};

OneTreeBound held_karp_one_tree_bound(const matrices::CostMatrix& costs, double upper_bound, std::size_t max_iterations,
                                      const std::vector<int>& forced_partner = {});

} // namespace ringroad::planners::tours
