#pragma once
// TravelMatrix: the N x N metric closure between snapped stops, in integer tenths of a second
// and decimetres, asymmetric in general, with unreachable pairs marked (never a large number).
// Row = from, column = to; the diagonal is 0.

#include "planners/matrices/cost_matrix.hpp"
#include "router/metric.hpp"

#include <cstddef>
#include <cstdint>
#include <utility>
#include <vector>

namespace ringroad::router {

class TravelMatrix {
public:
    TravelMatrix() = default;
    TravelMatrix(std::size_t size, Metric metric)
        : size_(size), metric_(metric), weights_(size * size, kUnreachableWeight) {}
    // Takes row-major packed weights (size * size of them) as they are.
    TravelMatrix(std::size_t size, Metric metric, std::vector<PackedWeight> weights)
        : size_(size), metric_(metric), weights_(std::move(weights)) {
        weights_.resize(size * size, kUnreachableWeight);
    }

    std::size_t size() const noexcept { return size_; }
    Metric metric() const noexcept { return metric_; }

    bool reachable(std::size_t from, std::size_t to) const { return weight(from, to) != kUnreachableWeight; }
    // Only meaningful when reachable().
    std::uint64_t time_ds(std::size_t from, std::size_t to) const { return weight_time_ds(metric_, weight(from, to)); }
    std::uint64_t length_dm(std::size_t from, std::size_t to) const { return weight_length_dm(metric_, weight(from, to)); }
    double seconds(std::size_t from, std::size_t to) const { return static_cast<double>(time_ds(from, to)) / 10.0; }
    double meters(std::size_t from, std::size_t to) const { return static_cast<double>(length_dm(from, to)) / 10.0; }

    // The packed (primary, secondary) weight of router/metric.hpp, kUnreachableWeight if none.
    PackedWeight weight(std::size_t from, std::size_t to) const { return weights_[from * size_ + to]; }
    void set_weight(std::size_t from, std::size_t to, PackedWeight weight) { weights_[from * size_ + to] = weight; }

    std::size_t unreachable_count() const;

    // Seconds (Metric::time) or metres (Metric::distance) for the planners; unreachable pairs
    // become planners::matrices::kMissingCost.
    planners::matrices::CostMatrix seconds_matrix() const;
    planners::matrices::CostMatrix meters_matrix() const;
    planners::matrices::CostMatrix primary_cost_matrix() const {
        return metric_ == Metric::time ? seconds_matrix() : meters_matrix();
    }

private:
    std::size_t size_ = 0;
    Metric metric_ = Metric::time;
    std::vector<PackedWeight> weights_;
};

} // namespace ringroad::router
