// Floyd–Warshall metric closure, checked against the Boost Graph Library's
// floyd_warshall_all_pairs_shortest_paths on random directed matrices with missing entries.
#include "planners/matrices/metric_closure.hpp"

#include "planners/matrices/matrix_diagnostics.hpp"

// Boost 1.74's edge iterator trips GCC 12's -Wmaybe-uninitialized inside Boost's own headers.
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/floyd_warshall_shortest.hpp>
#pragma GCC diagnostic pop

#include <catch2/catch.hpp>

#include <cmath>
#include <limits>
#include <random>

using ringroad::planners::matrices::CostMatrix;
using ringroad::planners::matrices::metric_closure;

namespace {

using BoostGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::directedS, boost::no_property,
                                         boost::property<boost::edge_weight_t, double>>;

std::vector<std::vector<double>> boost_closure(const CostMatrix& costs) {
    const std::size_t size = costs.size();
    BoostGraph graph(size);
    for (std::size_t a = 0; a < size; ++a)
        for (std::size_t b = 0; b < size; ++b)
            if (a != b && costs.has(a, b)) boost::add_edge(a, b, costs(a, b), graph);
    std::vector<std::vector<double>> distances(size, std::vector<double>(size));
    boost::floyd_warshall_all_pairs_shortest_paths(
        graph, distances, boost::distance_inf(std::numeric_limits<double>::infinity()));
    return distances;
}

CostMatrix random_directed(std::size_t size, std::mt19937_64& random, double missing_share) {
    std::uniform_int_distribution<int> cost(1, 500);
    std::uniform_real_distribution<double> unit(0.0, 1.0);
    CostMatrix costs(size);
    for (std::size_t a = 0; a < size; ++a)
        for (std::size_t b = 0; b < size; ++b)
            if (a != b && unit(random) >= missing_share) costs(a, b) = cost(random);
    return costs;
}

} // namespace

TEST_CASE("closure equals Boost's floyd_warshall_all_pairs_shortest_paths") {
    std::mt19937_64 random(31337);
    for (int round = 0; round < 40; ++round) {
        const std::size_t size = 2 + static_cast<std::size_t>(round) * 2;
        const double missing_share = (round % 4) * 0.25;   // 0 %, 25 %, 50 %, 75 % missing
        const CostMatrix costs = random_directed(size, random, missing_share);
        const auto closure = metric_closure(costs);
        // Boost Graph Library floyd_warshall_all_pairs_shortest_paths: the outside reference.
        const auto expected = boost_closure(costs);
        std::size_t shortened = 0;
        std::size_t filled = 0;
        for (std::size_t a = 0; a < size; ++a) {
            for (std::size_t b = 0; b < size; ++b) {
                INFO("size " << size << " entry " << a << "," << b);
                REQUIRE(closure.costs(a, b) == expected[a][b]);   // integer sums: exact
                if (a == b || expected[a][b] == costs(a, b)) continue;
                if (costs.has(a, b)) ++shortened; else ++filled;
            }
        }
        CHECK(closure.entries_shortened == shortened);
        CHECK(closure.entries_filled == filled);
        // The closure satisfies the triangle inequality by construction.
        CHECK(ringroad::planners::matrices::diagnose_matrix(closure.costs).triangle_violations == 0);
    }
}

TEST_CASE("a worked example: the chain a->b->c beats the direct a->c") {
    CostMatrix costs(3);
    costs(0, 1) = 2;
    costs(1, 2) = 3;
    costs(0, 2) = 10;
    costs(2, 0) = 1;
    const auto closure = metric_closure(costs);
    CHECK(closure.costs(0, 2) == 5);
    CHECK(closure.costs(1, 0) == 4);   // b -> c -> a, was missing
    CHECK(closure.costs(2, 1) == 3);   // c -> a -> b, was missing
    CHECK(closure.costs(0, 0) == 0);
    CHECK(closure.entries_shortened == 1);
    CHECK(closure.entries_filled == 2);
}
