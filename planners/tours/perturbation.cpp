#include "planners/tours/perturbation.hpp"

#include "planners/tours/local_search.hpp"

#include <algorithm>
#include <random>

namespace ringroad::planners::tours {
namespace {

// Longest stretch a kick moves: local kicks keep the repair local and cheap, which is what makes
// many thousands of kicks a second possible (common practice in iterated 2-opt/3-opt codes).
constexpr int kLongestKickSegment = 50;

// A B C D -> A C B D on positions after `position_before`; returns the cost change.
double double_bridge_kick(SearchState& state, std::mt19937_64& random) {
    ArrayTour& tour = state.tour;
    const int cities = tour.size();
    const int longest = std::max(1, std::min(kLongestKickSegment, (cities - 2) / 2));
    std::uniform_int_distribution<int> pick_position(0, cities - 1);
    std::uniform_int_distribution<int> pick_length(1, longest);
    const int before = pick_position(random);
    const int first_length = pick_length(random);
    const int second_length = pick_length(random);
    const int a = tour.at(before);
    const int b1 = tour.at(before + 1);
    const int b2 = tour.at(before + first_length);
    const int c1 = tour.at(before + first_length + 1);
    const int c2 = tour.at(before + first_length + second_length);
    const int e = tour.at(before + first_length + second_length + 1);
    const double change = state.c(a, c1) + state.c(c2, b1) + state.c(b2, e) - state.c(a, b1) -
                          state.c(b2, c1) - state.c(c2, e);
    tour.exchange_segments(before, first_length, second_length);
    state.activate({a, b1, b2, c1, c2, e});
    return change;
}

} // namespace

IteratedSearchResult polish_tour(const matrices::CostMatrix& costs, const CandidateLists& successors,
                                 const CandidateLists& predecessors, const ClosedTour& start,
                                 const IteratedSearchSettings& settings) {
    ArrayTour tour(start);
    ActiveCities active(start.size());
    SearchState state{costs, successors, predecessors, tour, active, settings.epsilon, closed_tour_cost(costs, start)};
    // Don't-look bits can miss a move whose cities' own links did not change, so sweep over
    // every city again until a whole sweep finds nothing: a true local optimum of the moves.
    double before_sweep = 0.0;
    do {
        before_sweep = state.cost;
        for (int city : tour.cities()) active.push(city);
        run_local_search(state, settings.symmetric);
    } while (state.cost < before_sweep - settings.epsilon);
    IteratedSearchResult result;
    result.tour = tour.cities();
    result.cost = closed_tour_cost(costs, result.tour);
    result.work = tour.work;
    return result;
}

IteratedSearchResult iterated_local_search(const matrices::CostMatrix& costs, const CandidateLists& successors,
                                           const CandidateLists& predecessors, const ClosedTour& start,
                                           const IteratedSearchSettings& settings) {
    ArrayTour tour(start);
    ActiveCities active(start.size());
    SearchState state{costs, successors, predecessors, tour, active, settings.epsilon, closed_tour_cost(costs, start)};
    for (int city : start) active.push(city);
    run_local_search(state, settings.symmetric);
    tour.clear_journal();
    double best_cost = state.cost;
    std::mt19937_64 random(settings.seed);
    IteratedSearchResult result;
    if (tour.size() >= 8) {
        while (tour.work < settings.work_budget && best_cost > settings.good_enough + settings.epsilon) {
            const std::size_t mark = tour.journal_mark();
            state.cost = best_cost + double_bridge_kick(state, random);
            run_local_search(state, settings.symmetric);
            ++result.kicks;
            if (state.cost <= best_cost + settings.epsilon) {
                best_cost = std::min(best_cost, state.cost);
                tour.clear_journal();
            } else {
                tour.undo_to(mark);
            }
            tour.work += 8;  // the kick itself and the bookkeeping
        }
    }
    result.tour = tour.cities();
    result.cost = closed_tour_cost(costs, result.tour);
    result.work = tour.work;
    return result;
}

} // namespace ringroad::planners::tours
