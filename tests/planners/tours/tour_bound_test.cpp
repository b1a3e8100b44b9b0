// Lower bounds against brute force: every bound must be at most the optimum found by trying
// every order (and the assignment bound equal to the brute-force best assignment).
#include "planners/tours/assignment_bound.hpp"
#include "planners/tours/asymmetric_bound.hpp"
#include "planners/tours/one_tree_bound.hpp"
#include "tests/planners/tours/tour_brute_force.hpp"
#include "tests/support/run_command.hpp"
#include "tests/support/tsplib_reader.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;

namespace {

double brute_force_assignment(const planners::matrices::CostMatrix& costs) {
    std::vector<std::size_t> successor(costs.size());
    std::iota(successor.begin(), successor.end(), 0);
    double best = planners::matrices::kMissingCost;
    do {
        double total = 0.0;
        bool fixed_point = false;
        for (std::size_t i = 0; i < costs.size(); ++i) {
            fixed_point = fixed_point || successor[i] == i;
            total += costs(i, successor[i]);
        }
        if (!fixed_point) best = std::min(best, total);
    } while (std::next_permutation(successor.begin(), successor.end()));
    return best;
}

} // namespace

TEST_CASE("1-tree bound never exceeds the brute-force optimum") {
    std::mt19937_64 random(11);
    for (std::size_t n = 3; n <= 9; ++n)
        for (int round = 0; round < 6; ++round) {
            const auto costs = test::random_matrix(n, true, random);
            const double optimum = test::brute_force_optimum(costs, planners::tours::TourRequest{});
            const auto bound = planners::tours::held_karp_one_tree_bound(costs, optimum, 300);
            INFO("n=" << n);
            CHECK(bound.value <= optimum + 1e-6);
            CHECK(bound.value > 0.0);
            if (bound.tour_found) CHECK(bound.value == Approx(optimum));
        }
}

TEST_CASE("1-tree bound on TSPLIB instances is below and near the published optimum") {
    // Published optima (TSPLIB). The Held-Karp bound is within a few percent on these.
    const auto optima = test::read_tsplib_optima(test::fixture_path("tsplib/symmetric/optimal.txt"));
    for (const char* name : {"ulysses22", "fri26", "dantzig42", "st70", "pr76", "rd100"}) {
        const auto instance = test::read_tsplib_file(test::fixture_path(std::string("tsplib/symmetric/") + name + ".tsp"));
        const double optimum = static_cast<double>(optima.at(name));
        const auto bound = planners::tours::held_karp_one_tree_bound(instance.costs, optimum, 500);
        INFO(name);
        CHECK(bound.value <= optimum + 1e-6);
        CHECK(bound.value >= 0.97 * optimum);
    }
}

TEST_CASE("assignment bound equals the brute-force best assignment and is below the optimum") {
    std::mt19937_64 random(12);
    for (std::size_t n = 2; n <= 7; ++n)
        for (int round = 0; round < 5; ++round) {
            const auto costs = test::random_matrix(n, false, random);
            INFO("n=" << n);
            CHECK(planners::tours::assignment_bound(costs) == brute_force_assignment(costs));
            CHECK(planners::tours::assignment_bound(costs) <= test::brute_force_optimum(costs, planners::tours::TourRequest{}));
        }
}

TEST_CASE("asymmetric bound never exceeds the optimum and is at least the assignment bound") {
    std::mt19937_64 random(13);
    for (std::size_t n = 3; n <= 9; ++n)
        for (int round = 0; round < 5; ++round) {
            const auto costs = test::random_matrix(n, false, random);
            const double optimum = test::brute_force_optimum(costs, planners::tours::TourRequest{});
            const auto bound = planners::tours::asymmetric_lower_bound(costs, optimum, 300, 1e6);
            INFO("n=" << n);
            CHECK(bound.held_karp <= optimum + 1e-6);
            CHECK(bound.value <= optimum + 1e-6);
            CHECK(bound.value >= bound.assignment);
            CHECK(bound.assignment == brute_force_assignment(costs));
        }
    // TSPLIB ftv33 (optimum 1286, published): the bound is below it and within 10 %.
    const auto ftv33 = test::read_tsplib_file(test::fixture_path("tsplib/asymmetric/ftv33.atsp"));
    const auto bound = planners::tours::asymmetric_lower_bound(ftv33.costs, 1286, 500, 1e6);
    CHECK(bound.value <= 1286.0 + 1e-6);
    CHECK(bound.value >= 0.9 * 1286.0);
}
