#pragma once
// Dijkstra's algorithm on the routing graph from several weighted start nodes, with an early
// stop once a given set of nodes is settled. The workspace is reused between queries: labels are
// stamped with a query number, so a query touches only what it reaches (no O(n) clearing).
// The priority queue has no decrease-key: an improved label is queued again and the stale copy
// skipped when it comes out (on road graphs labels rarely improve after their first reach).
// Keys (packed weights, see metric.hpp) are grouped in blocks of 2^shift units (keys sharing
// key >> shift, a block about 16 median node weights wide, RoutingGraph::search_block_shift).
//  * The current block is a bucket queue with exact order: 4096 slots of consecutive key
//    ranges, each an unsorted list; a bitmap finds the next filled slot and a pop takes the
//    smallest key of that slot's short list. Dijkstra's keys never fall below the last popped
//    one, so slots are visited in order. When no node weighs less than a slot's width (no
//    sub-second roads), keys in one slot cannot improve one another (Dial's argument) and a
//    pop takes the slot's first item without searching. It replaced a 4-ary heap, whose pops
//    were a third of the time even when small (Andorra one-to-all 0.385 -> 0.282 ms).
//  * Later keys wait unsorted in radix buckets, by the highest block-number bit that differs
//    from the current block, and move down when the current block runs empty (a radix heap
//    over blocks). Very long edges (ferries, or a generator's far-away bends) therefore never
//    crowd the current block: before, they left 850 000 items in the heap on the
//    1000 x 1000 random grid.
// A node with a single incoming arc (41% of Andorra's edge-based routing graph: roads leaving a
// vertex where only two roads meet, turn-arounds at dead ends) bypasses the queue: once its
// predecessor is scanned with a final label, its own label is final, so it is scanned next from
// a stack. Every node is still scanned once, with its exact Dijkstra distance.
// A scan reads its successors as a range of consecutive nodes (RoutingGraph::SearchNode): their
// records and labels are prefetched when the node is queued, which on graphs larger than the
// caches hides most of the label misses (1000 x 1000 grid: 0.3 of the per-node time).
// Not thread-safe: one workspace per thread.

#include "router/metric.hpp"
#include "router/routing_graph.hpp"

#include <cstdint>
#include <span>
#include <vector>

namespace ringroad::router {

struct WeightedNode {
    NodeId node = kNoNode;
    PackedWeight weight = 0;    // initial label
};

class DijkstraWorkspace {
public:
    // A queued node. Each entry carries the node's successor code
    // (RoutingGraph::SearchNode::successors) in what would be padding, so a scan finds the
    // successors without reading the node's record.
    struct QueuedNode {
        PackedWeight key;
        NodeId node;
        std::uint32_t successors;
    };
    struct SlotItem {
        PackedWeight key;
        NodeId node;
        std::uint32_t successors;
        std::uint32_t next;   // next item in the same slot
    };
    struct PendingNode {
        NodeId node;
        std::uint32_t successors;
    };

    explicit DijkstraWorkspace(std::uint32_t node_count = 0);

    // Label of a node in the last query: kUnreachableWeight if not reached (or not settled
    // before the early stop, in which case it is an upper bound, see is_settled).
    PackedWeight distance(NodeId node) const {
        return labels_[node].stamp >> 2 == query_ ? labels_[node].distance : kUnreachableWeight;
    }
    bool is_settled(NodeId node) const { return labels_[node].stamp >> 2 == query_ && (labels_[node].stamp & 1u); }
    // Predecessor node on the shortest path tree, kNoNode for a start node (on exact ties of the
    // packed weight, any of the equally short predecessors).
    NodeId parent(NodeId node) const { return labels_[node].parent; }
    std::uint32_t settled_count() const noexcept { return settled_count_; }

    // The nodes from a start node to `node` along the tree (node must be reached).
    std::vector<NodeId> tree_path(NodeId node) const;

private:
    friend void run_dijkstra(const RoutingGraph&, Metric, std::span<const WeightedNode>,
                             std::span<const NodeId>, DijkstraWorkspace&);
    // 16 bytes, so four labels share a cache line.
    struct Label {
        PackedWeight distance;
        NodeId parent;
        std::uint32_t stamp;      // query_ << 2 | state bits (settled, target): the label belongs
                                  // to this query when stamp >> 2 == query_
    };
    void start_query(std::uint32_t node_count);

    std::vector<Label> labels_;
    // The current block's slots (see run_dijkstra): list heads, a bitmap of filled slots, and
    // the pool of list items with a free list.
    std::vector<std::uint32_t> slot_heads_;
    std::uint64_t filled_slots_[65] = {};   // 4096 bits, and a last word the scan never reaches
    std::vector<SlotItem> slot_items_;
    std::vector<QueuedNode> buckets_[65];       // later blocks, see run_dijkstra
    std::vector<PendingNode> final_labels_;   // stack: reached through their only incoming arc, final, unscanned
    std::uint32_t query_ = 0;
    std::uint32_t settled_count_ = 0;
};

// Settles nodes in order of distance from `starts` until every node of `stop_when_settled` is
// settled (all reachable nodes when it is empty). Costs: entering node f costs f's weight.
void run_dijkstra(const RoutingGraph& graph, Metric metric, std::span<const WeightedNode> starts,
                  std::span<const NodeId> stop_when_settled, DijkstraWorkspace& workspace);

} // namespace ringroad::router
