#include "planners/tours/tree_doubling.hpp"

#include <algorithm>

namespace ringroad::planners::tours {

std::vector<int> minimum_tree_parents(const matrices::CostMatrix& costs, int root) {
    const std::size_t n = costs.size();
    std::vector<double> key(n, matrices::kMissingCost);
    std::vector<int> parent(n, -1);
    std::vector<bool> in_tree(n, false);
    key[static_cast<std::size_t>(root)] = 0.0;
    for (std::size_t added = 0; added < n; ++added) {
        std::size_t next = n;
        for (std::size_t v = 0; v < n; ++v)
            if (!in_tree[v] && (next == n || key[v] < key[next])) next = v;
        in_tree[next] = true;
        for (std::size_t v = 0; v < n; ++v) {
            if (in_tree[v]) continue;
            const double link = std::min(costs(next, v), costs(v, next));
            if (link < key[v]) {
                key[v] = link;
                parent[v] = static_cast<int>(next);
            }
        }
    }
    return parent;
}

ClosedTour tree_doubling_tour(const matrices::CostMatrix& costs, int start) {
    const std::size_t n = costs.size();
    const std::vector<int> parent = minimum_tree_parents(costs, start);
    std::vector<std::vector<int>> children(n);
    for (std::size_t v = 0; v < n; ++v)
        if (parent[v] >= 0) children[static_cast<std::size_t>(parent[v])].push_back(static_cast<int>(v));
    // Visit cheaper children first: a common refinement that keeps shortcuts short.
    for (std::size_t v = 0; v < n; ++v)
        std::sort(children[v].begin(), children[v].end(), [&](int a, int b) {
            const double ca = costs(v, static_cast<std::size_t>(a)), cb = costs(v, static_cast<std::size_t>(b));
            return ca != cb ? ca < cb : a < b;
        });
    ClosedTour tour;
    std::vector<int> stack{start};
    while (!stack.empty()) {
        const int city = stack.back();
        stack.pop_back();
        tour.push_back(city);
        const auto& kids = children[static_cast<std::size_t>(city)];
        for (auto child = kids.rbegin(); child != kids.rend(); ++child) stack.push_back(*child);
    }
    return tour;
}

} // namespace ringroad::planners::tours
