#pragma once
// 2-opt (Croes 1958) for symmetric costs: replace edges {a,b},{c,d} by {a,c},{b,d} when that is
// shorter, with c from a's candidate list, in both tour directions.

#include "planners/tours/local_search.hpp"

namespace ringroad::planners::tours {

// Applies the first improving 2-opt move at `city`; returns whether one was applied.
bool improve_by_two_opt(SearchState& state, int city);

} // namespace ringroad::planners::tours
