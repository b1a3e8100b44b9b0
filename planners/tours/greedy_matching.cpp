#include "planners/tours/greedy_matching.hpp"

#include <algorithm>
#include <tuple>

namespace ringroad::planners::tours {

std::vector<int> greedy_perfect_matching(const matrices::CostMatrix& costs) {
    const std::size_t k = costs.size();
    std::vector<int> unmatched(k, -1);
    if (k < 2) return unmatched;
    std::vector<std::tuple<double, std::size_t, std::size_t>> pairs;
    pairs.reserve(k * (k - 1) / 2);
    for (std::size_t i = 0; i < k; ++i)
        for (std::size_t j = i + 1; j < k; ++j) pairs.emplace_back(costs(i, j), i, j);
    std::sort(pairs.begin(), pairs.end());
    std::vector<std::size_t> mate(k, k);
    for (const auto& [cost, i, j] : pairs)
        if (mate[i] == k && mate[j] == k) {
            mate[i] = j;
            mate[j] = i;
        }
    // Exchanges: for each matched a-b and each nearby c (matched to d), try a-c + b-d and a-d + b-c.
    const std::size_t nearby = std::min<std::size_t>(k - 1, 10);
    std::vector<std::vector<std::size_t>> near(k);
    for (std::size_t i = 0; i < k; ++i) {
        std::vector<std::pair<double, std::size_t>> ranked;
        for (std::size_t j = 0; j < k; ++j)
            if (j != i) ranked.emplace_back(costs(i, j), j);
        std::partial_sort(ranked.begin(), ranked.begin() + static_cast<std::ptrdiff_t>(nearby), ranked.end());
        for (std::size_t r = 0; r < nearby; ++r) near[i].push_back(ranked[r].second);
    }
    auto c = [&](std::size_t i, std::size_t j) { return costs(i, j); };
    for (bool improved = true; improved;) {
        improved = false;
        for (std::size_t a = 0; a < k; ++a)
            for (std::size_t cc : near[a]) {
                const std::size_t b = mate[a], d = mate[cc];
                if (cc == b) continue;
                const double now = c(a, b) + c(cc, d);
                if (c(a, cc) + c(b, d) < now - 1e-9 * now) {
                    mate[a] = cc; mate[cc] = a; mate[b] = d; mate[d] = b;
                    improved = true;
                    break;
                }
                if (c(a, d) + c(b, cc) < now - 1e-9 * now) {
                    mate[a] = d; mate[d] = a; mate[b] = cc; mate[cc] = b;
                    improved = true;
                    break;
                }
            }
    }
    std::vector<int> result(k);
    for (std::size_t i = 0; i < k; ++i) result[i] = static_cast<int>(mate[i]);
    return result;
}

} // namespace ringroad::planners::tours
