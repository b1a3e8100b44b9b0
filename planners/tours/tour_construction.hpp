#pragma once
// Starting tours for local search.
//  * nearest neighbour: from the start, always go to the cheapest unvisited city;
//  * greedy edge (the "greedy" matching heuristic of Johnson & McGeoch): take connections in
//    order of cost whenever they keep every city at most one way in and one way out (both ends
//    for symmetric costs) and close no early cycle; the fragments are then chained by nearest
//    neighbour between fragment ends. With candidate lists, only candidate connections are
//    considered (O(n k log(n k)) instead of O(n^2 log n) time and memory, for large matrices).

#include "planners/tours/candidate_lists.hpp"
#include "planners/tours/closed_tour.hpp"

namespace ringroad::planners::tours {

ClosedTour nearest_neighbour_tour(const matrices::CostMatrix& costs, int start);
ClosedTour greedy_edge_tour(const matrices::CostMatrix& costs, bool symmetric, const CandidateLists* candidates = nullptr);

} // namespace ringroad::planners::tours
