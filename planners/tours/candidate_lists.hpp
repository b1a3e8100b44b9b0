#pragma once
// CandidateLists: for each city, a short list of the cities most worth connecting to, so local
// search looks at O(n k) moves instead of O(n^2). Ranking by the reduced costs c(i,j) + pi(j)
// of the Held–Karp bound's penalties is supported by passing them: a simpler cousin of
// Helsgaun's (2000) alpha-nearness, on the same observation that optimal tours mostly use
// links the bound finds cheap.

#include "planners/matrices/cost_matrix.hpp"

#include <cstddef>
#include <vector>

namespace ringroad::planners::tours {

class CandidateLists {
public:
    CandidateLists() = default;
    CandidateLists(std::size_t cities, std::size_t per_city)
        : per_city_(per_city), entries_(cities * per_city) {}
    std::size_t per_city() const noexcept { return per_city_; }
    const int* begin(int city) const { return entries_.data() + static_cast<std::size_t>(city) * per_city_; }
    const int* end(int city) const { return begin(city) + per_city_; }
    int* begin(int city) { return entries_.data() + static_cast<std::size_t>(city) * per_city_; }

private:
    std::size_t per_city_ = 0;
    std::vector<int> entries_;
};

// For each i: the `count` cities j != i with the smallest costs(i, j) + target_penalty[j]
// (ties by index). An empty penalty vector means zeros.
CandidateLists successor_candidates(const matrices::CostMatrix& costs, std::size_t count,
                                    const std::vector<double>& target_penalty = {});
// For each j: the `count` cities i != j with the smallest costs(i, j) + source_penalty[i].
CandidateLists predecessor_candidates(const matrices::CostMatrix& costs, std::size_t count,
                                      const std::vector<double>& source_penalty = {});

} // namespace ringroad::planners::tours
