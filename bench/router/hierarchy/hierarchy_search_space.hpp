#pragma once
// average_search_space: how many nodes an upward search settles (and does not stall) on average,
// over 200 random start nodes searched forward and backward alternately. The benchmarks report
// it as a measure of hierarchy quality: a query costs about two such searches.

#include "router/hierarchy/hierarchy_query.hpp"

#include <random>
#include <vector>

namespace ringroad::bench {

inline double average_search_space(const router::hierarchy::ContractionHierarchy& hierarchy) {
    router::hierarchy::HierarchySearch search(hierarchy);
    std::vector<router::WeightedNode> settled;
    std::mt19937_64 random(4);
    for (int k = 0; k < 200; ++k) {
        const router::WeightedNode from{static_cast<router::NodeId>(random() % hierarchy.node_count()), 0};
        search.upward_search({&from, 1}, k % 2 == 0, settled);
    }
    return static_cast<double>(settled.size()) / 200.0;
}

} // namespace ringroad::bench
