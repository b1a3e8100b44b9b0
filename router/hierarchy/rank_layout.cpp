#include "router/hierarchy/rank_layout.hpp"

namespace ringroad::router::hierarchy {

namespace {

// Adds `node`'s arcs usable in `direction` to `out` (whose first[] must already have this rank's
// start), translated to ranks.
void append_arcs(const ContractedGraph& contracted, NodeId node, std::uint32_t direction, RankedArcArrays& out) {
    for (std::uint32_t i = contracted.first_arc[node]; i < contracted.first_arc[node + 1]; ++i) {
        const HierarchyArc& arc = contracted.arcs[i];
        if (!(arc.directions & direction)) continue;
        out.arcs.push_back({contracted.rank[arc.higher_node], arc.weight});
        out.middle.push_back(arc.middle_node == kNoNode ? kNoNode : contracted.rank[arc.middle_node]);
    }
    out.first.push_back(static_cast<std::uint32_t>(out.arcs.size()));
}

void reserve(RankedArcArrays& arrays, std::size_t ranks, std::size_t arcs) {
    arrays.first.reserve(ranks + 1);
    arrays.first.push_back(0);
    arrays.arcs.reserve(arcs);
    arrays.middle.reserve(arcs);
}

} // namespace

RankLayout arrange_by_rank(const ContractedGraph& contracted) {
    const std::size_t node_count = contracted.rank.size();
    RankLayout layout;
    layout.rank = contracted.rank;
    layout.node_at.resize(node_count);
    for (NodeId node = 0; node < node_count; ++node) layout.node_at[contracted.rank[node]] = node;
    std::size_t climbing = 0;
    std::size_t descending = 0;
    for (const HierarchyArc& arc : contracted.arcs) {
        climbing += (arc.directions & kArcForward) != 0;
        descending += (arc.directions & kArcBackward) != 0;
    }
    reserve(layout.climbing, node_count, climbing);
    reserve(layout.descending, node_count, descending);
    for (std::uint32_t rank = 0; rank < node_count; ++rank) {
        append_arcs(contracted, layout.node_at[rank], kArcForward, layout.climbing);
        append_arcs(contracted, layout.node_at[rank], kArcBackward, layout.descending);
    }
    return layout;
}

} // namespace ringroad::router::hierarchy
