#pragma once
// RoutingGraph: the edge-based graph both Dijkstra and the contraction hierarchy search, derived
// deterministically from a graph::RoadGraph at load time.
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
    RoutingGraph(const graph::RoadGraph& road_graph, RestrictionPolicy policy);

    std::uint32_t node_count() const noexcept { return static_cast<std::uint32_t>(node_time_ds_.size()); }
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
    std::uint32_t node_time_ds(NodeId node) const { return node_time_ds_[node]; }
    std::uint32_t node_length_dm(NodeId node) const { return node_length_dm_[node]; }
    PackedWeight node_weight(Metric metric, NodeId node) const {
        return node_weights_[static_cast<int>(metric)][node];
    }
    // All nodes' packed weights for one metric (the inner loop of the searches reads these).
    std::span<const PackedWeight> node_weights(Metric metric) const noexcept {
        return node_weights_[static_cast<int>(metric)];
    }

    // Per arc, what a search needs in one 16-byte record: the head, the head's weight
    // (search_arcs(metric)[a].weight == node_weight(metric, arc_heads()[a])), and whether this
    // arc is the head's only incoming arc. A search reads them in step, with no random access
    // but the head's label.
    struct SearchArc {
        NodeId head;
        std::uint32_t only_arc_into_head;   // 1 when the head has exactly one predecessor
        PackedWeight weight;
    };
    std::span<const SearchArc> search_arcs(Metric metric) const noexcept {
        return search_arcs_[static_cast<int>(metric)];
    }

    std::span<const std::uint32_t> first_arc() const noexcept { return first_arc_; }
    std::span<const NodeId> arc_heads() const noexcept { return arc_head_; }

    // A number that changes whenever the expansion would (used to check a stored hierarchy
    // belongs to this graph): FNV-1a over node count, arcs and costs.
    std::uint64_t fingerprint() const noexcept { return fingerprint_; }

private:
    std::vector<std::uint32_t> first_arc_;
    std::vector<NodeId> arc_head_;
    std::vector<std::uint32_t> first_reverse_arc_;
    std::vector<NodeId> reverse_arc_tail_;
    std::vector<std::uint32_t> node_time_ds_;
    std::vector<std::uint32_t> node_length_dm_;
    std::vector<PackedWeight> node_weights_[2];
    std::vector<SearchArc> search_arcs_[2];
    bool honours_restrictions_ = false;
    std::uint64_t fingerprint_ = 0;
};

// Whether `policy` means restrictions are honoured for this graph (reads metadata "profile").
bool should_honour_restrictions(const graph::RoadGraph& road_graph, RestrictionPolicy policy);

} // namespace ringroad::router
