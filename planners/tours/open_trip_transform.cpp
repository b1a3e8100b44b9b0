#include "planners/tours/open_trip_transform.hpp"

#include <algorithm>
#include <utility>

namespace ringroad::planners::tours {

ClosedTripProblem close_trip(matrices::CostMatrix finite, bool symmetric, const TourRequest& request,
                             double free_end_constant, double unusable) {
    ClosedTripProblem problem;
    problem.start = static_cast<int>(request.start);
    const std::size_t n = finite.size();
    const bool closed = request.shape == TripShape::closed ||
                        (request.shape == TripShape::open_fixed_end && request.end == request.start);
    if (closed) {
        problem.costs = std::move(finite);
        return problem;
    }
    problem.costs = matrices::CostMatrix(n + 1, unusable);
    for (std::size_t from = 0; from < n; ++from)
        for (std::size_t to = 0; to < n; ++to) problem.costs(from, to) = finite(from, to);
    const std::size_t d = n;
    const std::size_t s = request.start;
    problem.costs(d, d) = 0.0;
    problem.joining_city = static_cast<int>(d);
    if (request.shape == TripShape::open_fixed_end) {
        problem.costs(request.end, d) = 0.0;
        problem.costs(d, s) = 0.0;
        if (symmetric) problem.costs(d, request.end) = problem.costs(s, d) = 0.0;
    } else if (symmetric) {
        for (std::size_t j = 0; j < n; ++j) problem.costs(d, j) = problem.costs(j, d) = free_end_constant;
        problem.costs(d, s) = problem.costs(s, d) = 0.0;
        problem.constant = free_end_constant;
    } else {
        for (std::size_t j = 0; j < n; ++j) problem.costs(j, d) = 0.0;
        problem.costs(d, s) = 0.0;
    }
    return problem;
}

std::vector<std::size_t> trip_order(const ClosedTripProblem& problem, const ClosedTour& tour, bool symmetric) {
    const std::size_t m = tour.size();
    const int anchor = problem.joining_city >= 0 ? problem.joining_city : -1;
    std::vector<std::size_t> order;
    if (anchor < 0) {
        const auto first = std::find(tour.begin(), tour.end(), problem.start);
        for (std::size_t k = 0; k < m; ++k)
            order.push_back(static_cast<std::size_t>(tour[(static_cast<std::size_t>(first - tour.begin()) + k) % m]));
        return order;
    }
    const std::size_t at = static_cast<std::size_t>(std::find(tour.begin(), tour.end(), anchor) - tour.begin());
    int step = 0;
    if (tour[(at + 1) % m] == problem.start) step = 1;
    else if (symmetric && tour[(at + m - 1) % m] == problem.start) step = -1;
    if (step == 0) return order;
    for (std::size_t k = 1; k < m; ++k)
        order.push_back(static_cast<std::size_t>(tour[(at + m + static_cast<std::size_t>(step) * k) % m]));
    return order;
}

} // namespace ringroad::planners::tours
