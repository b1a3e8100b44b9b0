#pragma once
// Christofides' construction (1976) for symmetric costs: minimum spanning tree, plus a perfect
// matching on its odd-degree cities, then an Euler circuit (Hierholzer) with repeated cities
// skipped.
// The matching here is NOT the minimum-weight perfect matching of the original method, so the
// 1.5-times-optimal guarantee does not hold: it is a greedy matching (cheapest pairs first)
// improved by pair exchanges ({a,b},{c,d} -> {a,c},{b,d} or {a,d},{b,c}) until none helps.
// Reason: the blossom implementation in Boost 1.74 (boost/graph/maximum_weighted_matching.hpp)
// crashed (segmentation fault in base_vertex) on the odd vertices of TSPLIB pcb442 here, and a
// construction only needs a good start for local search. The method string names it
// "christofides-greedy-matching".

#include "router/planners/closed_tour.hpp"

namespace ringroad::planners {

ClosedTour christofides_tour(const CostMatrix& costs, int start);

} // namespace ringroad::planners
