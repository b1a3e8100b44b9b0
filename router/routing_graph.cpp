#include "router/routing_graph.hpp"

#include <algorithm>
#include <bit>
#include <unordered_map>

namespace ringroad::router {

namespace {
// A block is 16 median node weights wide: wide enough that few pushes overflow into buckets on
// road graphs (measured on random grids: 8 to 32 were equally good, 1 to 2 and 128 slower),
// narrow enough that far keys (very long edges) stay out of the heap.
constexpr unsigned kBlockExtraBits = 4;

// Vertices touched by exactly one segment end: the only places a U-turn is allowed.
std::vector<std::uint8_t> dead_ends(const graph::RoadGraph& road_graph) {
    std::vector<std::uint32_t> segment_ends(road_graph.vertex_count(), 0);
    for (const graph::Segment& segment : road_graph.segments()) {
        if (segment.forward_edge == graph::kNoEdge && segment.backward_edge == graph::kNoEdge) continue;
        ++segment_ends[segment.first_vertex];
        ++segment_ends[segment.last_vertex];
    }
    std::vector<std::uint8_t> result(segment_ends.size());
    for (std::size_t v = 0; v < segment_ends.size(); ++v) result[v] = segment_ends[v] == 1;
    return result;
}

// The turn rules at one via vertex, looked up while expanding the edges that enter it.
class TurnRules {
public:
    TurnRules(const graph::RoadGraph& road_graph, bool honour) {
        if (!honour) return;
        for (const graph::TurnRestriction& restriction : road_graph.turn_restrictions()) {
            rules_by_via_[restriction.via_vertex].push_back(restriction);
        }
    }

    bool allowed(graph::VertexId via, graph::SegmentId from, graph::SegmentId to) const {
        const auto found = rules_by_via_.find(via);
        if (found == rules_by_via_.end()) return true;
        bool has_only_rule = false;
        bool listed_by_only_rule = false;
        for (const graph::TurnRestriction& rule : found->second) {
            if (rule.from_segment != from) continue;
            if (rule.kind == static_cast<std::uint8_t>(graph::RestrictionKind::no_turn)) {
                if (rule.to_segment == to) return false;
            } else {
                has_only_rule = true;
                listed_by_only_rule = listed_by_only_rule || rule.to_segment == to;
            }
        }
        return !has_only_rule || listed_by_only_rule;
    }

private:
    std::unordered_map<graph::VertexId, std::vector<graph::TurnRestriction>> rules_by_via_;
};

// The median node weight's primary quantity (robust to a few very long edges such as ferries)
// rounded up to a power of two, as a shift of the packed weight.
unsigned block_shift_for(const std::vector<PackedWeight>& weights) {
    if (weights.empty()) return 32;
    std::vector<std::uint32_t> primary(weights.size());
    for (std::size_t node = 0; node < weights.size(); ++node) primary[node] = static_cast<std::uint32_t>(weights[node] >> 32);
    const auto middle = primary.begin() + static_cast<std::ptrdiff_t>(primary.size() / 2);
    std::nth_element(primary.begin(), middle, primary.end());
    return std::min(63u, 32u + static_cast<unsigned>(std::bit_width(*middle)) + kBlockExtraBits);
}

std::uint64_t fnv1a(std::uint64_t hash, std::uint64_t value) {
    for (int byte = 0; byte < 8; ++byte) {
        hash ^= (value >> (8 * byte)) & 0xffu;
        hash *= 1099511628211ull;
    }
    return hash;
}

// The 32-bit successor code of `node` (RoutingGraph::SearchNode), whose head's exits are the
// nodes [range_begin, range_end).
std::uint32_t successor_code(const std::vector<std::uint32_t>& first_arc, const std::vector<NodeId>& arc_head,
                             const std::vector<std::uint32_t>& first_reverse_arc, NodeId node,
                             std::uint32_t range_begin, std::uint32_t range_end) {
    const std::uint32_t only_predecessor = first_reverse_arc[node + 1] - first_reverse_arc[node] == 1 ? 1u : 0u;
    const std::uint32_t range_length = range_end - range_begin;
    const std::uint32_t successor_count = first_arc[node + 1] - first_arc[node];
    if (range_length >= RoutingGraph::kSuccessorList || successor_count + 1 < range_length) {
        return RoutingGraph::kSuccessorList << 1 | only_predecessor;
    }
    // Successors are a subsequence of the range (the expansion walks the exits in order).
    std::uint32_t skipped = RoutingGraph::kNoSkippedSuccessor;
    if (successor_count < range_length) {
        skipped = 0;
        while (skipped < successor_count && arc_head[first_arc[node] + skipped] == range_begin + skipped) ++skipped;
    }
    const std::uint32_t first = std::min(range_begin, RoutingGraph::kFirstSuccessorElsewhere);
    return first << 9 | skipped << 5 | range_length << 1 | only_predecessor;
}

} // namespace

struct RoutingGraph::DerivedArrays {
    graph::RoadGraph road_graph;   // shares the road graph's storage: edges_ points into it
    std::vector<std::uint32_t> first_arc;
    std::vector<NodeId> arc_head;
    std::vector<std::uint32_t> first_reverse_arc;
    std::vector<NodeId> reverse_arc_tail;
    std::vector<SearchNode> search_nodes[2];
};

bool should_honour_restrictions(const graph::RoadGraph& road_graph, RestrictionPolicy policy) {
    switch (policy) {
    case RestrictionPolicy::honour: return true;
    case RestrictionPolicy::ignore: return false;
    case RestrictionPolicy::automatic: break;
    }
    const std::string profile = road_graph.metadata_value("profile");
    return profile.empty() || profile == "car";
}

RoutingGraph::RoutingGraph(const graph::RoadGraph& road_graph, RestrictionPolicy policy)
    : honours_restrictions_(should_honour_restrictions(road_graph, policy)) {
    auto arrays = std::make_shared<DerivedArrays>();
    arrays->road_graph = road_graph;
    const std::uint32_t node_count = road_graph.edge_count();
    const auto edges = road_graph.edges();
    const auto first_out = road_graph.first_out();
    const std::vector<std::uint8_t> dead_end = dead_ends(road_graph);
    const TurnRules turn_rules(road_graph, honours_restrictions_);

    std::vector<std::uint32_t>& first_arc = arrays->first_arc;
    std::vector<NodeId>& arc_head = arrays->arc_head;
    first_arc.assign(node_count + 1, 0);
    arc_head.reserve(static_cast<std::size_t>(node_count) * 3);
    for (NodeId node = 0; node < node_count; ++node) {
        const graph::Edge& arriving = edges[node];
        const graph::VertexId via = arriving.head;
        for (std::uint32_t next = first_out[via]; next < first_out[via + 1]; ++next) {
            const graph::Edge& leaving = edges[next];
            const bool u_turn = leaving.segment == arriving.segment && next != node;
            if (u_turn && !dead_end[via]) continue;
            if (!turn_rules.allowed(via, arriving.segment, leaving.segment)) continue;
            arc_head.push_back(next);
        }
        first_arc[node + 1] = static_cast<std::uint32_t>(arc_head.size());
    }

    // Reverse adjacency by counting sort, so predecessors come out ordered by tail.
    std::vector<std::uint32_t>& first_reverse_arc = arrays->first_reverse_arc;
    first_reverse_arc.assign(node_count + 1, 0);
    for (NodeId head : arc_head) ++first_reverse_arc[head + 1];
    for (std::uint32_t node = 0; node < node_count; ++node) first_reverse_arc[node + 1] += first_reverse_arc[node];
    arrays->reverse_arc_tail.resize(arc_head.size());
    std::vector<std::uint32_t> fill(first_reverse_arc.begin(), first_reverse_arc.end() - 1);
    for (NodeId tail = 0; tail < node_count; ++tail) {
        for (std::uint32_t arc = first_arc[tail]; arc < first_arc[tail + 1]; ++arc) {
            arrays->reverse_arc_tail[fill[arc_head[arc]]++] = tail;
        }
    }

    for (Metric metric : {Metric::time, Metric::distance}) {
        std::vector<PackedWeight> weights(node_count);
        for (NodeId node = 0; node < node_count; ++node) {
            weights[node] = pack_weight(metric, edges[node].time_ds, edges[node].length_dm);
        }
        search_block_shift_[static_cast<int>(metric)] = block_shift_for(weights);
        smallest_node_weight_[static_cast<int>(metric)] = weights.empty() ? 0 : *std::min_element(weights.begin(), weights.end());
        std::vector<SearchNode>& search_nodes = arrays->search_nodes[static_cast<int>(metric)];
        search_nodes.resize(node_count);
        for (NodeId node = 0; node < node_count; ++node) {
            const graph::VertexId head = edges[node].head;
            search_nodes[node] = {weights[node],
                                  successor_code(first_arc, arc_head, first_reverse_arc, node, first_out[head],
                                                 first_out[head + 1]),
                                  first_out[head]};
        }
    }

    std::uint64_t hash = 14695981039346656037ull;
    hash = fnv1a(hash, node_count);
    hash = fnv1a(hash, arc_head.size());
    for (NodeId node = 0; node < node_count; ++node) {
        hash = fnv1a(hash, (std::uint64_t{edges[node].time_ds} << 32) | edges[node].length_dm);
        hash = fnv1a(hash, first_arc[node + 1]);
    }
    for (NodeId head : arc_head) hash = fnv1a(hash, head);
    fingerprint_ = hash;

    edges_ = arrays->road_graph.edges();
    first_arc_ = arrays->first_arc;
    arc_head_ = arrays->arc_head;
    first_reverse_arc_ = arrays->first_reverse_arc;
    reverse_arc_tail_ = arrays->reverse_arc_tail;
    for (int metric = 0; metric < 2; ++metric) search_nodes_[metric] = arrays->search_nodes[metric];
    storage_ = std::move(arrays);
}

} // namespace ringroad::router
