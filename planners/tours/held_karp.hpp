#pragma once
// held_karp: the exact optimum by the Held–Karp dynamic programme (Held & Karp 1962; Bellman
// 1962) over subsets of stops, for closed tours and open trips (fixed or free end).
// Time O(2^n n^2), memory 2^(n-1) (n-1) table entries. The table holds uint32 costs when every
// entry is a non-negative integer and n+1 times the largest entry stays below 2^31 (exact, 4
// bytes an entry: 38 MiB at 20 stops), otherwise doubles (8 bytes: 76 MiB at 20 stops).
// Entries may be +infinity (missing); the result cost is then +infinity when no order avoids them.

#include "planners/matrices/cost_matrix.hpp"
#include "planners/tours/tour_planner.hpp"

#include <cstddef>
#include <vector>

namespace ringroad::planners::tours {

inline constexpr std::size_t kHeldKarpMaximumStops = 20;

struct HeldKarpResult {
    std::vector<std::size_t> order;   // order[0] == start; open trips end at order.back()
    double cost = matrices::kMissingCost;
};

// Requires 1 <= costs.size() <= kHeldKarpMaximumStops, start (and end) < costs.size().
HeldKarpResult held_karp(const matrices::CostMatrix& costs, std::size_t start, TripShape shape,
                         std::size_t end = 0);

} // namespace ringroad::planners::tours
