#include "planners/tours/tour_construction.hpp"

#include "planners/networks/disjoint_sets.hpp"

#include <algorithm>
#include <tuple>

namespace ringroad::planners::tours {
namespace {

// Turns fragments given by directed successor links into one cycle, starting from fragment
// heads and always joining the current tail to the cheapest unused head.
ClosedTour chain_fragments(const matrices::CostMatrix& costs, const std::vector<int>& successor,
                           const std::vector<int>& predecessor) {
    const std::size_t n = costs.size();
    std::vector<bool> used(n, false);
    ClosedTour tour;
    tour.reserve(n);
    auto walk = [&](int head) {
        for (int city = head; city >= 0 && !used[static_cast<std::size_t>(city)]; city = successor[static_cast<std::size_t>(city)]) {
            used[static_cast<std::size_t>(city)] = true;
            tour.push_back(city);
        }
    };
    int first_head = 0;
    while (predecessor[static_cast<std::size_t>(first_head)] >= 0 && first_head + 1 < static_cast<int>(n)) ++first_head;
    walk(first_head);
    while (tour.size() < n) {
        const int tail = tour.back();
        int best = -1;
        for (std::size_t city = 0; city < n; ++city) {
            if (used[city] || predecessor[city] >= 0) continue;
            if (best < 0 || costs(static_cast<std::size_t>(tail), city) < costs(static_cast<std::size_t>(tail), static_cast<std::size_t>(best)))
                best = static_cast<int>(city);
        }
        if (best < 0)  // only cycles remain, which greedy never builds; be safe anyway
            for (std::size_t city = 0; city < n && best < 0; ++city)
                if (!used[city]) best = static_cast<int>(city);
        walk(best);
    }
    return tour;
}

} // namespace

ClosedTour nearest_neighbour_tour(const matrices::CostMatrix& costs, int start) {
    const std::size_t n = costs.size();
    std::vector<bool> visited(n, false);
    ClosedTour tour{start};
    visited[static_cast<std::size_t>(start)] = true;
    while (tour.size() < n) {
        const std::size_t from = static_cast<std::size_t>(tour.back());
        std::size_t best = n;
        for (std::size_t to = 0; to < n; ++to)
            if (!visited[to] && (best == n || costs(from, to) < costs(from, best))) best = to;
        visited[best] = true;
        tour.push_back(static_cast<int>(best));
    }
    return tour;
}

ClosedTour greedy_edge_tour(const matrices::CostMatrix& costs, bool symmetric, const CandidateLists* candidates) {
    const std::size_t n = costs.size();
    std::vector<std::tuple<double, int, int>> links;
    if (candidates != nullptr) {
        for (std::size_t from = 0; from < n; ++from)
            for (const int* to = candidates->begin(static_cast<int>(from)); to != candidates->end(static_cast<int>(from)); ++to)
                if (!symmetric || static_cast<std::size_t>(*to) > from ||
                    std::find(candidates->begin(*to), candidates->end(*to), static_cast<int>(from)) == candidates->end(*to))
                    links.emplace_back(costs(from, static_cast<std::size_t>(*to)), static_cast<int>(from), *to);
    } else {
        links.reserve(symmetric ? n * (n - 1) / 2 : n * (n - 1));
        for (std::size_t from = 0; from < n; ++from)
            for (std::size_t to = symmetric ? from + 1 : 0; to < n; ++to)
                if (from != to) links.emplace_back(costs(from, to), static_cast<int>(from), static_cast<int>(to));
    }
    std::sort(links.begin(), links.end());

    networks::DisjointSets fragments(n);
    std::vector<int> degree(n, 0);           // symmetric: ends used
    std::vector<std::vector<int>> adjacent(n);
    std::vector<int> successor(n, -1), predecessor(n, -1);
    std::size_t taken = 0;
    for (const auto& [cost, from, to] : links) {
        if (taken + 1 >= n) break;
        const auto f = static_cast<std::size_t>(from), t = static_cast<std::size_t>(to);
        if (symmetric) {
            if (degree[f] >= 2 || degree[t] >= 2) continue;
        } else if (successor[f] >= 0 || predecessor[t] >= 0) {
            continue;
        }
        if (!fragments.unite(f, t)) continue;
        ++taken;
        if (symmetric) {
            ++degree[f];
            ++degree[t];
            adjacent[f].push_back(to);
            adjacent[t].push_back(from);
        } else {
            successor[f] = to;
            predecessor[t] = from;
        }
    }
    if (symmetric) {
        // Orient each path fragment from one end to the other.
        std::vector<bool> oriented(n, false);
        for (std::size_t end = 0; end < n; ++end) {
            if (oriented[end] || degree[end] > 1) continue;
            int previous = -1;
            int city = static_cast<int>(end);
            while (city >= 0) {
                oriented[static_cast<std::size_t>(city)] = true;
                int following = -1;
                for (int other : adjacent[static_cast<std::size_t>(city)])
                    if (other != previous) following = other;
                predecessor[static_cast<std::size_t>(city)] = previous;
                successor[static_cast<std::size_t>(city)] = following;
                previous = city;
                city = following;
            }
        }
    }
    return chain_fragments(costs, successor, predecessor);
}

} // namespace ringroad::planners::tours
