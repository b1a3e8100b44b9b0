#pragma once
// Test helpers: the optimum by trying every order (std::next_permutation), the independent
// reference for small matrices, and random matrices.

#include "planners/matrices/cost_matrix.hpp"
#include "planners/tours/tour_planner.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <random>
#include <vector>

namespace ringroad::test {

inline double brute_force_optimum(const planners::matrices::CostMatrix& costs, const planners::tours::TourRequest& request) {
    const std::size_t n = costs.size();
    std::vector<std::size_t> middle;
    for (std::size_t stop = 0; stop < n; ++stop)
        if (stop != request.start) middle.push_back(stop);
    double best = planners::matrices::kMissingCost;
    do {
        if (request.shape == planners::tours::TripShape::open_fixed_end && request.end != request.start &&
            middle.back() != request.end)
            continue;
        double total = 0.0;
        std::size_t previous = request.start;
        for (std::size_t stop : middle) {
            total += costs(previous, stop);
            previous = stop;
        }
        const bool closed = request.shape == planners::tours::TripShape::closed ||
                            (request.shape == planners::tours::TripShape::open_fixed_end && request.end == request.start);
        if (closed) total += costs(previous, request.start);
        best = std::min(best, total);
    } while (std::next_permutation(middle.begin(), middle.end()));
    return best;
}

// Integer costs 1..max; symmetric or not; each off-diagonal entry missing with `missing_chance`.
inline planners::matrices::CostMatrix random_matrix(std::size_t n, bool symmetric, std::mt19937_64& random, int max = 100,
                                          double missing_chance = 0.0) {
    std::uniform_int_distribution<int> cost(1, max);
    std::uniform_real_distribution<double> chance(0.0, 1.0);
    planners::matrices::CostMatrix costs(n, 0.0);
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = symmetric ? i + 1 : 0; j < n; ++j) {
            if (i == j) continue;
            const double value = chance(random) < missing_chance ? planners::matrices::kMissingCost : double(cost(random));
            costs(i, j) = value;
            if (symmetric) costs(j, i) = value;
        }
    return costs;
}

inline double trip_cost(const planners::matrices::CostMatrix& costs, const planners::tours::TourResult& result, bool closed) {
    double total = 0.0;
    const std::size_t n = result.order.size();
    for (std::size_t k = 0; k + 1 < n; ++k) total += costs(result.order[k], result.order[k + 1]);
    if (closed && n > 1) total += costs(result.order.back(), result.order.front());
    return total;
}

inline bool is_permutation_of_stops(const std::vector<std::size_t>& order, std::size_t n) {
    std::vector<std::size_t> sorted = order;
    std::sort(sorted.begin(), sorted.end());
    std::vector<std::size_t> expected(n);
    std::iota(expected.begin(), expected.end(), 0);
    return sorted == expected;
}

} // namespace ringroad::test
