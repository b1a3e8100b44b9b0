#pragma once
// diagnose_matrix: what a planner should know about a cost matrix before trusting its answer.
//  * symmetry: pairs whose two directions differ (one-ways make road matrices asymmetric);
//  * missing entries (no connection), with examples;
//  * triangle-inequality violations: c(a,b) > c(a,via) + c(via,b). Tree-doubling's 2x guarantee
//    and Christofides' bound assume there are none; the metric closure removes them.
// The triangle check looks at every (from, via, to) triple while their number stays within
// `full_check_triples` (about 3e7 triples: n <= 310, a fraction of a second); above that it checks
// every pair against an evenly spread sample of `via` stops, sized to keep the same budget, and
// says so (`triangle_sampled`): the counts are then lower bounds.

#include "planners/matrices/cost_matrix.hpp"

#include <cstddef>
#include <vector>

namespace ringroad::planners::matrices {

struct StopPair {
    std::size_t from;
    std::size_t to;
};

struct TriangleViolation {
    std::size_t from;
    std::size_t via;
    std::size_t to;
    double direct;      // c(from, to)
    double through;     // c(from, via) + c(via, to)
};

struct MatrixDiagnostics {
    std::size_t size = 0;
    bool symmetric = true;
    std::size_t asymmetric_pairs = 0;        // unordered pairs {a, b} with c(a,b) != c(b,a)
    double largest_asymmetry = 0.0;          // max |c(a,b) - c(b,a)| over finite pairs
    std::vector<StopPair> asymmetry_examples;

    std::size_t missing_entries = 0;         // off-diagonal entries with no connection
    std::vector<StopPair> missing_examples;

    std::size_t triangle_violations = 0;     // (from, via, to) triples found shorter via `via`
    std::vector<TriangleViolation> triangle_examples;  // the largest excesses first
    bool triangle_sampled = false;
    std::size_t via_stops_checked = 0;       // == size unless sampled
};

struct DiagnosticsOptions {
    std::size_t max_examples = 5;
    double full_check_triples = 3.0e7;
    // Relative slack so rounding (0.1 + 0.2 vs 0.3) is not reported as a violation.
    double relative_tolerance = 1e-9;
};

MatrixDiagnostics diagnose_matrix(const CostMatrix& costs, const DiagnosticsOptions& options = {});

} // namespace ringroad::planners::matrices
