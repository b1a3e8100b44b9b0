#include "planners/tours/tour_planner.hpp"

#include "common/input_error.hpp"
#include "planners/tours/asymmetric_bound.hpp"
#include "planners/tours/candidate_lists.hpp"
#include "planners/tours/christofides.hpp"
#include "planners/tours/held_karp.hpp"
#include "planners/tours/missing_entries.hpp"
#include "planners/tours/one_tree_bound.hpp"
#include "planners/tours/open_trip_transform.hpp"
#include "planners/tours/perturbation.hpp"
#include "planners/tours/tour_construction.hpp"
#include "planners/tours/tree_doubling.hpp"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <string>
#include <utility>

namespace ringroad::planners::tours {
namespace {

// Work units a second of time limit buys (measured on the development machine, a shared 2-core
// x86-64 VM: about 1 CPU second per second of limit, see bench/planners/tours/tour_bench.cpp). Fixed, so
// results never depend on the machine's speed or load.
constexpr double kWorkUnitsPerSecond = 120e6;
// Share of the budget for the Held–Karp bound's subgradient iterations.
constexpr double kBoundShareOfBudget = 0.3;
constexpr double kBoundUnitsPerEntry = 0.5;
constexpr std::size_t kFewestBoundIterations = 10;
constexpr std::size_t kMostBoundIterations = 3000;
// Trips this small are always solved exactly: the heuristics need room for their moves.
constexpr std::size_t kAlwaysExactStops = 5;
constexpr std::size_t kCandidatesPerCity = 10;
// Christofides' construction builds the k^2 matrix of the k odd tree vertices and matches them
// (blossom matching up to kLargestExactMatching odd vertices, greedy above: christofides.hpp); beyond this many
// cities the other constructions are used alone.
constexpr std::size_t kLargestChristofides = 1200;
// Above this many cities greedy edge looks at candidate connections only (memory).
constexpr std::size_t kLargestAllPairsGreedy = 1500;

void validate(const matrices::CostMatrix& costs, const TourRequest& request) {
    const std::size_t n = costs.size();
    if (n == 0) throw InputError("the matrix has no stops", "stops");
    if (request.start >= n)
        throw InputError("start stop index " + std::to_string(request.start) + " is outside 0.." + std::to_string(n - 1),
                         "start");
    if (request.shape == TripShape::open_fixed_end && request.end >= n)
        throw InputError("end stop index " + std::to_string(request.end) + " is outside 0.." + std::to_string(n - 1),
                         "end");
    if (!request.stop_labels.empty() && request.stop_labels.size() != n)
        throw InputError("stop labels: " + std::to_string(request.stop_labels.size()) + " labels for " +
                             std::to_string(n) + " stops",
                         "stops");
    if (request.exact_limit > kHeldKarpMaximumStops)
        throw InputError("exact limit " + std::to_string(request.exact_limit) + " is above the maximum of " +
                             std::to_string(kHeldKarpMaximumStops) + " stops",
                         "exact_limit");
    if (!(request.time_limit_seconds >= 0.0) || !(request.time_limit_seconds <= kLongestTimeLimitSeconds))
        throw InputError("time limit must be a number of seconds from 0 to 86400", "time_limit");
    for (std::size_t from = 0; from < n; ++from)
        for (std::size_t to = 0; to < n; ++to) {
            const double value = costs(from, to);
            if (from != to && (std::isnan(value) || value < 0.0))
                throw InputError("cost from " + describe_stop(request, from) + " to " + describe_stop(request, to) +
                                     " is not a non-negative number",
                                 "matrix");
        }
}

bool is_symmetric(const matrices::CostMatrix& costs) {
    for (std::size_t i = 0; i < costs.size(); ++i)
        for (std::size_t j = i + 1; j < costs.size(); ++j)
            if (costs(i, j) != costs(j, i) && !(std::isinf(costs(i, j)) && std::isinf(costs(j, i)))) return false;
    return true;
}

bool all_integral(const matrices::CostMatrix& costs) {
    for (std::size_t i = 0; i < costs.size(); ++i)
        for (std::size_t j = 0; j < costs.size(); ++j)
            if (costs.has(i, j) && costs(i, j) != std::floor(costs(i, j))) return false;
    return true;
}

bool is_closed(const TourRequest& request) {
    return request.shape == TripShape::closed ||
           (request.shape == TripShape::open_fixed_end && request.end == request.start);
}

// Fills order, hop costs and cost from the original matrix; throws when the order is not a
// valid trip made of available entries.
void describe_trip(const matrices::CostMatrix& costs, const TourRequest& request, std::vector<std::size_t> order,
                   TourResult& result, bool exhaustive) {
    const std::size_t n = costs.size();
    const bool closed = is_closed(request);
    if (order.size() != n || order.front() != request.start ||
        (request.shape == TripShape::open_fixed_end && !closed && order.back() != request.end))
        throw InputError("no tour through all stops was found that uses only available connections", "stops");
    result.order = std::move(order);
    result.hop_costs.clear();
    result.cost = 0.0;
    const std::size_t hops = closed ? n : n - 1;
    for (std::size_t k = 0; k < hops && n > 1; ++k) {
        const std::size_t from = result.order[k], to = result.order[(k + 1) % n];
        if (!costs.has(from, to))
            throw InputError(std::string(exhaustive ? "no tour exists that uses only available connections"
                                                    : "no tour using only available connections was found") +
                                 ": the best order needs the missing connection from " + describe_stop(request, from) +
                                 " to " + describe_stop(request, to),
                             "stops");
        result.hop_costs.push_back(costs(from, to));
        result.cost += costs(from, to);
    }
}

void set_gap(TourResult& result, bool integral) {
    double bound = std::max(0.0, result.lower_bound);
    if (integral) bound = std::ceil(bound - 1e-6);
    bound = std::min(bound, result.cost);
    result.lower_bound = bound;
    const double tolerance = 1e-9 * std::max(1.0, result.cost);
    result.proven_optimal = result.proven_optimal || result.cost <= bound + tolerance;
    result.gap = result.proven_optimal ? 0.0 : (bound > 0.0 ? (result.cost - bound) / bound : 1.0);
    if (result.proven_optimal) result.lower_bound = result.cost;
}

struct BoundWithPenalties {
    double value = 0.0;
    std::vector<double> successor_penalty;   // added to c(i,j) when ranking j as i's successor
    std::vector<double> predecessor_penalty; // added to c(i,j) when ranking i as j's predecessor
    bool tour_found = false;
    std::uint64_t work = 0;                  // upper estimate of the work units spent
};

BoundWithPenalties bound_closed_tour(const matrices::CostMatrix& costs, bool symmetric, double upper_bound, double budget,
                                     double unusable) {
    const double m = static_cast<double>(costs.size());
    // One dense 1-tree visits m^2/2 entries (4 m^2/2 for the doubled asymmetric matrix); an
    // entry costs about half a local-search work unit (measured on kroA100 and dsj1000).
    const double per_iteration = (symmetric ? 1.0 : 4.0) * m * m / 2.0 * kBoundUnitsPerEntry;
    const auto iterations = static_cast<std::size_t>(std::clamp(
        budget * kBoundShareOfBudget / per_iteration, double(kFewestBoundIterations), double(kMostBoundIterations)));
    BoundWithPenalties bound;
    bound.work = static_cast<std::uint64_t>(per_iteration * static_cast<double>(iterations));
    if (symmetric) {
        const OneTreeBound one_tree = held_karp_one_tree_bound(costs, upper_bound, iterations);
        bound.value = one_tree.value;
        bound.successor_penalty = bound.predecessor_penalty = one_tree.penalties;
        bound.tour_found = one_tree.tour_found;
    } else {
        const AsymmetricBound directed = asymmetric_lower_bound(costs, upper_bound, iterations, unusable);
        bound.value = directed.value;
        bound.successor_penalty = directed.in_penalty;
        bound.predecessor_penalty = directed.out_penalty;
    }
    return bound;
}

struct Construction {
    std::string name;
    ClosedTour tour;
};

std::vector<Construction> construct_tours(const ClosedTripProblem& problem, bool symmetric,
                                         const CandidateLists& nearest) {
    std::vector<Construction> tours;
    const bool large = problem.costs.size() > kLargestAllPairsGreedy;
    tours.push_back({"greedy-edge", greedy_edge_tour(problem.costs, symmetric, large ? &nearest : nullptr)});
    if (symmetric && problem.costs.size() <= kLargestChristofides) {
        ChristofidesTour christofides_result = christofides(problem.costs, problem.start);
        tours.push_back({christofides_result.minimum_weight_matching ? "christofides" : "christofides-greedy-matching",
                         std::move(christofides_result.tour)});
    }
    tours.push_back({"nearest-neighbour", nearest_neighbour_tour(problem.costs, problem.start)});
    tours.push_back({"tree-doubling", tree_doubling_tour(problem.costs, problem.start)});
    return tours;
}

TourResult plan_exactly(const matrices::CostMatrix& costs, const matrices::CostMatrix& finite, const TourRequest& request) {
    const HeldKarpResult exact = held_karp(finite, request.start, request.shape, request.end);
    TourResult result;
    describe_trip(costs, request, exact.order, result, true);
    result.lower_bound = result.cost;
    result.proven_optimal = true;
    result.gap = 0.0;
    result.method = "held-karp";
    return result;
}

struct SearchContext {
    ClosedTripProblem problem;
    bool symmetric = true;
    bool integral = true;
    double budget = 0.0;      // work units
    double unusable = 0.0;    // price of links no tour may take
};

TourResult plan_tree_doubling(const matrices::CostMatrix& costs, const TourRequest& request, const SearchContext& context) {
    const ClosedTripProblem& problem = context.problem;
    TourResult result;
    if (is_closed(request)) {
        const ClosedTour tour = tree_doubling_tour(problem.costs, problem.start);
        describe_trip(costs, request, trip_order(problem, tour, context.symmetric), result, false);
    } else {
        // The closed form's joining city would sit next to the start in the tree walk, on the wrong
        // side; an open trip is walked on the stops' own costs instead.
        const auto end = request.shape == TripShape::open_fixed_end ? std::optional<std::size_t>(request.end) : std::nullopt;
        describe_trip(costs, request,
                      tree_doubling_trip(with_missing_entries_as(costs, context.unusable), request.start, end), result,
                      false);
    }
    result.lower_bound = bound_closed_tour(problem.costs, context.symmetric, result.cost + problem.constant,
                                           context.budget, context.unusable)
                             .value -
                         problem.constant;
    result.method = "tree-doubling";
    return result;
}

// Every construction, polished by local search; the cheapest one wins (ties: the earlier).
IteratedSearchResult best_polished_construction(const SearchContext& context, const CandidateLists& nearest,
                                                const CandidateLists& nearest_in, const IteratedSearchSettings& settings,
                                                std::string& construction) {
    IteratedSearchResult best;
    std::uint64_t work = 0;
    for (const Construction& start : construct_tours(context.problem, context.symmetric, nearest)) {
        const IteratedSearchResult polished = polish_tour(context.problem.costs, nearest, nearest_in, start.tour, settings);
        work += polished.work;
        if (construction.empty() || polished.cost < best.cost) {
            best = polished;
            construction = start.name;
        }
    }
    best.work = work;
    return best;
}

TourResult plan_heuristically(const matrices::CostMatrix& costs, matrices::CostMatrix finite, bool symmetric, const TourRequest& request,
                              double ceiling) {
    SearchContext context;
    context.unusable = 3.0 * ceiling;
    context.problem = close_trip(std::move(finite), symmetric, request, ceiling, context.unusable);
    context.symmetric = symmetric;
    context.integral = all_integral(costs);
    context.budget = request.work_limit ? static_cast<double>(*request.work_limit)
                                        : request.time_limit_seconds * kWorkUnitsPerSecond;
    if (request.method == TourMethod::tree_doubling) return plan_tree_doubling(costs, request, context);
    const matrices::CostMatrix& closed_costs = context.problem.costs;

    IteratedSearchSettings settings;
    settings.symmetric = symmetric;
    settings.epsilon = context.integral ? 0.5 : 1e-9 * ceiling;
    settings.seed = request.seed;
    const std::size_t per_city = std::min(kCandidatesPerCity, closed_costs.size() - 1);
    const CandidateLists nearest = successor_candidates(closed_costs, per_city);
    const CandidateLists nearest_in = symmetric ? nearest : predecessor_candidates(closed_costs, per_city);
    std::string construction;
    IteratedSearchResult best = best_polished_construction(context, nearest, nearest_in, settings, construction);
    // Constructions sort all pairs: count them as a few units per matrix entry.
    std::uint64_t work_spent = best.work + 4 * static_cast<std::uint64_t>(closed_costs.size() * closed_costs.size());

    // The bound's penalties rank the candidates of the iterated search (reduced costs).
    const BoundWithPenalties bound = bound_closed_tour(closed_costs, symmetric, best.cost, context.budget, context.unusable);
    work_spent += bound.work;
    const CandidateLists successors = successor_candidates(closed_costs, per_city, bound.successor_penalty);
    const CandidateLists predecessors =
        symmetric ? successors : predecessor_candidates(closed_costs, per_city, bound.predecessor_penalty);

    settings.work_budget = context.budget > static_cast<double>(work_spent)
                               ? static_cast<std::uint64_t>(context.budget) - work_spent
                               : 0;
    settings.good_enough = context.integral ? std::ceil(bound.value - 1e-6) : bound.value;
    const IteratedSearchResult searched = iterated_local_search(closed_costs, successors, predecessors, best.tour, settings);
    const bool kicks_helped = searched.cost < best.cost - settings.epsilon;
    if (searched.cost <= best.cost) best = searched;

    TourResult result;
    result.kicks = searched.kicks;
    describe_trip(costs, request, trip_order(context.problem, best.tour, symmetric), result, false);
    result.lower_bound = bound.value - context.problem.constant;
    result.method = construction + (symmetric ? "+2-opt+or-opt" : "+or-opt+segment-exchange") +
                    (kicks_helped ? "+double-bridge" : "");
    return result;
}

} // namespace

std::string describe_stop(const TourRequest& request, std::size_t index) {
    if (index < request.stop_labels.size()) return "stop '" + request.stop_labels[index] + "'";
    return "stop " + std::to_string(index);
}

TourResult plan_tour(const matrices::CostMatrix& costs, const TourRequest& request) {
    const auto started = std::chrono::steady_clock::now();
    validate(costs, request);
    check_stops_connectable(costs, request);
    const std::size_t n = costs.size();
    const bool symmetric = is_symmetric(costs);
    const double ceiling = tour_cost_ceiling(costs);
    matrices::CostMatrix finite = with_missing_entries_as(costs, 3.0 * ceiling);

    TourResult result;
    if (request.method == TourMethod::automatic &&
        (n <= request.exact_limit || n <= kAlwaysExactStops)) {
        result = plan_exactly(costs, finite, request);
    } else if (n <= 2 || (n <= 3 && symmetric)) {
        result = plan_exactly(costs, finite, request);  // every order costs the same
    } else {
        result = plan_heuristically(costs, std::move(finite), symmetric, request, ceiling);
        set_gap(result, all_integral(costs));
    }
    result.symmetric = symmetric;
    result.elapsed_seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
    return result;
}

} // namespace ringroad::planners::tours
