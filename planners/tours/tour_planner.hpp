#pragma once
// plan_tour: the best tour through every stop of a cost matrix, with a lower bound on the optimum
// so the caller knows how far from optimal the answer can be.
//  * closed tour from `start`; open trip from `start` to a fixed `end`; or open with a free end;
//  * exact (Held–Karp) up to `exact_limit` stops, proven optimal;
//  * otherwise constructions + local search + iterated perturbation until the time limit,
//    deterministic for a given seed, with the Held–Karp 1-tree bound (symmetric) or the
//    assignment bound and the Held–Karp bound of the asymmetric problem (asymmetric).
// Determinism: the time limit is converted into a budget of work units (move evaluations,
// array steps and bound matrix entries, calibrated so that one second of budget takes about one
// CPU second on the development machine). The search stops when the budget is spent, so the same matrix, request and seed
// give the same tour on any machine and under any load; the elapsed time only approximates the
// limit. `work_limit` replaces that conversion by an explicit budget. See TOURS.md.

#include "planners/matrices/cost_matrix.hpp"

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace ringroad::planners::tours {

enum class TourMethod {
    automatic,       // exact when small enough, else heuristics + local search + bound
    tree_doubling,   // the plain MST doubling tour with shortcuts (2-approximation under the
                     // triangle inequality), for comparison
};

enum class TripShape { closed, open_fixed_end, open_free_end };

// The longest time limit a request may ask for: a day of search. It keeps the work budget (time
// limit x work units per second) well inside a 64-bit count.
inline constexpr double kLongestTimeLimitSeconds = 86400.0;

struct TourRequest {
    std::size_t start = 0;
    TripShape shape = TripShape::closed;
    std::size_t end = 0;                 // used with open_fixed_end
    double time_limit_seconds = 1.0;
    std::uint64_t seed = 1;
    std::size_t exact_limit = 16;        // Held–Karp up to this many stops (at most 20)
    TourMethod method = TourMethod::automatic;
    std::optional<std::uint64_t> work_limit;  // explicit search budget in work units; when set
                                              // the time limit is not used for the search
    std::vector<std::string> stop_labels;     // optional: names for error messages ("stop 'A7'"),
                                              // one per matrix row; empty means "stop <index>"
};

// "stop 'label'" when the request labels its stops, else "stop <index>".
std::string describe_stop(const TourRequest& request, std::size_t index);

struct TourResult {
    std::vector<std::size_t> order;      // stop indices, order[0] == start; a closed tour does not
                                         // repeat the start at the end
    std::vector<double> hop_costs;       // cost of each hop: order.size() - 1 for open trips,
                                         // order.size() for closed tours (last hop back to start)
    double cost = 0.0;
    double lower_bound = 0.0;
    double gap = 0.0;                    // (cost - lower_bound) / lower_bound; 0 when proven,
                                         // 1 when the bound is 0 but the tour is not free
    bool proven_optimal = false;
    std::string method;                  // e.g. "held-karp", "greedy+2-opt+or-opt+double-bridge"
    double elapsed_seconds = 0.0;
    bool symmetric = false;              // whether the matrix was treated as symmetric
    std::uint64_t kicks = 0;             // perturbations tried by the iterated search
};

// Throws InputError when no tour exists (a stop cannot be reached / left through finite
// entries) naming the stop index, or when the request is inconsistent (start/end out of range,
// exact_limit above 20).
TourResult plan_tour(const matrices::CostMatrix& costs, const TourRequest& request);

} // namespace ringroad::planners::tours
