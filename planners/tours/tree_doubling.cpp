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

namespace {

// Children of each city in the tree, cheaper first: a common refinement that keeps shortcuts short.
std::vector<std::vector<int>> tree_children(const matrices::CostMatrix& costs, const std::vector<int>& parent) {
    const std::size_t n = costs.size();
    std::vector<std::vector<int>> children(n);
    for (std::size_t v = 0; v < n; ++v)
        if (parent[v] >= 0) children[static_cast<std::size_t>(parent[v])].push_back(static_cast<int>(v));
    for (std::size_t v = 0; v < n; ++v)
        std::sort(children[v].begin(), children[v].end(), [&](int a, int b) {
            const double ca = costs(v, static_cast<std::size_t>(a)), cb = costs(v, static_cast<std::size_t>(b));
            return ca != cb ? ca < cb : a < b;
        });
    return children;
}

} // namespace

ClosedTour tree_doubling_tour(const matrices::CostMatrix& costs, int start) {
    const std::vector<std::vector<int>> children = tree_children(costs, minimum_tree_parents(costs, start));
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

std::vector<std::size_t> tree_doubling_trip(const matrices::CostMatrix& costs, std::size_t start,
                                            std::optional<std::size_t> end) {
    const std::size_t n = costs.size();
    const std::vector<int> parent = minimum_tree_parents(costs, static_cast<int>(start));
    std::vector<std::vector<int>> children = tree_children(costs, parent);
    if (end && *end != start) {
        // The branch towards the end goes last at every city on the tree path to it.
        std::vector<bool> on_path(n, false);
        for (int city = static_cast<int>(*end); city >= 0; city = parent[static_cast<std::size_t>(city)])
            on_path[static_cast<std::size_t>(city)] = true;
        for (auto& kids : children)
            std::stable_partition(kids.begin(), kids.end(), [&](int kid) { return !on_path[static_cast<std::size_t>(kid)]; });
    }
    std::vector<std::size_t> order;
    std::vector<int> stack{static_cast<int>(start)};
    while (!stack.empty()) {
        const auto city = static_cast<std::size_t>(stack.back());
        stack.pop_back();
        if (!(end && *end != start && city == *end)) order.push_back(city);
        const auto& kids = children[city];
        for (auto child = kids.rbegin(); child != kids.rend(); ++child) stack.push_back(*child);
    }
    if (end && *end != start) order.push_back(*end);
    return order;
}

} // namespace ringroad::planners::tours
