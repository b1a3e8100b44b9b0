#pragma once
// ClosedTour: a cyclic order of matrix indices 0..n-1, each exactly once; the hop from the last
// index back to the first belongs to the tour. The heuristics all work on closed tours; open
// trips are turned into closed tours on a transformed matrix (see open_trip_transform.hpp).

#include "planners/matrices/cost_matrix.hpp"

#include <vector>

namespace ringroad::planners::tours {

using ClosedTour = std::vector<int>;

inline double closed_tour_cost(const matrices::CostMatrix& costs, const ClosedTour& tour) {
    double total = 0.0;
    for (std::size_t i = 0; i < tour.size(); ++i)
        total += costs(static_cast<std::size_t>(tour[i]),
                       static_cast<std::size_t>(tour[(i + 1) % tour.size()]));
    return total;
}

} // namespace ringroad::planners::tours
