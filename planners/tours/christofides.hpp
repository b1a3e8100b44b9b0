#pragma once
// Christofides' construction (1976) for symmetric costs: minimum spanning tree, plus a
// minimum-weight perfect matching on its odd-degree cities (Edmonds' blossom algorithm,
// minimum_weight_matching.hpp), then an Euler circuit (Hierholzer) with repeated cities
// skipped. Under the triangle inequality the tour costs at most 1.5 times the optimum.
// The matching takes O(k^3) time for k odd cities; above kLargestExactMatching odd cities the
// greedy matching with pair exchanges (greedy_matching.hpp) is used instead, the guarantee is
// lost, and the result says so (the planner then names the method
// "christofides-greedy-matching").

#include "planners/tours/closed_tour.hpp"

#include <cstddef>

namespace ringroad::planners::tours {

// Measured on the development machine (Release, idle), random plane points: the blossom
// matching takes 0.001 s at 100 odd cities, 0.02-0.03 s at 500, 0.12-0.15 s at 1000 and
// 0.27 s at 1500 (2-4 times longer while other jobs share the two cores); the TSPLIB odd sets
// are quicker (pcb442: 192 in 0.009 s, rat575: 272 in 0.005 s, dsj1000: 428 in 0.02 s).
// 1000 keeps the matching near a tenth of the default 1 s limit.
inline constexpr std::size_t kLargestExactMatching = 1000;

struct ChristofidesTour {
    ClosedTour tour;
    bool minimum_weight_matching = true;  // false: the greedy fallback was used
};

ChristofidesTour christofides(const matrices::CostMatrix& costs, int start,
                              std::size_t largest_exact_matching = kLargestExactMatching);

// The tour alone (same rules as christofides()).
ClosedTour christofides_tour(const matrices::CostMatrix& costs, int start);

} // namespace ringroad::planners::tours
