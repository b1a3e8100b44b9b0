#pragma once
// Or-opt (Or 1976): move a segment of 1-3 consecutive cities to another place in the tour.
//  * symmetric: the segment may be inserted either way round; realised as two or three 2-opt
//    moves so the array tour stays consistent;
//  * directed (asymmetric): the segment keeps its direction; realised as an exchange of the
//    segment with the shorter stretch between its old and new place.

#include "planners/tours/local_search.hpp"

namespace ringroad::planners::tours {

bool improve_by_or_opt(SearchState& state, int city);
bool improve_by_directed_or_opt(SearchState& state, int city);

} // namespace ringroad::planners::tours
