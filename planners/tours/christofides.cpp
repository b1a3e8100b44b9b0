#include "planners/tours/christofides.hpp"

#include "planners/tours/greedy_matching.hpp"
#include "planners/tours/minimum_weight_matching.hpp"
#include "planners/tours/tree_doubling.hpp"

#include <algorithm>
#include <utility>

namespace ringroad::planners::tours {
namespace {

// Perfect matching of the odd cities, as pairs of cities.
std::vector<std::pair<int, int>> odd_city_matching(const matrices::CostMatrix& costs, const std::vector<int>& odd, bool exact) {
    const std::size_t k = odd.size();
    matrices::CostMatrix odd_costs(k, 0.0);
    for (std::size_t i = 0; i < k; ++i)
        for (std::size_t j = 0; j < k; ++j)
            if (i != j) odd_costs(i, j) = costs(static_cast<std::size_t>(odd[i]), static_cast<std::size_t>(odd[j]));
    const std::vector<int> mate = exact ? minimum_weight_perfect_matching(odd_costs) : greedy_perfect_matching(odd_costs);
    std::vector<std::pair<int, int>> matched;
    for (std::size_t i = 0; i < k; ++i)
        if (static_cast<int>(i) < mate[i]) matched.emplace_back(odd[i], odd[static_cast<std::size_t>(mate[i])]);
    return matched;
}

} // namespace

ClosedTour christofides_tour(const matrices::CostMatrix& costs, int start) { return christofides(costs, start).tour; }

ChristofidesTour christofides(const matrices::CostMatrix& costs, int start, std::size_t largest_exact_matching) {
    const std::size_t n = costs.size();
    const std::vector<int> parent = minimum_tree_parents(costs, start);
    std::vector<std::vector<int>> multigraph(n);
    for (std::size_t v = 0; v < n; ++v)
        if (parent[v] >= 0) {
            multigraph[v].push_back(parent[v]);
            multigraph[static_cast<std::size_t>(parent[v])].push_back(static_cast<int>(v));
        }
    std::vector<int> odd;
    for (std::size_t v = 0; v < n; ++v)
        if (multigraph[v].size() % 2 == 1) odd.push_back(static_cast<int>(v));
    ChristofidesTour result;
    result.minimum_weight_matching = odd.size() <= largest_exact_matching;
    for (const auto& [a, b] : odd_city_matching(costs, odd, result.minimum_weight_matching)) {
        multigraph[static_cast<std::size_t>(a)].push_back(b);
        multigraph[static_cast<std::size_t>(b)].push_back(a);
    }

    // Hierholzer's Euler circuit; each undirected link is stored twice, so remove both copies.
    ClosedTour& tour = result.tour;
    std::vector<bool> visited(n, false);
    std::vector<int> stack{start};
    while (!stack.empty()) {
        const int city = stack.back();
        auto& links = multigraph[static_cast<std::size_t>(city)];
        if (links.empty()) {
            stack.pop_back();
            if (!visited[static_cast<std::size_t>(city)]) {
                visited[static_cast<std::size_t>(city)] = true;
                tour.push_back(city);
            }
            continue;
        }
        const int other = links.back();
        links.pop_back();
        auto& back_links = multigraph[static_cast<std::size_t>(other)];
        back_links.erase(std::find(back_links.begin(), back_links.end(), city));
        stack.push_back(other);
    }
    // The multigraph is connected and even, so the circuit visits every city; kept as a guard.
    for (std::size_t v = 0; v < n; ++v)
        if (!visited[v]) tour.push_back(static_cast<int>(v));
    std::reverse(tour.begin(), tour.end());
    std::rotate(tour.begin(), std::find(tour.begin(), tour.end(), start), tour.end());
    return result;
}

} // namespace ringroad::planners::tours
