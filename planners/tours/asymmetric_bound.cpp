#include "planners/tours/asymmetric_bound.hpp"

#include "planners/tours/assignment_bound.hpp"
#include "planners/tours/one_tree_bound.hpp"

#include <algorithm>

namespace ringroad::planners::tours {

AsymmetricBound asymmetric_lower_bound(const matrices::CostMatrix& costs, double upper_bound, std::size_t max_iterations,
                                       double unusable) {
    const std::size_t n = costs.size();
    AsymmetricBound bound;
    // The Hungarian method is O(n^3) and outside the work budget; above this size the 1-tree
    // bound alone is used (it is the stronger one whenever its iterations converge).
    constexpr std::size_t kLargestAssignment = 600;
    if (n <= kLargestAssignment) bound.assignment = assignment_bound(costs);
    // Cities 0..n-1 are the "in" copies, n..2n-1 the "out" copies.
    matrices::CostMatrix doubled(2 * n, unusable);
    std::vector<int> partner(2 * n);
    for (std::size_t i = 0; i < n; ++i) {
        doubled(i, n + i) = doubled(n + i, i) = 0.0;
        partner[i] = static_cast<int>(n + i);
        partner[n + i] = static_cast<int>(i);
        for (std::size_t j = 0; j < n; ++j)
            if (i != j) doubled(n + i, j) = doubled(j, n + i) = std::min(costs(i, j), unusable);
    }
    for (std::size_t v = 0; v < 2 * n; ++v) doubled(v, v) = 0.0;
    const OneTreeBound held_karp = held_karp_one_tree_bound(doubled, upper_bound, max_iterations, partner);
    bound.held_karp = held_karp.value;
    bound.tour_found = held_karp.tour_found;
    bound.in_penalty.assign(held_karp.penalties.begin(), held_karp.penalties.begin() + static_cast<std::ptrdiff_t>(n));
    bound.out_penalty.assign(held_karp.penalties.begin() + static_cast<std::ptrdiff_t>(n), held_karp.penalties.end());
    bound.value = std::max(bound.assignment, bound.held_karp);
    return bound;
}

} // namespace ringroad::planners::tours
