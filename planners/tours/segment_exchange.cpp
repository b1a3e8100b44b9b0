#include "planners/tours/segment_exchange.hpp"

namespace ringroad::planners::tours {

bool improve_by_segment_exchange(SearchState& state, int a) {
    ArrayTour& tour = state.tour;
    const int cities = tour.size();
    if (cities < 4) return false;
    const int a_next = tour.next(a);
    const double removed_a = state.c(a, a_next);
    for (const int* b_next_candidate = state.successors.begin(a); b_next_candidate != state.successors.end(a);
         ++b_next_candidate) {
        ++tour.work;
        const int b_next = *b_next_candidate;
        const double first_gain = removed_a - state.c(a, b_next);
        if (first_gain <= state.epsilon) continue;
        const int b_steps = tour.forward_distance(a, b_next);  // position of b' counted from a
        if (b_steps < 2) continue;
        const int b = tour.previous(b_next);
        const double second_gain = first_gain + state.c(b, b_next);
        for (const int* c_next_candidate = state.successors.begin(b); c_next_candidate != state.successors.end(b);
             ++c_next_candidate) {
            ++tour.work;
            const int c_next = *c_next_candidate;
            int c_steps = tour.forward_distance(a, c_next);
            if (c_steps == 0) c_steps = cities;  // c' may be a itself
            if (c_steps <= b_steps) continue;
            const int c = tour.previous(c_next);
            const double gain = second_gain - state.c(b, c_next) + state.c(c, c_next) - state.c(c, a_next);
            if (gain <= state.epsilon) continue;
            tour.exchange_segments(tour.position(a), b_steps - 1, c_steps - b_steps);
            state.cost -= gain;
            state.activate({a, a_next, b, b_next, c, c_next});
            return true;
        }
    }
    return false;
}

} // namespace ringroad::planners::tours
