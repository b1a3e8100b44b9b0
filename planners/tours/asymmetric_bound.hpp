#pragma once
// Lower bound for asymmetric costs: the better of the assignment bound (up to 600 cities, as it
// takes O(n^3) time) and the Held–Karp bound
// of the asymmetric problem, computed as the 1-tree bound of its symmetric transformation
// (Jonker & Volgenant 1983): city i becomes i_in and i_out joined by a forced edge of cost 0;
// i_out-j_in costs c(i,j); in-in and out-out edges are unusable. A tour of the 2n cities that
// uses every forced edge is exactly an asymmetric tour of the same cost.
// The penalties are returned for ranking candidates: reduced cost of i->j is
// c(i,j) + out_penalty[i] + in_penalty[j].

#include "planners/matrices/cost_matrix.hpp"

#include <cstddef>
#include <vector>

namespace ringroad::planners::tours {

struct AsymmetricBound {
    double value = 0.0;
    double assignment = 0.0;
    double held_karp = 0.0;
    std::vector<double> in_penalty;
    std::vector<double> out_penalty;
    bool tour_found = false;
};

// `unusable` must exceed any tour cost (it prices the in-in and out-out edges).
AsymmetricBound asymmetric_lower_bound(const matrices::CostMatrix& costs, double upper_bound, std::size_t max_iterations,
                                       double unusable);

} // namespace ringroad::planners::tours
