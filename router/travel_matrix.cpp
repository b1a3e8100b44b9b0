#include "router/travel_matrix.hpp"

namespace ringroad::router {

std::size_t TravelMatrix::unreachable_count() const {
    std::size_t count = 0;
    for (PackedWeight weight : weights_) count += weight == kUnreachableWeight;
    return count;
}

planners::matrices::CostMatrix TravelMatrix::seconds_matrix() const {
    planners::matrices::CostMatrix costs(size_);
    for (std::size_t from = 0; from < size_; ++from) {
        for (std::size_t to = 0; to < size_; ++to) {
            costs(from, to) = reachable(from, to) ? seconds(from, to) : planners::matrices::kMissingCost;
        }
    }
    return costs;
}

planners::matrices::CostMatrix TravelMatrix::meters_matrix() const {
    planners::matrices::CostMatrix costs(size_);
    for (std::size_t from = 0; from < size_; ++from) {
        for (std::size_t to = 0; to < size_; ++to) {
            costs(from, to) = reachable(from, to) ? meters(from, to) : planners::matrices::kMissingCost;
        }
    }
    return costs;
}

} // namespace ringroad::router
