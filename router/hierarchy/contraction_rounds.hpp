#pragma once
// contract_in_rounds: orders and contracts every node of the routing graph for one metric, the
// way the parallel contraction-hierarchy builds do it (Vetter 2009, "Parallel Time-Dependent
// Contraction Hierarchies"; Geisberger et al. 2008 for the priority terms):
//  * every node has a priority: 3 x edge difference (shortcuts it would need minus arcs it
//    removes) + contracted neighbours + depth; the simulation uses a cheap, hop-limited witness
//    search, and is repeated for a dense node only when its arc count has changed noticeably;
//  * a round contracts at once every node whose priority is smaller than that of all its
//    remaining neighbours (an independent set: no two are adjacent), the witness searches of the
//    round running on all threads against the graph as it was before the round;
//  * the shortcuts are then inserted and the neighbours' priorities re-evaluated, in parallel.
// The result depends on the graph only, never on the number of threads or their timing: work
// is cut into chunks whose size depends on the amount of work only, and their results are
// applied in chunk order.

#include "router/metric.hpp"
#include "router/routing_graph.hpp"

#include <cstdint>
#include <vector>

namespace ringroad { class Progress; }

namespace ringroad::router::hierarchy {

// One upward arc as the contraction produces it, stored at its lower node, usable forwards,
// backwards or both.
struct HierarchyArc {
    NodeId higher_node;
    NodeId middle_node;          // kNoNode for an original turn arc, else the shortcut's middle
    PackedWeight weight;
    std::uint32_t directions;    // kArcForward: lower -> higher exists; kArcBackward: higher -> lower
};
inline constexpr std::uint32_t kArcForward = 1;
inline constexpr std::uint32_t kArcBackward = 2;

// The contraction's result, indexed by routing node: rank per node, upward arcs grouped by their
// lower node. router/hierarchy/rank_layout.hpp rearranges it into the stored layout (router/hierarchy/HIERARCHY.md).
struct ContractedGraph {
    std::vector<std::uint32_t> rank;
    std::vector<std::uint32_t> first_arc;
    std::vector<HierarchyArc> arcs;
};

// `threads` == 0: all cores. `progress` may be null.
ContractedGraph contract_in_rounds(const RoutingGraph& routing_graph, Metric metric, unsigned threads,
                                   Progress* progress);

} // namespace ringroad::router::hierarchy
