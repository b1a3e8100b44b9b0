// Kruskal spanning tree over a cost matrix, checked against the Boost Graph Library's
// kruskal_minimum_spanning_tree on the same matrix (random matrices, symmetric and asymmetric
// with both link-cost rules, with missing entries), and on TSPLIB instances.
#include "planners/networks/spanning_tree.hpp"

#include "common/input_error.hpp"
#include "tests/support/run_command.hpp"
#include "tests/support/tsplib_reader.hpp"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/kruskal_min_spanning_tree.hpp>

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <iterator>
#include <numeric>
#include <random>

using ringroad::planners::matrices::CostMatrix;
using ringroad::planners::networks::LinkCostRule;
using ringroad::planners::networks::minimum_spanning_forest;

namespace {

using BoostGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::undirectedS, boost::no_property,
                                         boost::property<boost::edge_weight_t, double>>;

// Weight of the minimum spanning forest by the Boost Graph Library, with the link cost rule
// applied while building its undirected graph.
double boost_spanning_weight(const CostMatrix& costs, LinkCostRule rule, std::size_t* tree_edges = nullptr) {
    const std::size_t size = costs.size();
    BoostGraph graph(size);
    for (std::size_t a = 0; a < size; ++a) {
        for (std::size_t b = a + 1; b < size; ++b) {
            const double cost = rule == LinkCostRule::cheaper_direction ? std::min(costs(a, b), costs(b, a))
                                                                        : std::max(costs(a, b), costs(b, a));
            if (std::isfinite(cost)) boost::add_edge(a, b, cost, graph);
        }
    }
    std::vector<boost::graph_traits<BoostGraph>::edge_descriptor> tree;
    boost::kruskal_minimum_spanning_tree(graph, std::back_inserter(tree));
    const auto weight = boost::get(boost::edge_weight, graph);
    if (tree_edges) *tree_edges = tree.size();
    double total = 0.0;
    for (const auto& edge : tree) total += weight[edge];
    return total;
}

CostMatrix random_matrix(std::size_t size, std::mt19937_64& random, bool symmetric, double missing_share,
                         bool integer_costs) {
    std::uniform_real_distribution<double> cost(1.0, 1000.0);
    std::uniform_real_distribution<double> unit(0.0, 1.0);
    CostMatrix costs(size);
    for (std::size_t a = 0; a < size; ++a) {
        for (std::size_t b = 0; b < size; ++b) {
            if (a == b || (symmetric && b < a)) continue;
            double value = unit(random) < missing_share ? ringroad::planners::matrices::kMissingCost : cost(random);
            if (integer_costs) value = std::floor(value / 50.0);   // many ties
            costs(a, b) = value;
            if (symmetric) costs(b, a) = value;
        }
    }
    return costs;
}

} // namespace

TEST_CASE("spanning tree weight equals Boost's kruskal_minimum_spanning_tree on random matrices") {
    std::mt19937_64 random(20240611);
    for (int round = 0; round < 60; ++round) {
        const std::size_t size = 2 + static_cast<std::size_t>(round) * 3;
        const bool symmetric = round % 2 == 0;
        const bool ties = round % 3 == 0;
        const CostMatrix costs = random_matrix(size, random, symmetric, 0.0, ties);
        for (const LinkCostRule rule : {LinkCostRule::cheaper_direction, LinkCostRule::dearer_direction}) {
            INFO("size " << size << " symmetric " << symmetric << " rule " << link_cost_rule_name(rule));
            const auto forest = minimum_spanning_forest(costs, rule);
            CHECK(forest.component_count == 1);
            CHECK(forest.links.size() == size - 1);
            // Boost Graph Library kruskal_minimum_spanning_tree: the outside reference.
            CHECK(forest.cost == Approx(boost_spanning_weight(costs, rule)).epsilon(1e-12));
            double sum = 0.0;
            for (const auto& link : forest.links) {
                sum += link.cost;
                // The link is oriented along the direction whose cost it carries.
                if (rule == LinkCostRule::cheaper_direction) CHECK(costs(link.from, link.to) == link.cost);
            }
            CHECK(sum == Approx(forest.cost));
        }
    }
}

TEST_CASE("spanning tree weight equals Boost's Kruskal on every shipped TSPLIB instance") {
    std::size_t instances = 0;
    for (const char* folder : {"tsplib/symmetric", "tsplib/asymmetric"}) {
        for (const auto& entry : std::filesystem::directory_iterator(ringroad::test::fixture_path(folder))) {
            const std::string extension = entry.path().extension().string();
            if (extension != ".tsp" && extension != ".atsp") continue;
            auto instance = ringroad::test::read_tsplib_file(entry.path().string());
            for (std::size_t i = 0; i < instance.costs.size(); ++i) instance.costs(i, i) = 0.0;
            INFO(instance.name);
            for (const LinkCostRule rule : {LinkCostRule::cheaper_direction, LinkCostRule::dearer_direction}) {
                const auto forest = minimum_spanning_forest(instance.costs, rule);
                CHECK(forest.component_count == 1);
                // Boost Graph Library kruskal_minimum_spanning_tree on the same TSPLIB 95 matrix;
                // integer distances, so the sums agree exactly.
                CHECK(forest.cost == boost_spanning_weight(instance.costs, rule));
            }
            ++instances;
        }
    }
    CHECK(instances >= 30);
}

TEST_CASE("with missing entries the spanning forest matches Boost's forest") {
    std::mt19937_64 random(99);
    for (int round = 0; round < 40; ++round) {
        const std::size_t size = 5 + static_cast<std::size_t>(round);
        const CostMatrix costs = random_matrix(size, random, round % 2 == 0, 0.93, false);
        for (const LinkCostRule rule : {LinkCostRule::cheaper_direction, LinkCostRule::dearer_direction}) {
            std::size_t boost_edges = 0;
            const double boost_weight = boost_spanning_weight(costs, rule, &boost_edges);
            const auto forest = minimum_spanning_forest(costs, rule);
            INFO("size " << size);
            CHECK(forest.cost == Approx(boost_weight).epsilon(1e-12));
            CHECK(forest.links.size() == boost_edges);
            CHECK(forest.component_count == size - boost_edges);   // a forest: edges = n - trees
        }
    }
}

TEST_CASE("disconnected stops: minimum_spanning_tree names a stop that is not joined") {
    ringroad::planners::matrices::LabelledMatrix matrix{{"depot", "north", "island"}, CostMatrix(3)};
    matrix.costs(0, 1) = 4;
    matrix.costs(1, 0) = 5;
    REQUIRE_THROWS_AS(ringroad::planners::networks::minimum_spanning_tree(matrix), ringroad::InputError);
    CHECK_THROWS_WITH(ringroad::planners::networks::minimum_spanning_tree(matrix), Catch::Contains("'island'") &&
                                                                             Catch::Contains("'depot'"));
    // A one-way entry is enough under min(), not under max().
    matrix.costs(2, 0) = 7;
    const auto tree = ringroad::planners::networks::minimum_spanning_tree(matrix);
    CHECK(tree.cost == 11.0);
    CHECK_THROWS_WITH(ringroad::planners::networks::minimum_spanning_tree(matrix, LinkCostRule::dearer_direction),
                      Catch::Contains("'island'"));
}

TEST_CASE("tiny matrices") {
    CHECK(minimum_spanning_forest(CostMatrix(0)).links.empty());
    const auto single = minimum_spanning_forest(CostMatrix(1));
    CHECK(single.links.empty());
    CHECK(single.component_count == 1);
}
