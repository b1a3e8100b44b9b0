#pragma once
// ContractionGraph: the shrinking, growing graph a contraction works on. Every node keeps its
// outgoing and its incoming arcs (at most one arc per neighbour and direction: a cheaper
// shortcut replaces a dearer arc) in flat pools with a per-node capacity, so 3 million nodes cost
// three small arrays and one pool per direction, not six million heap blocks. A list that
// outgrows its room moves to the end of its pool with twice the room; the pool is compacted when
// more than half of it is abandoned space.
// Spans returned by out()/in() stay valid until the next change to the graph: the parallel phases
// of a contraction only read, the changes happen between them on one thread.

#include "router/metric.hpp"
#include "router/routing_graph.hpp"

#include <cstdint>
#include <span>
#include <vector>

namespace ringroad::router::hierarchy {

// An arc of the contraction graph, seen from one end: the node at the other end, the middle
// node of a shortcut (kNoNode for an original turn arc) and the weight.
struct ContractionArc {
    NodeId other;
    NodeId middle;
    PackedWeight weight;
};

// The arcs of every node in one direction, in flat storage with a capacity per node.
class ArcPool {
public:
    // `counts[v]` arcs expected at v; each list gets a little room to grow.
    void reset(std::span<const std::uint32_t> counts);
    std::span<const ContractionArc> arcs(NodeId node) const { return {pool_.data() + lists_[node].begin, lists_[node].size}; }
    std::span<ContractionArc> arcs(NodeId node) { return {pool_.data() + lists_[node].begin, lists_[node].size}; }
    void append(NodeId node, const ContractionArc& arc);
    // Removes the arc towards `other`, keeping the order of the rest.
    void erase(NodeId node, NodeId other);
    // Drops every arc of `node` and gives up its room.
    void release(NodeId node);
    void release_memory();

private:
    void compact();

    // Where a node's list lies in the pool (one 16-byte record: one cache line access).
    struct List {
        std::uint64_t begin;
        std::uint32_t size;
        std::uint32_t capacity;
    };
    std::vector<List> lists_;
    std::vector<ContractionArc> pool_;
    std::uint64_t abandoned_ = 0;
};

class ContractionGraph {
public:
    // The routing graph's turn arcs weighted for `metric` (a loop arc e -> e is left out: driving
    // a loop road twice never shortens a path).
    ContractionGraph(const RoutingGraph& routing_graph, Metric metric);

    std::uint32_t node_count() const noexcept { return node_count_; }
    std::span<const ContractionArc> out(NodeId node) const { return out_.arcs(node); }
    std::span<const ContractionArc> in(NodeId node) const { return in_.arcs(node); }

    // Adds from -> to, or lowers the weight of the existing arc when `weight` is smaller.
    void add_or_improve(NodeId from, NodeId to, PackedWeight weight, NodeId middle);
    // Removes `node` and all arcs touching it.
    void remove_node(NodeId node);
    // Gives the memory back once the contraction is over.
    void release_memory();

private:
    std::uint32_t node_count_;
    ArcPool out_;
    ArcPool in_;
};

} // namespace ringroad::router::hierarchy
