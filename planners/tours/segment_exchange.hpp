#pragma once
// Segment exchange: the reversal-free 3-opt move. Removing a->a', b->b', c->c' (in tour order)
// and adding a->b', c->a', b->c' swaps the stretches a'..b and b'..c without turning either
// round, so it is valid for asymmetric costs. b' comes from a's successor candidates and c'
// from b's, which keeps the search O(k^2) per city.

#include "planners/tours/local_search.hpp"

namespace ringroad::planners::tours {

bool improve_by_segment_exchange(SearchState& state, int city);

} // namespace ringroad::planners::tours
