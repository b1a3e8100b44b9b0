// Local search and constructions: results are tours, never worse than their start, and with
// full candidate lists locally optimal by the textbook definition of each move (checked here by
// exhaustive enumeration, independent of the move code).
#include "planners/tours/array_tour.hpp"
#include "planners/tours/candidate_lists.hpp"
#include "planners/tours/christofides.hpp"
#include "planners/tours/perturbation.hpp"
#include "planners/tours/tour_construction.hpp"
#include "planners/tours/tree_doubling.hpp"
#include "tests/planners/tours/tour_brute_force.hpp"

#include <catch2/catch.hpp>

using namespace ringroad;
using planners::tours::ClosedTour;

namespace {

bool is_tour(const ClosedTour& tour, std::size_t n) {
    std::vector<std::size_t> order(tour.begin(), tour.end());
    return test::is_permutation_of_stops(order, n);
}

// Best improvement of any 2-opt move (reverse tour[i+1..j]) for symmetric costs.
double best_two_opt_gain(const planners::matrices::CostMatrix& costs, const ClosedTour& tour) {
    const std::size_t n = tour.size();
    double best = 0.0;
    auto c = [&](int a, int b) { return costs(static_cast<std::size_t>(a), static_cast<std::size_t>(b)); };
    for (std::size_t i = 0; i < n; ++i)
        for (std::size_t j = i + 2; j < n; ++j) {
            const int a = tour[i], b = tour[i + 1], d1 = tour[j], d2 = tour[(j + 1) % n];
            if (d2 == a) continue;
            best = std::max(best, c(a, b) + c(d1, d2) - c(a, d1) - c(b, d2));
        }
    return best;
}

// Best improvement of moving a segment of 1-3 cities elsewhere without turning it round.
double best_directed_or_opt_gain(const planners::matrices::CostMatrix& costs, const ClosedTour& tour) {
    const std::size_t n = tour.size();
    double best = 0.0;
    for (std::size_t length = 1; length <= 3 && length + 2 < n; ++length)
        for (std::size_t first = 0; first < n; ++first) {
            ClosedTour rest;
            ClosedTour segment;
            for (std::size_t k = 0; k < n; ++k) {
                const int city = tour[(first + k) % n];
                (k < length ? segment : rest).push_back(city);
            }
            for (std::size_t gap = 0; gap + 1 < rest.size(); ++gap) {
                ClosedTour moved(rest.begin(), rest.begin() + static_cast<std::ptrdiff_t>(gap + 1));
                moved.insert(moved.end(), segment.begin(), segment.end());
                moved.insert(moved.end(), rest.begin() + static_cast<std::ptrdiff_t>(gap + 1), rest.end());
                best = std::max(best, planners::tours::closed_tour_cost(costs, tour) - planners::tours::closed_tour_cost(costs, moved));
            }
        }
    return best;
}

} // namespace

TEST_CASE("constructions return tours") {
    std::mt19937_64 random(1);
    for (bool symmetric : {true, false}) {
        const auto costs = test::random_matrix(60, symmetric, random);
        CHECK(is_tour(planners::tours::nearest_neighbour_tour(costs, 3), 60));
        CHECK(planners::tours::nearest_neighbour_tour(costs, 3).front() == 3);
        CHECK(is_tour(planners::tours::greedy_edge_tour(costs, symmetric), 60));
        CHECK(is_tour(planners::tours::tree_doubling_tour(costs, 5), 60));
        CHECK(planners::tours::tree_doubling_tour(costs, 5).front() == 5);
        if (symmetric) CHECK(is_tour(planners::tours::christofides_tour(costs, 2), 60));
    }
}

TEST_CASE("symmetric local search reaches a 2-opt local optimum") {
    std::mt19937_64 random(2);
    for (int round = 0; round < 5; ++round) {
        const auto costs = test::random_matrix(40, true, random);
        const auto full = planners::tours::successor_candidates(costs, 39);
        const ClosedTour start = planners::tours::nearest_neighbour_tour(costs, 0);
        planners::tours::IteratedSearchSettings settings;
        settings.epsilon = 0.5;
        const auto result = planners::tours::polish_tour(costs, full, full, start, settings);
        CHECK(is_tour(result.tour, 40));
        CHECK(result.cost == planners::tours::closed_tour_cost(costs, result.tour));
        CHECK(result.cost <= planners::tours::closed_tour_cost(costs, start));
        CHECK(best_two_opt_gain(costs, result.tour) <= 0.0);
    }
}

TEST_CASE("directed local search reaches a direction-keeping Or-opt local optimum") {
    std::mt19937_64 random(3);
    for (int round = 0; round < 5; ++round) {
        const auto costs = test::random_matrix(30, false, random);
        const auto successors = planners::tours::successor_candidates(costs, 29);
        const auto predecessors = planners::tours::predecessor_candidates(costs, 29);
        const ClosedTour start = planners::tours::nearest_neighbour_tour(costs, 0);
        planners::tours::IteratedSearchSettings settings;
        settings.symmetric = false;
        settings.epsilon = 0.5;
        const auto result = planners::tours::polish_tour(costs, successors, predecessors, start, settings);
        CHECK(is_tour(result.tour, 30));
        CHECK(result.cost <= planners::tours::closed_tour_cost(costs, start));
        CHECK(best_directed_or_opt_gain(costs, result.tour) <= 0.0);
    }
}

TEST_CASE("iterated search never ends worse than its start and is reproducible") {
    std::mt19937_64 random(4);
    for (bool symmetric : {true, false}) {
        const auto costs = test::random_matrix(80, symmetric, random);
        const auto successors = planners::tours::successor_candidates(costs, 10);
        const auto predecessors = symmetric ? successors : planners::tours::predecessor_candidates(costs, 10);
        const ClosedTour start = planners::tours::greedy_edge_tour(costs, symmetric);
        planners::tours::IteratedSearchSettings settings;
        settings.symmetric = symmetric;
        settings.epsilon = 0.5;
        settings.work_budget = 500'000;
        settings.seed = 77;
        const auto polished = planners::tours::polish_tour(costs, successors, predecessors, start, settings);
        const auto first = planners::tours::iterated_local_search(costs, successors, predecessors, start, settings);
        const auto second = planners::tours::iterated_local_search(costs, successors, predecessors, start, settings);
        CHECK(is_tour(first.tour, 80));
        CHECK(first.cost <= polished.cost);
        CHECK(first.kicks > 0);
        CHECK(first.tour == second.tour);
    }
}

TEST_CASE("array tour undo restores the exact order") {
    ClosedTour order(50);
    std::iota(order.begin(), order.end(), 0);
    planners::tours::ArrayTour tour(order);
    const std::size_t mark = tour.journal_mark();
    tour.reverse_positions(45, 5);  // wraps around the end
    tour.exchange_segments(10, 7, 4);
    tour.reverse_path(3, 30);
    CHECK(tour.cities() != order);
    tour.undo_to(mark);
    CHECK(tour.cities() == order);
    for (int city = 0; city < 50; ++city) CHECK(tour.position(city) == city);
}
