#include "planners/tours/one_tree_bound.hpp"

#include <algorithm>
#include <cmath>

namespace ringroad::planners::tours {
namespace {

struct OneTree {
    double value = 0.0;                 // cost under pi, minus 2 sum(pi)
    std::vector<int> degree;
};

// Minimum 1-tree under penalties by Prim's algorithm on the dense matrix, O(n^2): one pass over
// the cities not yet in the tree both updates their keys and picks the next city. A forced
// partner joins the tree right after its city (Prim on the graph with forced edges contracted).
OneTree minimum_one_tree(const matrices::CostMatrix& costs, const std::vector<double>& pi, const std::vector<int>& forced) {
    const std::size_t n = costs.size();
    auto cost = [&](std::size_t a, std::size_t b) { return costs(a, b) + pi[a] + pi[b]; };
    auto partner = [&](std::size_t v) { return forced.empty() ? -1 : forced[v]; };
    OneTree tree;
    tree.degree.assign(n, 0);
    double total = 0.0;
    auto attach = [&](std::size_t v, std::size_t to, double link) {
        total += link;
        ++tree.degree[v];
        ++tree.degree[to];
    };
    std::vector<double> key(n, matrices::kMissingCost);
    std::vector<std::size_t> parent(n, 0);
    std::vector<std::size_t> outside;  // cities 1..n-1 not yet in the tree; city 0 joins last
    outside.reserve(n);
    for (std::size_t v = 2; v < n; ++v) outside.push_back(v);
    // Adds v to the tree: lowers the keys of the cities outside; returns the position in
    // `outside` of the cheapest one.
    auto join = [&](std::size_t v) {
        const double own = pi[v];
        std::size_t best = 0;
        double best_key = matrices::kMissingCost;
        for (std::size_t k = 0; k < outside.size(); ++k) {
            const std::size_t u = outside[k];
            const double link = costs(v, u) + own + pi[u];
            if (link < key[u]) {
                key[u] = link;
                parent[u] = v;
            }
            if (key[u] < best_key || k == 0) {
                best_key = key[u];
                best = k;
            }
        }
        return best;
    };
    auto take = [&](std::size_t position) {
        const std::size_t v = outside[position];
        outside[position] = outside.back();
        outside.pop_back();
        return v;
    };
    auto join_with_partner = [&](std::size_t v) {
        const int p = partner(v);
        if (p > 0) {
            const auto found = std::find(outside.begin(), outside.end(), static_cast<std::size_t>(p));
            if (found != outside.end()) {
                join(v);
                take(static_cast<std::size_t>(found - outside.begin()));
                attach(static_cast<std::size_t>(p), v, cost(v, static_cast<std::size_t>(p)));
                return join(static_cast<std::size_t>(p));
            }
        }
        return join(v);
    };
    if (n > 1) {
        std::size_t next = join_with_partner(1);
        while (!outside.empty()) {
            const std::size_t v = take(next);
            attach(v, parent[v], key[v]);
            next = join_with_partner(v);
        }
    }
    // City 0: its forced edge (if any) and its cheapest other edges, two edges in all.
    std::vector<std::pair<double, std::size_t>> links;
    for (std::size_t v = 1; v < n; ++v) links.emplace_back(cost(0, v), v);
    const int zero_partner = partner(0);
    if (zero_partner > 0) {
        attach(0, static_cast<std::size_t>(zero_partner), cost(0, static_cast<std::size_t>(zero_partner)));
        links.erase(std::find_if(links.begin(), links.end(), [&](const auto& l) { return l.second == static_cast<std::size_t>(zero_partner); }));
    }
    std::partial_sort(links.begin(), links.begin() + std::min<std::ptrdiff_t>(2, static_cast<std::ptrdiff_t>(links.size())), links.end());
    for (std::size_t k = 0; tree.degree[0] < 2 && k < links.size(); ++k) attach(0, links[k].second, links[k].first);
    double penalty_sum = 0.0;
    for (double p : pi) penalty_sum += p;
    tree.value = total - 2.0 * penalty_sum;
    return tree;
}

} // namespace

OneTreeBound held_karp_one_tree_bound(const matrices::CostMatrix& costs, double upper_bound, std::size_t max_iterations,
                                      const std::vector<int>& forced_partner) {
    const std::size_t n = costs.size();
    OneTreeBound result;
    result.penalties.assign(n, 0.0);
    if (n < 3) return result;
    std::vector<double> pi(n, 0.0);
    std::vector<double> direction(n, 0.0);
    // lambda starts at 1 and halves after n/4 (10..30) stalled iterations; directions blend 0.7
    // of the previous one. Tuned on kroA200, pcb442 and pr107 (whose clustered cities need long
    // periods: 10 iterations stall it 11 % below the optimum, 30 reach 0.15 % in 2000).
    double lambda = 1.0;
    const std::size_t stall_period = std::clamp<std::size_t>(n / 4, 10, 30);
    std::size_t stalled = 0;
    result.value = -matrices::kMissingCost;
    for (std::size_t iteration = 0; iteration < max_iterations; ++iteration) {
        result.iterations = iteration + 1;
        const OneTree tree = minimum_one_tree(costs, pi, forced_partner);
        if (!std::isfinite(tree.value)) break;
        if (tree.value > result.value) {
            result.value = tree.value;
            result.penalties = pi;
            stalled = 0;
        } else if (++stalled >= stall_period) {
            // Stalled: smaller steps from the best penalties found so far.
            lambda /= 2.0;
            stalled = 0;
            if (lambda < 1e-5) break;
            pi = result.penalties;
            std::fill(direction.begin(), direction.end(), 0.0);
            continue;
        }
        double norm = 0.0;
        for (std::size_t v = 0; v < n; ++v) {
            // Camerini, Fratta & Maffioli (1975): blend with the previous direction to damp zigzag.
            direction[v] = (tree.degree[v] - 2) + 0.7 * direction[v];
            norm += direction[v] * direction[v];
        }
        bool is_tour = true;
        for (std::size_t v = 0; v < n; ++v) is_tour = is_tour && tree.degree[v] == 2;
        if (is_tour) {
            result.value = tree.value;
            result.penalties = pi;
            result.tour_found = true;
            break;
        }
        if (result.value >= upper_bound - 1e-9 * std::abs(upper_bound)) break;
        if (norm <= 0.0) break;
        const double step = lambda * (upper_bound - tree.value) / norm;
        for (std::size_t v = 0; v < n; ++v) pi[v] += step * direction[v];
    }
    if (!std::isfinite(result.value)) result.value = 0.0;
    return result;
}

} // namespace ringroad::planners::tours
