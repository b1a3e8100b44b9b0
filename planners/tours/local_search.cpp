#include "planners/tours/local_search.hpp"

#include "planners/tours/or_opt.hpp"
#include "planners/tours/segment_exchange.hpp"
#include "planners/tours/two_opt.hpp"

namespace ringroad::planners::tours {

void run_local_search(SearchState& state, bool symmetric) {
    while (!state.active.empty()) {
        const int city = state.active.pop();
        if (symmetric) {
            if (improve_by_two_opt(state, city)) continue;
            improve_by_or_opt(state, city);
        } else {
            if (improve_by_directed_or_opt(state, city)) continue;
            improve_by_segment_exchange(state, city);
        }
    }
}

} // namespace ringroad::planners::tours
