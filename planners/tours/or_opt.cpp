#include "planners/tours/or_opt.hpp"

namespace ringroad::planners::tours {
namespace {

constexpr int kLongestSegment = 3;

// Moves the segment s1..s2 (p before s1 and n after s2 in the direction in use) between x and
// y, where y follows x in that direction. `keep_direction` inserts x-s1..s2-y, otherwise
// x-s2..s1-y. Each step is a 2-opt move whose edge pair is adjacent in the current tour.
void move_segment(ArrayTour& tour, int p, int s1, int s2, int n, int x, int y, bool keep_direction) {
    if (y == p) {
        tour.two_opt_move(x, p, s2, n);
    } else if (x == n) {
        tour.two_opt_move(p, s1, n, y);
    } else {
        tour.two_opt_move(p, s1, x, y);
        tour.two_opt_move(p, x, n, s2);
    }
    if (keep_direction) tour.two_opt_move(x, s2, s1, y);
}

} // namespace

bool improve_by_or_opt(SearchState& state, int s1) {
    ArrayTour& tour = state.tour;
    const int cities = tour.size();
    for (int direction = 0; direction < 2; ++direction) {
        auto after = [&](int city) { return direction == 0 ? tour.next(city) : tour.previous(city); };
        auto before = [&](int city) { return direction == 0 ? tour.previous(city) : tour.next(city); };
        auto steps_from_s1 = [&](int city) {
            return direction == 0 ? tour.forward_distance(s1, city) : tour.forward_distance(city, s1);
        };
        int s2 = s1;
        for (int length = 1; length <= kLongestSegment && length + 3 <= cities; ++length) {
            if (length > 1) s2 = after(s2);
            const int p = before(s1);
            const int n = after(s2);
            const double removal_gain = state.c(p, s1) + state.c(s2, n) - state.c(p, n);
            if (removal_gain <= state.epsilon) continue;
            for (const int* candidate = state.successors.begin(s1); candidate != state.successors.end(s1); ++candidate) {
                ++tour.work;
                const int c = *candidate;
                if (steps_from_s1(c) < length) continue;  // inside the segment
                const double first_gain = removal_gain - state.c(c, s1);
                if (first_gain <= state.epsilon) continue;
                for (int side = 0; side < 2; ++side) {
                    const int d = side == 0 ? after(c) : before(c);
                    if (steps_from_s1(d) < length) continue;
                    const double gain = first_gain + state.c(c, d) - state.c(s2, d);
                    if (gain <= state.epsilon) continue;
                    // Insertion edges {c,s1} and {s2,d}; name the gap x->y in the direction in use.
                    if (side == 0) move_segment(tour, p, s1, s2, n, c, d, true);
                    else move_segment(tour, p, s1, s2, n, d, c, false);
                    state.cost -= gain;
                    state.activate({p, n, s1, s2, c, d});
                    return true;
                }
            }
        }
    }
    return false;
}

bool improve_by_directed_or_opt(SearchState& state, int city) {
    ArrayTour& tour = state.tour;
    const int cities = tour.size();
    // The segment either starts or ends at `city`.
    for (int anchor = 0; anchor < 2; ++anchor) {
        for (int length = 1; length <= kLongestSegment && length + 3 <= cities; ++length) {
            const int s1 = anchor == 0 ? city : tour.at(tour.position(city) - length + 1);
            const int s2 = tour.at(tour.position(s1) + length - 1);
            const int p = tour.previous(s1);
            const int n = tour.next(s2);
            // No pruning on the removal gain: without the triangle inequality (travel times
            // often lack it) an insertion can gain more than the removal loses.
            const double removal_gain = state.c(p, s1) + state.c(s2, n) - state.c(p, n);
            auto outside = [&](int other) { return tour.forward_distance(s1, other) >= length; };
            auto try_gap = [&](int x, int y) {
                ++tour.work;
                if (!outside(x) || !outside(y) || x == p) return false;
                const double gain = removal_gain - (state.c(x, s1) + state.c(s2, y) - state.c(x, y));
                if (gain <= state.epsilon) return false;
                // Exchange the segment with whichever stretch between old and new place is shorter.
                const int after_length = tour.forward_distance(n, x) + 1;   // n..x
                const int before_length = tour.forward_distance(y, p) + 1;  // y..p
                if (after_length <= before_length) tour.exchange_segments(tour.position(p), length, after_length);
                else tour.exchange_segments(tour.position(x), before_length, length);
                state.cost -= gain;
                state.activate({p, n, s1, s2, x, y});
                return true;
            };
            for (const int* x = state.predecessors.begin(s1); x != state.predecessors.end(s1); ++x)
                if (try_gap(*x, tour.next(*x))) return true;
            for (const int* y = state.successors.begin(s2); y != state.successors.end(s2); ++y)
                if (try_gap(tour.previous(*y), *y)) return true;
        }
    }
    return false;
}

} // namespace ringroad::planners::tours
