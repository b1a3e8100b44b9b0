#include "router/planners/local_search.hpp"

#include "router/planners/or_opt.hpp"
#include "router/planners/segment_exchange.hpp"
#include "router/planners/two_opt.hpp"

namespace ringroad::planners {

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

} // namespace ringroad::planners
