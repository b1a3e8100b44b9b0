// Tree doubling for open trips (free end, and a fixed end): every stop once, from the start, to
// the end when one is given, at most twice the optimum on metric matrices. The reference is brute
// force over all orders; the factor 2 is the doubled-tree bound (the tree costs no more than the
// best trip, which is itself a spanning tree; walking it twice, less the start-end path once for
// a fixed end, covers every stop, and shortcuts cost nothing more under the triangle inequality:
// Rosenkrantz, Stearns & Lewis 1977 for tours, the same argument for paths).
#include "planners/tours/tour_planner.hpp"
#include "tests/planners/tours/tour_brute_force.hpp"

#include <catch2/catch.hpp>

#include <cmath>
#include <random>

using namespace ringroad;
using planners::tours::TripShape;

namespace {

// Euclidean distances between random points: metric.
planners::matrices::CostMatrix euclidean_matrix(std::size_t n, std::mt19937_64& random) {
    std::uniform_real_distribution<double> coordinate(0.0, 100.0);
    std::vector<std::pair<double, double>> points(n);
    for (auto& point : points) point = {coordinate(random), coordinate(random)};
    planners::matrices::CostMatrix costs(n);
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = 0; j < n; ++j)
            if (i != j) costs(i, j) = std::hypot(points[i].first - points[j].first, points[i].second - points[j].second);
    return costs;
}

// Asymmetric, like travel times on one-way streets: a detour of up to 30 % one way.
planners::matrices::CostMatrix asymmetric_matrix(std::size_t n, std::mt19937_64& random) {
    auto costs = euclidean_matrix(n, random);
    std::uniform_real_distribution<double> detour(1.0, 1.3);
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = i + 1; j < n; ++j) costs(i, j) *= detour(random);
    return costs;
}

} // namespace

TEST_CASE("tree doubling plans open trips with a free or a fixed end") {
    std::mt19937_64 random(11);
    for (int round = 0; round < 20; ++round) {
        const std::size_t n = 6 + static_cast<std::size_t>(round % 4);
        const auto costs = euclidean_matrix(n, random);
        for (const TripShape shape : {TripShape::open_free_end, TripShape::open_fixed_end}) {
            planners::tours::TourRequest request;
            request.method = planners::tours::TourMethod::tree_doubling;
            request.work_limit = 100'000;
            request.shape = shape;
            request.start = static_cast<std::size_t>(round) % n;
            request.end = (request.start + 3) % n;
            CAPTURE(round, n, static_cast<int>(shape));
            const auto result = planners::tours::plan_tour(costs, request);
            CHECK(result.method == "tree-doubling");
            REQUIRE(test::is_permutation_of_stops(result.order, n));
            CHECK(result.order.front() == request.start);
            if (shape == TripShape::open_fixed_end) CHECK(result.order.back() == request.end);
            CHECK(result.hop_costs.size() == n - 1);
            CHECK(test::trip_cost(costs, result, false) == Approx(result.cost));
            CHECK(result.cost <= 2.0 * test::brute_force_optimum(costs, request) + 1e-9);
        }
    }
}

TEST_CASE("tree doubling plans open trips on asymmetric matrices") {
    // No factor-2 guarantee without symmetry: a valid trip, from the start (to the end).
    std::mt19937_64 random(12);
    for (int round = 0; round < 20; ++round) {
        const std::size_t n = 6 + static_cast<std::size_t>(round % 6);
        const auto costs = asymmetric_matrix(n, random);
        for (const TripShape shape : {TripShape::open_free_end, TripShape::open_fixed_end}) {
            planners::tours::TourRequest request;
            request.method = planners::tours::TourMethod::tree_doubling;
            request.work_limit = 100'000;
            request.shape = shape;
            request.start = static_cast<std::size_t>(round) % n;
            request.end = (request.start + 2) % n;
            CAPTURE(round, n, static_cast<int>(shape));
            const auto result = planners::tours::plan_tour(costs, request);
            REQUIRE(test::is_permutation_of_stops(result.order, n));
            CHECK(result.order.front() == request.start);
            if (shape == TripShape::open_fixed_end) CHECK(result.order.back() == request.end);
            CHECK(test::trip_cost(costs, result, false) == Approx(result.cost));
        }
    }
}
