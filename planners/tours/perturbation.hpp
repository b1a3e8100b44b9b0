#pragma once
// Iterated local search (Lourenço, Martin & Stützle): perturb the best tour with a segment-local
// double-bridge kick (Martin, Otto & Felten 1991: A B C D -> A C B D, which keeps every
// segment's direction, so it serves asymmetric costs too), repair it with local search, keep
// the result when it is no longer than the best, otherwise undo the trial exactly.
// Deterministic: random choices come from std::mt19937_64 seeded by `seed`, and the search stops
// after `work_budget` work units (never on the wall clock) or when `good_enough` is reached.

#include "planners/tours/candidate_lists.hpp"
#include "planners/tours/closed_tour.hpp"

#include <cstdint>

namespace ringroad::planners::tours {

struct IteratedSearchResult {
    ClosedTour tour;
    double cost = 0.0;
    std::uint64_t kicks = 0;
    std::uint64_t work = 0;
};

struct IteratedSearchSettings {
    bool symmetric = true;
    std::uint64_t work_budget = 0;
    std::uint64_t seed = 1;
    double good_enough = 0.0;   // stop as soon as the tour costs at most this (e.g. the bound)
    double epsilon = 1e-9;
};

// Local search only (no kicks), repeated over all cities until a full sweep finds no
// improving move: returns the locally optimal tour and its cost.
IteratedSearchResult polish_tour(const matrices::CostMatrix& costs, const CandidateLists& successors,
                                 const CandidateLists& predecessors, const ClosedTour& tour,
                                 const IteratedSearchSettings& settings);

IteratedSearchResult iterated_local_search(const matrices::CostMatrix& costs, const CandidateLists& successors,
                                           const CandidateLists& predecessors, const ClosedTour& tour,
                                           const IteratedSearchSettings& settings);

} // namespace ringroad::planners::tours
