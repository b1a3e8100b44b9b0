#pragma once
// Missing entries (no connection) in a tour problem. The heuristics need finite numbers (gains
// of inf - inf are meaningless), so a missing entry is replaced by a penalty above the cost of
// any tour made of available entries: a tour that still uses one is recognised afterwards and
// reported. Before searching, the cheap necessary conditions are checked so that the usual
// causes (an isolated stop, a stop outside the start's reach) get a message naming the stop.

#include "planners/matrices/cost_matrix.hpp"
#include "planners/tours/tour_planner.hpp"

namespace ringroad::planners::tours {

// 1 + the sum over stops of their most expensive available outgoing entry: no tour (nor open
// trip) made of available entries costs this much.
double tour_cost_ceiling(const matrices::CostMatrix& costs);

matrices::CostMatrix with_missing_entries_as(const matrices::CostMatrix& costs, double penalty);

// Throws InputError naming a stop that cannot be left, entered or reached as the trip needs.
void check_stops_connectable(const matrices::CostMatrix& costs, const TourRequest& request);

} // namespace ringroad::planners::tours
