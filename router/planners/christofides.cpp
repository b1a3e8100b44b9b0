#include "router/planners/christofides.hpp"

#include "router/planners/tree_doubling.hpp"

#include <algorithm>
#include <tuple>

namespace ringroad::planners {
namespace {

// Perfect matching of the odd cities: greedy, then pair exchanges until no exchange helps.
std::vector<std::pair<int, int>> odd_city_matching(const CostMatrix& costs, const std::vector<int>& odd) {
    const std::size_t k = odd.size();
    auto c = [&](std::size_t i, std::size_t j) {
        return costs(static_cast<std::size_t>(odd[i]), static_cast<std::size_t>(odd[j]));
    };
    std::vector<std::tuple<double, std::size_t, std::size_t>> pairs;
    pairs.reserve(k * (k - 1) / 2);
    for (std::size_t i = 0; i < k; ++i)
        for (std::size_t j = i + 1; j < k; ++j) pairs.emplace_back(c(i, j), i, j);
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
            if (j != i) ranked.emplace_back(c(i, j), j);
        std::partial_sort(ranked.begin(), ranked.begin() + static_cast<std::ptrdiff_t>(nearby), ranked.end());
        for (std::size_t r = 0; r < nearby; ++r) near[i].push_back(ranked[r].second);
    }
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
    std::vector<std::pair<int, int>> matched;
    for (std::size_t i = 0; i < k; ++i)
        if (i < mate[i] && mate[i] < k) matched.emplace_back(odd[i], odd[mate[i]]);
    return matched;
}

} // namespace

ClosedTour christofides_tour(const CostMatrix& costs, int start) {
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
    for (const auto& [a, b] : odd_city_matching(costs, odd)) {
        multigraph[static_cast<std::size_t>(a)].push_back(b);
        multigraph[static_cast<std::size_t>(b)].push_back(a);
    }

    // Hierholzer's Euler circuit; each undirected link is stored twice, so remove both copies.
    ClosedTour tour;
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
    return tour;
}

} // namespace ringroad::planners
