#pragma once
// RoutingGraph: the edge-based graph both Dijkstra and the contraction hierarchy search, derived
// deterministically from a graph::RoadGraph, or mapped from the `rg.` sections `ringroad build`
// stores in the file (layout in router/STORED.md): then it is a set of spans into the mapping and
// opening a region derives nothing.
//
// One routing node per road edge (graph::EdgeId): node e means "having driven along edge e, now
// at its head vertex". A turn arc e -> f exists when f leaves e's head and the turn is allowed;
// its cost is the cost of f (so a path's cost is the sum of the edges driven after the first).
// Turns are forbidden when
//  * f drives back along e's segment (a U-turn) and e's head is not a dead end (a vertex with a
//    single road segment touching it): U-turns happen only where the road ends;
//  * a turn restriction applies and `honour_turn_restrictions` is set: `no_*` forbids (from, via,
//    to), `only_*` forbids every other exit of `via` when arriving along `from`.
// Because the expansion is exact, restrictions and U-turn rules hold everywhere, not only at
// junctions that were split; the price is about twice as many nodes as junctions.

#include "graph/road_graph.hpp"
#include "router/metric.hpp"

#include <cstdint>
#include <memory>
#include <optional>
#include <span>
#include <vector>

namespace ringroad::router {

using NodeId = std::uint32_t;            // == graph::EdgeId
inline constexpr NodeId kNoNode = graph::kNoEdge;

enum class RestrictionPolicy : std::uint8_t {
    automatic,   // honour when the graph's profile is "car" (or unknown), ignore for bicycle/foot
    honour,
    ignore,
};

class RoutingGraph {
public:
    RoutingGraph() = default;
    // Derives the expansion from the road graph (what a file without `rg.` sections needs).
    RoutingGraph(const graph::RoadGraph& road_graph, RestrictionPolicy policy);

    // The routing graph stored in the road graph's `rg.` sections, viewed in place, when they
    // exist, have this build's layout version and were stored for the restriction setting
    // `policy` means for this graph; nullopt otherwise (derive it then). Throws InputError naming
    // the section and record when the stored arrays are damaged or inconsistent (an id out of
    // range, offsets that do not ascend, a record disagreeing with the road graph).
    static std::optional<RoutingGraph> from_sections(const graph::RoadGraph& road_graph, RestrictionPolicy policy);
    // The stored graph when usable, else the derived one.
    static RoutingGraph stored_or_derived(const graph::RoadGraph& road_graph, RestrictionPolicy policy);
    // The `rg.` sections for `ringroad build` (layout in router/STORED.md).
    std::vector<graph::ExtraSection> to_sections() const;
    // Whether this graph is a view of stored sections (rather than derived in memory).
    bool is_stored() const noexcept { return stored_; }

    std::uint32_t node_count() const noexcept { return static_cast<std::uint32_t>(edges_.size()); }
    std::uint32_t arc_count() const noexcept { return static_cast<std::uint32_t>(arc_head_.size()); }
    bool honours_turn_restrictions() const noexcept { return honours_restrictions_; }

    // Successors of node e (allowed turns), in the order of the road graph's adjacency.
    std::span<const NodeId> successors(NodeId node) const {
        return {arc_head_.data() + first_arc_[node], first_arc_[node + 1] - first_arc_[node]};
    }
    // Predecessors of node f: the nodes with an allowed turn into f.
    std::span<const NodeId> predecessors(NodeId node) const {
        return {reverse_arc_tail_.data() + first_reverse_arc_[node],
                first_reverse_arc_[node + 1] - first_reverse_arc_[node]};
    }

    // Cost of entering node f (driving all of edge f).
    std::uint32_t node_time_ds(NodeId node) const { return edges_[node].time_ds; }
    std::uint32_t node_length_dm(NodeId node) const { return edges_[node].length_dm; }
    PackedWeight node_weight(Metric metric, NodeId node) const {
        return search_nodes_[static_cast<int>(metric)][node].weight;
    }

    // Per node, what a search needs in one 16-byte record. Node e's successors are edges leaving
    // e's head vertex, which are numbered consecutively (the road graph's CSR order): all of
    // them but at most one skipped (the U-turn, or one restricted turn), so they are described
    // by a range of node ids instead of an arc list. A scan then reads the successors' records
    // and labels as two runs of consecutive entries, and both can be prefetched as soon as e is
    // queued, from the code alone: on large graphs the successor labels were the main cache miss.
    // The 32-bit code (`successors`):
    //   bit 0      1 when e has a single predecessor (its only incoming arc is the one relaxed);
    //   bits 1-4   successor range length (0-14), or kSuccessorList: e's successors are listed
    //              in arc_heads()[first_arc()[e] .. first_arc()[e + 1]) (vertices with 15 or
    //              more exits, or more than one forbidden turn);
    //   bits 5-8   position in the range that is not a successor, kNoSkippedSuccessor if none;
    //   bits 9-31  the range's first node, or kFirstSuccessorElsewhere: read first_successor.
    struct SearchNode {
        PackedWeight weight;               // == node_weight(metric, e)
        std::uint32_t successors;          // code above
        std::uint32_t first_successor;     // first node of the range (meaningless with a list)
    };
    static constexpr std::uint32_t kSuccessorList = 15;
    static constexpr std::uint32_t kNoSkippedSuccessor = 15;
    static constexpr std::uint32_t kFirstSuccessorElsewhere = (1u << 23) - 1;
    std::span<const SearchNode> search_nodes(Metric metric) const noexcept {
        return search_nodes_[static_cast<int>(metric)];
    }

    // Dijkstra's queue keeps the current block of 2^shift packed-weight units (keys sharing
    // key >> shift) in exact order and later blocks in radix buckets (see dijkstra.hpp): a block
    // spans 16 to 32 median node weights of the primary quantity, so most pushes land in the
    // current block.
    unsigned search_block_shift(Metric metric) const noexcept { return search_block_shift_[static_cast<int>(metric)]; }
    // The smallest node weight (0 for an empty graph): keys closer than this cannot improve one
    // another, so the queue may take them in any order.
    PackedWeight smallest_node_weight(Metric metric) const noexcept { return smallest_node_weight_[static_cast<int>(metric)]; }

    std::span<const std::uint32_t> first_arc() const noexcept { return first_arc_; }
    std::span<const NodeId> arc_heads() const noexcept { return arc_head_; }

    // A number that changes whenever the expansion would (used to check a stored hierarchy
    // belongs to this graph): FNV-1a over node count, arcs and costs.
    std::uint64_t fingerprint() const noexcept { return fingerprint_; }

private:
    struct DerivedArrays;
    // Owns what the spans point into: the derived arrays, or the road graph whose mapping holds
    // the stored sections. Either way it keeps the road graph's edges (node costs) alive.
    std::shared_ptr<const void> storage_;
    std::span<const graph::Edge> edges_;          // node e's costs are edge e's
    std::span<const std::uint32_t> first_arc_;
    std::span<const NodeId> arc_head_;
    std::span<const std::uint32_t> first_reverse_arc_;
    std::span<const NodeId> reverse_arc_tail_;
    std::span<const SearchNode> search_nodes_[2];
    unsigned search_block_shift_[2] = {32, 32};
    PackedWeight smallest_node_weight_[2] = {0, 0};
    bool honours_restrictions_ = false;
    bool stored_ = false;
    std::uint64_t fingerprint_ = 0;
};

// Whether `policy` means restrictions are honoured for this graph (reads metadata "profile").
bool should_honour_restrictions(const graph::RoadGraph& road_graph, RestrictionPolicy policy);

} // namespace ringroad::router
