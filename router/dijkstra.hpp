#pragma once
// Dijkstra's algorithm on the routing graph from several weighted start nodes, with an early
// stop once a given set of nodes is settled. The workspace is reused between queries: labels are
// stamped with a query number, so a query touches only what it reaches (no O(n) clearing).
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
    explicit DijkstraWorkspace(std::uint32_t node_count = 0);

    // Label of a node in the last query: kUnreachableWeight if not reached (or not settled
    // before the early stop, in which case it is an upper bound, see is_settled).
    PackedWeight distance(NodeId node) const {
        return stamp_[node] == query_ ? distance_[node] : kUnreachableWeight;
    }
    bool is_settled(NodeId node) const { return stamp_[node] == query_ && settled_[node]; }
    // Predecessor node on the shortest path tree, kNoNode for a start node.
    NodeId parent(NodeId node) const { return parent_[node]; }
    std::uint32_t settled_count() const noexcept { return settled_count_; }

    // The nodes from a start node to `node` along the tree (node must be reached).
    std::vector<NodeId> tree_path(NodeId node) const;

private:
    friend void run_dijkstra(const RoutingGraph&, Metric, std::span<const WeightedNode>,
                             std::span<const NodeId>, DijkstraWorkspace&);
    void start_query(std::uint32_t node_count);
    void heap_push_or_decrease(NodeId node, PackedWeight weight);
    NodeId heap_pop();

    std::vector<PackedWeight> distance_;
    std::vector<NodeId> parent_;
    std::vector<std::uint32_t> stamp_;
    std::vector<std::uint8_t> settled_;
    std::vector<std::uint32_t> heap_position_;
    std::vector<NodeId> heap_;          // 4-ary min-heap of nodes keyed by distance_
    std::uint32_t query_ = 0;
    std::uint32_t settled_count_ = 0;
};

// Settles nodes in order of distance from `starts` until every node of `stop_when_settled` is
// settled (all reachable nodes when it is empty). Costs: entering node f costs f's weight.
void run_dijkstra(const RoutingGraph& graph, Metric metric, std::span<const WeightedNode> starts,
                  std::span<const NodeId> stop_when_settled, DijkstraWorkspace& workspace);

} // namespace ringroad::router
