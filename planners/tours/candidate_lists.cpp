#include "planners/tours/candidate_lists.hpp"

#include <algorithm>
#include <utility>

namespace ringroad::planners::tours {
namespace {

template <typename KeyOf>
CandidateLists rank_candidates(std::size_t n, std::size_t count, KeyOf key_of) {
    count = std::min(count, n > 0 ? n - 1 : 0);
    CandidateLists lists(n, count);
    std::vector<std::pair<double, int>> ranked;
    for (std::size_t city = 0; city < n; ++city) {
        ranked.clear();
        for (std::size_t other = 0; other < n; ++other)
            if (other != city) ranked.emplace_back(key_of(city, other), static_cast<int>(other));
        std::partial_sort(ranked.begin(), ranked.begin() + static_cast<std::ptrdiff_t>(count), ranked.end());
        int* out = lists.begin(static_cast<int>(city));
        for (std::size_t k = 0; k < count; ++k) out[k] = ranked[k].second;
    }
    return lists;
}

} // namespace

CandidateLists successor_candidates(const matrices::CostMatrix& costs, std::size_t count,
                                    const std::vector<double>& target_penalty) {
    return rank_candidates(costs.size(), count, [&](std::size_t city, std::size_t other) {
        return costs(city, other) + (target_penalty.empty() ? 0.0 : target_penalty[other]);
    });
}

CandidateLists predecessor_candidates(const matrices::CostMatrix& costs, std::size_t count,
                                      const std::vector<double>& source_penalty) {
    return rank_candidates(costs.size(), count, [&](std::size_t city, std::size_t other) {
        return costs(other, city) + (source_penalty.empty() ? 0.0 : source_penalty[other]);
    });
}

} // namespace ringroad::planners::tours
