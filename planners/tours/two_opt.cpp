#include "planners/tours/two_opt.hpp"

namespace ringroad::planners::tours {

bool improve_by_two_opt(SearchState& state, int a) {
    ArrayTour& tour = state.tour;
    for (int direction = 0; direction < 2; ++direction) {
        auto after = [&](int city) { return direction == 0 ? tour.next(city) : tour.previous(city); };
        const int b = after(a);
        const double removed_ab = state.c(a, b);
        for (const int* candidate = state.successors.begin(a); candidate != state.successors.end(a); ++candidate) {
            ++tour.work;
            const int c = *candidate;
            const double first_gain = removed_ab - state.c(a, c);
            if (first_gain <= state.epsilon) continue;
            const int d = after(c);
            if (c == b || d == a) continue;
            const double gain = first_gain + state.c(c, d) - state.c(b, d);
            if (gain > state.epsilon) {
                tour.two_opt_move(a, b, c, d);
                state.cost -= gain;
                state.activate({a, b, c, d});
                return true;
            }
        }
    }
    return false;
}

} // namespace ringroad::planners::tours
