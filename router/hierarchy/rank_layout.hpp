#pragma once
// arrange_by_rank: a contracted graph (router/hierarchy/contraction_rounds.hpp: mixed upward arcs per
// routing node) rearranged the way ContractionHierarchy stores and searches it: nodes numbered by
// rank, and per rank the climbing arcs (rank -> higher) and the descending arcs (higher -> rank)
// in separate adjacency arrays, with the middle ranks of shortcuts kept apart. The arcs of a
// node keep the contraction's order, so the result is as deterministic as the contraction.

#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/hierarchy/contraction_rounds.hpp"

#include <cstdint>
#include <vector>

namespace ringroad::router::hierarchy {

struct RankedArcArrays {
    std::vector<std::uint32_t> first;    // size: ranks + 1
    std::vector<RankedArc> arcs;
    std::vector<std::uint32_t> middle;   // per arc: middle rank, or kNoNode
};

struct RankLayout {
    std::vector<std::uint32_t> rank;      // per routing node
    std::vector<NodeId> node_at;          // per rank
    RankedArcArrays climbing;
    RankedArcArrays descending;
};

RankLayout arrange_by_rank(const ContractedGraph& contracted);

} // namespace ringroad::router::hierarchy
