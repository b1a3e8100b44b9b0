// Minimum-weight perfect matching (Edmonds' blossom algorithm) checked against the Boost Graph
// Library's matchers, and Christofides' construction checked against the TSPLIB published
// optima with the 1.5 guarantee of Christofides (1976).
#include "planners/tours/christofides.hpp"
#include "planners/tours/greedy_matching.hpp"
#include "planners/tours/minimum_weight_matching.hpp"
#include "planners/tours/tree_doubling.hpp"
#include "tests/support/run_command.hpp"
#include "tests/support/tsplib_reader.hpp"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/maximum_weighted_matching.hpp>
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <random>
#include <string>
#include <vector>

using namespace ringroad;
using planners::matrices::CostMatrix;

namespace {

template <typename Weight>
using WeightedGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::undirectedS, boost::no_property,
                                            boost::property<boost::edge_weight_t, Weight>>;

// Boost finds a maximum-WEIGHT matching; on a complete graph with weight = big - cost and big
// above the sum of all costs, every perfect matching outweighs every non-perfect one, so the
// maximum-weight matching is the minimum-cost perfect matching.
template <typename Weight>
WeightedGraph<Weight> complement_graph(const CostMatrix& costs) {
    const std::size_t n = costs.size();
    double total = 0.0;
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = i + 1; j < n; ++j) total += costs(i, j);
    const Weight big = static_cast<Weight>(std::ceil(total)) + 1;
    WeightedGraph<Weight> graph(n);
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = i + 1; j < n; ++j) boost::add_edge(i, j, static_cast<Weight>(big - costs(i, j)), graph);
    return graph;
}

// Boost's mate array as ours (-1 for unmatched).
template <typename Graph>
std::vector<int> as_mates(const Graph& graph,
                          const std::vector<typename boost::graph_traits<Graph>::vertex_descriptor>& boost_mate) {
    std::vector<int> mate(boost_mate.size(), -1);
    for (std::size_t v = 0; v < boost_mate.size(); ++v)
        if (boost_mate[v] != boost::graph_traits<Graph>::null_vertex()) mate[v] = static_cast<int>(boost_mate[v]);
    (void)graph;
    return mate;
}

std::vector<int> boost_brute_force(const CostMatrix& costs) {
    auto graph = complement_graph<double>(costs);
    std::vector<boost::graph_traits<WeightedGraph<double>>::vertex_descriptor> mate(costs.size());
    boost::brute_force_maximum_weighted_matching(graph, &mate[0]);
    return as_mates(graph, mate);
}

std::vector<int> boost_blossom(const CostMatrix& costs) {
    auto graph = complement_graph<long>(costs);
    std::vector<boost::graph_traits<WeightedGraph<long>>::vertex_descriptor> mate(costs.size());
    boost::maximum_weighted_matching(graph, &mate[0]);
    return as_mates(graph, mate);
}

bool is_perfect(const std::vector<int>& mate) {
    for (std::size_t v = 0; v < mate.size(); ++v)
        if (mate[v] < 0 || static_cast<std::size_t>(mate[v]) >= mate.size() || mate[v] == static_cast<int>(v) ||
            mate[static_cast<std::size_t>(mate[v])] != static_cast<int>(v))
            return false;
    return true;
}

enum class CostKind { small_integers, reals, plane_distances };

// Small integers give many ties; reals are arbitrary; plane distances are metric non-integers.
CostMatrix random_costs(std::size_t n, CostKind kind, std::mt19937_64& random) {
    CostMatrix costs(n, 0.0);
    std::uniform_int_distribution<int> small(0, 4);
    std::uniform_real_distribution<double> real(0.0, 100.0);
    std::vector<std::pair<double, double>> points(n);
    for (auto& point : points) point = {real(random), real(random)};
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = i + 1; j < n; ++j) {
            double value = 0.0;
            if (kind == CostKind::small_integers) value = small(random);
            else if (kind == CostKind::reals) value = real(random);
            else value = std::hypot(points[i].first - points[j].first, points[i].second - points[j].second);
            costs(i, j) = costs(j, i) = value;
        }
    return costs;
}

CostMatrix submatrix(const CostMatrix& costs, const std::vector<int>& cities) {
    CostMatrix part(cities.size(), 0.0);
    for (std::size_t i = 0; i < cities.size(); ++i)
        for (std::size_t j = 0; j < cities.size(); ++j)
            part(i, j) = costs(static_cast<std::size_t>(cities[i]), static_cast<std::size_t>(cities[j]));
    return part;
}

// Odd-degree cities of the minimum spanning tree, as Christofides' construction uses them.
std::vector<int> odd_tree_cities(const CostMatrix& costs) {
    const std::vector<int> parent = planners::tours::minimum_tree_parents(costs, 0);
    std::vector<int> degree(costs.size(), 0);
    for (std::size_t v = 0; v < costs.size(); ++v)
        if (parent[v] >= 0) {
            ++degree[v];
            ++degree[static_cast<std::size_t>(parent[v])];
        }
    std::vector<int> odd;
    for (std::size_t v = 0; v < costs.size(); ++v)
        if (degree[v] % 2 == 1) odd.push_back(static_cast<int>(v));
    return odd;
}

std::string edge_weight_type(const std::string& path) {
    std::ifstream file(path);
    for (std::string line; std::getline(file, line);)
        if (line.rfind("EDGE_WEIGHT_TYPE", 0) == 0) {
            const std::string value = line.substr(line.find(':') + 1);
            const auto first = value.find_first_not_of(" \t");
            const auto last = value.find_last_not_of(" \t\r");
            return value.substr(first, last - first + 1);
        }
    return "";
}

bool satisfies_triangle_inequality(const CostMatrix& costs) {
    const std::size_t n = costs.size();
    for (std::size_t a = 0; a < n; ++a)
        for (std::size_t b = 0; b < n; ++b)
            for (std::size_t c = 0; c < n; ++c)
                if (costs(a, c) > costs(a, b) + costs(b, c)) return false;
    return true;
}

} // namespace

TEST_CASE("minimum matching equals Boost's brute force on small complete graphs") {
    // Reference: boost::brute_force_maximum_weighted_matching (Boost Graph Library 1.74),
    // which tries every matching; see complement_graph for the cost-to-weight transformation.
    std::mt19937_64 random(41);
    int instances = 0;
    for (CostKind kind : {CostKind::small_integers, CostKind::reals, CostKind::plane_distances})
        for (std::size_t n = 2; n <= 10; n += 2)
            for (int round = 0; round < (n <= 6 ? 40 : 25); ++round) {
                const CostMatrix costs = random_costs(n, kind, random);
                const std::vector<int> ours = planners::tours::minimum_weight_perfect_matching(costs);
                const std::vector<int> reference = boost_brute_force(costs);
                REQUIRE(is_perfect(ours));
                REQUIRE(is_perfect(reference));
                const double our_cost = planners::tours::matching_cost(costs, ours);
                const double reference_cost = planners::tours::matching_cost(costs, reference);
                INFO("n " << n << " round " << round << " kind " << static_cast<int>(kind));
                if (kind == CostKind::small_integers) CHECK(our_cost == reference_cost);
                else CHECK(our_cost == Approx(reference_cost).epsilon(1e-12).margin(1e-9));
                ++instances;
            }
    CHECK(instances == 3 * (40 * 3 + 25 * 2));
}

TEST_CASE("minimum matching equals Boost's blossom matcher on random complete graphs") {
    // Reference: boost::maximum_weighted_matching (Boost Graph Library 1.74, Edmonds' blossom
    // algorithm), integer costs so the totals compare exactly. Boost 1.74's matcher crashes
    // (segmentation fault) on many instances with heavy ties: with costs 0..5 it crashed on
    // 50-vertex seeds 1-8, 10, 11, 40-vertex seeds 2 and 3, and every seed 1-12 from 60 vertices
    // up (and on the odd cities of TSPLIB pcb442); on 40-vertex seed 5 it returned a matching that
    // is not perfect, i.e. not of maximum weight, and likewise on 120 vertices, seed 1, costs
    // 0..1000 (in this test's build). The cases below are seeds where it runs correctly.
    struct Case {
        std::size_t n;
        std::uint64_t seed;
        int max_cost;
    };
    std::vector<Case> cases = {{20, 1, 5}, {20, 2, 5}, {20, 3, 5}, {30, 1, 5}, {30, 2, 5}, {30, 3, 5},
                               {40, 1, 5}, {40, 4, 5}, {50, 9, 5}, {50, 12, 5}};
    for (std::size_t n : {20, 30, 40, 50, 60, 80, 100, 150, 200})
        for (std::uint64_t seed : {1, 2}) cases.push_back({n, seed, 1000});
    cases.push_back({120, 2, 1000});  // 120 vertices, seed 1: Boost's result is not perfect
    cases.push_back({120, 3, 1000});
    for (const Case& c : cases) {
        std::mt19937_64 random(c.seed);
        std::uniform_int_distribution<int> cost(0, c.max_cost);
        CostMatrix costs(c.n, 0.0);
        for (std::size_t i = 0; i < c.n; ++i)
            for (std::size_t j = i + 1; j < c.n; ++j) costs(i, j) = costs(j, i) = cost(random);
        const std::vector<int> ours = planners::tours::minimum_weight_perfect_matching(costs);
        const std::vector<int> reference = boost_blossom(costs);
        INFO("n " << c.n << " seed " << c.seed << " costs 0.." << c.max_cost);
        REQUIRE(is_perfect(ours));
        REQUIRE(is_perfect(reference));
        CHECK(planners::tours::matching_cost(costs, ours) == planners::tours::matching_cost(costs, reference));
    }
}

TEST_CASE("minimum matching is perfect and never costlier than the greedy matching") {
    // Reference: an optimum is by definition no costlier than any other perfect matching; the
    // greedy matching with pair exchanges is one. Instances: random ones and the odd tree cities
    // of the TSPLIB instances (Reinelt 1991).
    std::mt19937_64 random(43);
    std::vector<CostMatrix> instances;
    for (CostKind kind : {CostKind::small_integers, CostKind::reals, CostKind::plane_distances})
        for (std::size_t n : {12, 40, 90}) instances.push_back(random_costs(n, kind, random));
    for (const char* name : {"berlin52", "kroA100", "ch150", "kroA200", "a280", "lin318", "pcb442"}) {
        const auto instance = test::read_tsplib_file(test::fixture_path(std::string("tsplib/symmetric/") + name + ".tsp"));
        instances.push_back(submatrix(instance.costs, odd_tree_cities(instance.costs)));
    }
    for (const CostMatrix& costs : instances) {
        const std::vector<int> ours = planners::tours::minimum_weight_perfect_matching(costs);
        const std::vector<int> greedy = planners::tours::greedy_perfect_matching(costs);
        INFO("size " << costs.size());
        REQUIRE(is_perfect(ours));
        REQUIRE(is_perfect(greedy));
        CHECK(planners::tours::matching_cost(costs, ours) <= planners::tours::matching_cost(costs, greedy) + 1e-9);
    }
}

TEST_CASE("minimum matching refuses odd vertex counts and non-finite costs") {
    CHECK_THROWS_AS(planners::tours::minimum_weight_perfect_matching(CostMatrix(3, 1.0)), std::invalid_argument);
    CHECK_THROWS_AS(planners::tours::minimum_weight_perfect_matching(CostMatrix(4)), std::invalid_argument);  // missing = +inf
    CHECK(planners::tours::minimum_weight_perfect_matching(CostMatrix(0)).empty());
}

TEST_CASE("Christofides tours are within 1.5 times the TSPLIB optimum") {
    // Reference: TSPLIB published optima (fixtures/tsplib/symmetric/optimal.txt, Reinelt 1991)
    // and Christofides (1976): under the triangle inequality, tour <= 1.5 x optimum.
    // TSPLIB's EUC_2D distances are rounded to the nearest integer, so they satisfy the triangle
    // inequality only up to 1 unit: d(a,c) <= d(a,b) + d(b,c) + 1. Going through the proof with
    // that slack, each city skipped by a shortcut costs at most 1 unit (the Euler circuit skips
    // fewer than n/2 cities), and the matching bound (optimal tour shortcut to the odd cities,
    // then split into two matchings) loses at most 1 unit per skipped city, half of which falls
    // on the cheaper matching: tour <= 1.5 x optimum + n units in all. CEIL_2D, ATT and GEO round
    // up a metric distance (d in [true, true + 1)), which keeps the inequality exactly, and
    // EXPLICIT instances are used only when checked to satisfy it; the same margin is used.
    const auto optima = test::read_tsplib_optima(test::fixture_path("tsplib/symmetric/optimal.txt"));
    int checked = 0;
    for (const auto& [name, optimum] : optima) {
        const std::string path = test::fixture_path("tsplib/symmetric/" + name + ".tsp");
        const std::string type = edge_weight_type(path);
        const auto instance = test::read_tsplib_file(path);
        const bool metric = type == "EUC_2D" || type == "CEIL_2D" || type == "ATT" || type == "GEO" ||
                            (type == "EXPLICIT" && satisfies_triangle_inequality(instance.costs));
        if (!metric) continue;
        const std::size_t n = instance.costs.size();
        const planners::tours::ChristofidesTour result = planners::tours::christofides(instance.costs, 0, n);
        const double cost = planners::tours::closed_tour_cost(instance.costs, result.tour);
        INFO(name << " (" << type << "): tour " << cost << ", optimum " << optimum);
        CHECK(result.minimum_weight_matching);
        CHECK(result.tour.size() == n);
        CHECK(cost <= 1.5 * static_cast<double>(optimum) + static_cast<double>(n));
        CHECK(cost >= static_cast<double>(optimum));
        ++checked;
    }
    CHECK(checked >= 25);
}

TEST_CASE("Christofides falls back to the greedy matching above its odd-city limit, and says so") {
    // Reference: TSPLIB kroA100 (Reinelt 1991); a tour is a permutation of the cities, and the
    // exact-matching tour keeps Christofides' 1.5 bound (published optimum 21282, margin n).
    const auto instance = test::read_tsplib_file(test::fixture_path("tsplib/symmetric/kroA100.tsp"));
    const planners::tours::ChristofidesTour exact = planners::tours::christofides(instance.costs, 3);
    const planners::tours::ChristofidesTour greedy = planners::tours::christofides(instance.costs, 3, 0);
    CHECK(exact.minimum_weight_matching);
    CHECK_FALSE(greedy.minimum_weight_matching);
    for (const auto* result : {&exact, &greedy}) {
        std::vector<int> sorted = result->tour;
        std::sort(sorted.begin(), sorted.end());
        std::vector<int> cities(100);
        for (int i = 0; i < 100; ++i) cities[static_cast<std::size_t>(i)] = i;
        CHECK(sorted == cities);
        CHECK(result->tour.front() == 3);
    }
    CHECK(planners::tours::closed_tour_cost(instance.costs, exact.tour) <= 1.5 * 21282 + 100);
    CHECK(planners::tours::christofides_tour(instance.costs, 3) == exact.tour);
}
