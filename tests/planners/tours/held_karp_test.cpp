// The exact solver against published TSPLIB optima (Reinelt 1991) and against brute force.
#include "common/input_error.hpp"
#include "planners/tours/held_karp.hpp"
#include "planners/tours/tour_planner.hpp"
#include "tests/planners/tours/tour_brute_force.hpp"
#include "tests/support/run_command.hpp"
#include "tests/support/tsplib_reader.hpp"

#include <catch2/catch.hpp>

#include <cmath>

using namespace ringroad;
using planners::tours::TripShape;

namespace {

planners::tours::TourResult plan_exactly(const planners::matrices::CostMatrix& costs, planners::tours::TourRequest request) {
    request.exact_limit = std::max<std::size_t>(request.exact_limit, costs.size());
    return planners::tours::plan_tour(costs, request);
}

} // namespace

TEST_CASE("Held-Karp reproduces the published TSPLIB optima") {
    // Optimal tour lengths as published with TSPLIB (fixtures/tsplib/*/optimal.txt).
    const struct {
        const char* file;
        double optimum;
    } cases[] = {{"symmetric/burma14.tsp", 3323}, {"symmetric/ulysses16.tsp", 6859},
                 {"asymmetric/br17.atsp", 39}, {"symmetric/gr17.tsp", 2085}};
    for (const auto& c : cases) {
        INFO(c.file);
        const auto instance = test::read_tsplib_file(test::fixture_path(std::string("tsplib/") + c.file));
        planners::tours::TourRequest request;
        const auto result = plan_exactly(instance.costs, request);
        CHECK(result.cost == c.optimum);
        CHECK(result.method == "held-karp");
        CHECK(result.proven_optimal);
        CHECK(result.gap == 0.0);
        CHECK(result.lower_bound == c.optimum);
        CHECK(result.order.front() == 0);
        CHECK(test::is_permutation_of_stops(result.order, instance.costs.size()));
        CHECK(test::trip_cost(instance.costs, result, true) == c.optimum);
        CHECK(result.hop_costs.size() == instance.costs.size());
    }
}

TEST_CASE("Held-Karp equals brute force on random matrices up to 9 stops") {
    std::mt19937_64 random(20240607);
    for (std::size_t n = 1; n <= 9; ++n)
        for (bool symmetric : {true, false})
            for (int round = 0; round < 3; ++round) {
                const auto costs = test::random_matrix(n, symmetric, random, round == 2 ? 1000000 : 100);
                for (TripShape shape : {TripShape::closed, TripShape::open_fixed_end, TripShape::open_free_end}) {
                    planners::tours::TourRequest request;
                    request.start = n / 2;
                    request.shape = shape;
                    request.end = n - 1;
                    INFO("n=" << n << " symmetric=" << symmetric << " shape=" << int(shape));
                    const auto result = plan_exactly(costs, request);
                    const double optimum = test::brute_force_optimum(costs, request);
                    CHECK(result.cost == optimum);
                    const bool closed = shape == TripShape::closed || (shape == TripShape::open_fixed_end && request.end == request.start);
                    CHECK(test::trip_cost(costs, result, closed) == optimum);
                    CHECK(result.order.front() == request.start);
                    if (shape == TripShape::open_fixed_end && !closed) CHECK(result.order.back() == request.end);
                    CHECK(test::is_permutation_of_stops(result.order, n));
                    CHECK(result.hop_costs.size() == (n == 1 ? 0 : closed ? n : n - 1));  // one stop: no hops
                }
            }
}

TEST_CASE("Held-Karp handles non-integer costs (double table) and missing entries") {
    std::mt19937_64 random(7);
    std::uniform_real_distribution<double> cost(0.5, 50.0);
    for (int round = 0; round < 5; ++round) {
        planners::matrices::CostMatrix costs(8, 0.0);
        for (std::size_t i = 0; i < 8; ++i)
            for (std::size_t j = 0; j < 8; ++j)
                if (i != j) costs(i, j) = cost(random);
        costs(2, 5) = costs(5, 2) = costs(1, 3) = planners::matrices::kMissingCost;
        planners::tours::TourRequest request;
        const auto result = plan_exactly(costs, request);
        CHECK(result.cost == Approx(test::brute_force_optimum(costs, request)).epsilon(1e-12));
        for (double hop : result.hop_costs) CHECK(std::isfinite(hop));
    }
}

TEST_CASE("Held-Karp at 20 stops: points in convex position are toured in hull order") {
    // A tour of points in convex position is optimal exactly when it follows the convex hull:
    // an optimal Euclidean tour never crosses itself (Flood 1956, from memory; a crossing can
    // always be uncrossed shorter by the triangle inequality), and the hull order is the only
    // non-crossing one. 20 points on a circle, listed in a scrambled order.
    const std::size_t n = 20;
    std::vector<std::size_t> scramble(n);
    for (std::size_t k = 0; k < n; ++k) scramble[k] = (k * 7) % n;  // 7 is coprime with 20
    planners::matrices::CostMatrix costs(n, 0.0);
    auto angle = [&](std::size_t stop) { return 2.0 * M_PI * static_cast<double>(scramble[stop]) / n; };
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j)
            costs(i, j) = std::hypot(std::cos(angle(i)) - std::cos(angle(j)), std::sin(angle(i)) - std::sin(angle(j)));
    const double hull = n * 2.0 * std::sin(M_PI / n);
    planners::tours::TourRequest request;
    request.exact_limit = 20;
    const auto result = planners::tours::plan_tour(costs, request);
    CHECK(result.method == "held-karp");
    CHECK(result.cost == Approx(hull).epsilon(1e-12));
}

TEST_CASE("Held-Karp rejects sizes beyond its limit") {
    CHECK_THROWS(planners::tours::held_karp(planners::matrices::CostMatrix(21, 1.0), 0, TripShape::closed));
    planners::tours::TourRequest request;
    request.exact_limit = 21;
    CHECK_THROWS_AS(planners::tours::plan_tour(planners::matrices::CostMatrix(5, 1.0), request), InputError);
}
