#include "planners/tours/missing_entries.hpp"

#include "common/input_error.hpp"

#include <algorithm>
#include <string>
#include <vector>

namespace ringroad::planners::tours {
namespace {

// Stops reachable from `origin` through available entries (forward, or backward when
// `reverse`), by breadth-first search on the dense matrix.
std::vector<bool> reachable(const matrices::CostMatrix& costs, std::size_t origin, bool reverse) {
    const std::size_t n = costs.size();
    std::vector<bool> seen(n, false);
    std::vector<std::size_t> frontier{origin};
    seen[origin] = true;
    while (!frontier.empty()) {
        const std::size_t stop = frontier.back();
        frontier.pop_back();
        for (std::size_t other = 0; other < n; ++other)
            if (!seen[other] && (reverse ? costs.has(other, stop) : costs.has(stop, other))) {
                seen[other] = true;
                frontier.push_back(other);
            }
    }
    return seen;
}

} // namespace

double tour_cost_ceiling(const matrices::CostMatrix& costs) {
    double ceiling = 1.0;
    for (std::size_t from = 0; from < costs.size(); ++from) {
        double largest = 0.0;
        for (std::size_t to = 0; to < costs.size(); ++to)
            if (from != to && costs.has(from, to)) largest = std::max(largest, costs(from, to));
        ceiling += largest;
    }
    return ceiling;
}

matrices::CostMatrix with_missing_entries_as(const matrices::CostMatrix& costs, double penalty) {
    matrices::CostMatrix finite(costs.size(), 0.0);
    for (std::size_t from = 0; from < costs.size(); ++from)
        for (std::size_t to = 0; to < costs.size(); ++to)
            finite(from, to) = from == to ? 0.0 : (costs.has(from, to) ? costs(from, to) : penalty);
    return finite;
}

void check_stops_connectable(const matrices::CostMatrix& costs, const TourRequest& request) {
    const std::size_t n = costs.size();
    if (n < 2) return;
    const bool closed = request.shape == TripShape::closed ||
                        (request.shape == TripShape::open_fixed_end && request.end == request.start);
    const std::size_t finish = closed ? request.start : request.end;
    for (std::size_t stop = 0; stop < n; ++stop) {
        bool can_leave = false, can_enter = false;
        for (std::size_t other = 0; other < n; ++other) {
            if (other == stop) continue;
            can_leave = can_leave || costs.has(stop, other);
            can_enter = can_enter || costs.has(other, stop);
        }
        const bool must_leave = closed || (request.shape == TripShape::open_fixed_end ? stop != finish : stop == request.start);
        const bool must_enter = closed || stop != request.start;
        if (must_leave && !can_leave)
            throw InputError("no tour exists: " + describe_stop(request, stop) + " has no connection to any other stop",
                             "stops");
        if (must_enter && !can_enter)
            throw InputError("no tour exists: " + describe_stop(request, stop) + " has no connection from any other stop",
                             "stops");
    }
    const std::vector<bool> from_start = reachable(costs, request.start, false);
    for (std::size_t stop = 0; stop < n; ++stop)
        if (!from_start[stop])
            throw InputError("no tour exists: " + describe_stop(request, stop) + " cannot be reached from the start " +
                                 describe_stop(request, request.start),
                             "stops");
    if (closed || request.shape == TripShape::open_fixed_end) {
        const std::vector<bool> to_finish = reachable(costs, finish, true);
        for (std::size_t stop = 0; stop < n; ++stop)
            if (!to_finish[stop])
                throw InputError("no tour exists: " + describe_stop(request, stop) + " cannot reach the " +
                                     (closed ? "start " : "end ") + describe_stop(request, finish),
                                 "stops");
    }
}

} // namespace ringroad::planners::tours
