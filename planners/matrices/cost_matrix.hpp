#pragma once
// CostMatrix: a square matrix of non-negative costs, possibly asymmetric, possibly with missing
// entries (no connection). It is all the planners know about the world: seconds, metres, TSPLIB
// distances or a user's own numbers. Missing entries are +infinity, so they never win a minimum.

#include <cmath>
#include <cstddef>
#include <limits>
#include <string>
#include <vector>

namespace ringroad::planners::matrices {

inline constexpr double kMissingCost = std::numeric_limits<double>::infinity();

class CostMatrix {
public:
    CostMatrix() = default;
    explicit CostMatrix(std::size_t size, double fill = kMissingCost)
        : size_(size), costs_(size * size, fill) {
        for (std::size_t i = 0; i < size; ++i) costs_[i * size + i] = 0.0;
    }

    std::size_t size() const noexcept { return size_; }
    double operator()(std::size_t from, std::size_t to) const { return costs_[from * size_ + to]; }
    double& operator()(std::size_t from, std::size_t to) { return costs_[from * size_ + to]; }
    bool has(std::size_t from, std::size_t to) const { return std::isfinite((*this)(from, to)); }

private:
    std::size_t size_ = 0;
    std::vector<double> costs_;
};

// A matrix with the ids of its stops (row/column i is stop ids[i]).
struct LabelledMatrix {
    std::vector<std::string> ids;
    CostMatrix costs;
};

} // namespace ringroad::planners::matrices
