// Matrix diagnostics: symmetry, missing entries and triangle-inequality violations.
// References: Euclidean distances satisfy the triangle inequality (a theorem of plane geometry);
// a pair has a shortcut exactly when the Boost Graph Library's Floyd–Warshall shortest path
// between them is shorter than the entry.
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
#include <set>

using ringroad::planners::matrices::CostMatrix;
using ringroad::planners::matrices::diagnose_matrix;
using ringroad::planners::matrices::DiagnosticsOptions;

namespace {

CostMatrix euclidean(std::size_t size, std::mt19937_64& random) {
    std::uniform_real_distribution<double> coordinate(0.0, 1000.0);
    std::vector<std::pair<double, double>> points(size);
    for (auto& point : points) point = {coordinate(random), coordinate(random)};
    CostMatrix costs(size);
    for (std::size_t a = 0; a < size; ++a)
        for (std::size_t b = 0; b < size; ++b)
            costs(a, b) = std::hypot(points[a].first - points[b].first, points[a].second - points[b].second);
    return costs;
}

// Pairs (a, b) for which Boost's Floyd–Warshall finds a strictly cheaper chain than the entry.
std::set<std::pair<std::size_t, std::size_t>> boost_shortcut_pairs(const CostMatrix& costs) {
    using Graph = boost::adjacency_list<boost::vecS, boost::vecS, boost::directedS, boost::no_property,
                                        boost::property<boost::edge_weight_t, double>>;
    const std::size_t size = costs.size();
    Graph graph(size);
    for (std::size_t a = 0; a < size; ++a)
        for (std::size_t b = 0; b < size; ++b)
            if (a != b && costs.has(a, b)) boost::add_edge(a, b, costs(a, b), graph);
    std::vector<std::vector<double>> distances(size, std::vector<double>(size));
    boost::floyd_warshall_all_pairs_shortest_paths(graph, distances,
                                                   boost::distance_inf(std::numeric_limits<double>::infinity()));
    std::set<std::pair<std::size_t, std::size_t>> pairs;
    for (std::size_t a = 0; a < size; ++a)
        for (std::size_t b = 0; b < size; ++b)
            if (costs.has(a, b) && distances[a][b] < costs(a, b)) pairs.insert({a, b});
    return pairs;
}

} // namespace

TEST_CASE("Euclidean distances: symmetric, complete, no triangle violations") {
    std::mt19937_64 random(5);
    const auto report = diagnose_matrix(euclidean(60, random));
    CHECK(report.symmetric);
    CHECK(report.asymmetric_pairs == 0);
    CHECK(report.missing_entries == 0);
    CHECK(report.triangle_violations == 0);
    CHECK_FALSE(report.triangle_sampled);
    CHECK(report.via_stops_checked == 60);
}

TEST_CASE("asymmetry and missing entries are counted with examples") {
    CostMatrix costs(4, 1.0);
    costs(0, 1) = 2.0;           // {0,1} asymmetric by 1
    costs(2, 3) = ringroad::planners::matrices::kMissingCost;   // {2,3} asymmetric, and missing
    costs(3, 2) = ringroad::planners::matrices::kMissingCost;   // {2,3} now both missing: symmetric again
    costs(1, 3) = ringroad::planners::matrices::kMissingCost;   // {1,3} asymmetric and one missing
    const auto report = diagnose_matrix(costs);
    CHECK_FALSE(report.symmetric);
    CHECK(report.asymmetric_pairs == 2);
    CHECK(report.largest_asymmetry == 1.0);
    CHECK(report.missing_entries == 3);
    REQUIRE(report.missing_examples.size() == 3);
    CHECK(report.missing_examples[0].from == 1);
    CHECK(report.missing_examples[0].to == 3);
}

TEST_CASE("triangle violations agree with Boost's Floyd–Warshall shortcuts and a brute-force count") {
    std::mt19937_64 random(11);
    for (int round = 0; round < 10; ++round) {
        const std::size_t size = 8 + static_cast<std::size_t>(round) * 4;
        CostMatrix costs = euclidean(size, random);
        // Break the inequality on a few entries by stretching them.
        std::uniform_int_distribution<std::size_t> stop(0, size - 1);
        for (int k = 0; k < 5; ++k) {
            const std::size_t a = stop(random);
            const std::size_t b = stop(random);
            if (a != b) costs(a, b) *= 1.5;
        }
        const auto report = diagnose_matrix(costs);
        std::size_t triples = 0;
        std::set<std::pair<std::size_t, std::size_t>> pairs;
        for (std::size_t a = 0; a < size; ++a)
            for (std::size_t via = 0; via < size; ++via)
                for (std::size_t b = 0; b < size; ++b)
                    if (a != b && via != a && via != b && costs(a, b) > (costs(a, via) + costs(via, b)) * (1 + 1e-9)) {
                        ++triples;
                        pairs.insert({a, b});
                    }
        INFO("size " << size);
        CHECK(report.triangle_violations == triples);
        // Boost Graph Library floyd_warshall_all_pairs_shortest_paths: the outside reference for
        // which pairs have a cheaper chain.
        CHECK(pairs == boost_shortcut_pairs(costs));
        CHECK((report.triangle_violations > 0) == !pairs.empty());
        for (const auto& example : report.triangle_examples) {
            CHECK(pairs.count({example.from, example.to}) == 1);
            CHECK(example.direct == costs(example.from, example.to));
            CHECK(example.through == Approx(costs(example.from, example.via) + costs(example.via, example.to)));
        }
        for (std::size_t i = 1; i < report.triangle_examples.size(); ++i) {
            const auto& before = report.triangle_examples[i - 1];
            const auto& after = report.triangle_examples[i];
            CHECK(before.direct - before.through >= after.direct - after.through);
        }
    }
}

TEST_CASE("large matrices are sampled within the budget and say so") {
    std::mt19937_64 random(3);
    CostMatrix costs = euclidean(120, random);
    costs(3, 4) *= 3.0;
    DiagnosticsOptions options;
    options.full_check_triples = 120.0 * 120.0 * 10.0;   // room for 10 via stops
    const auto sampled = diagnose_matrix(costs, options);
    CHECK(sampled.triangle_sampled);
    CHECK(sampled.via_stops_checked == 10);
    const auto full = diagnose_matrix(costs);
    CHECK_FALSE(full.triangle_sampled);
    CHECK(full.triangle_violations > 0);
    CHECK(sampled.triangle_violations <= full.triangle_violations);
}
