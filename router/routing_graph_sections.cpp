// The routing graph's `rg.` sections: written by `ringroad build`, viewed in place at load time
// after the checks below (layout in router/STORED.md).
#include "router/routing_graph.hpp"
#include "router/stored_section.hpp"

namespace ringroad::router {

namespace {

// 1: first layout (forward and reverse adjacency, per-metric search records).
constexpr std::uint32_t kRoutingLayoutVersion = 1;

struct StoredRoutingHeader {
    std::uint32_t layout_version;
    std::uint32_t node_count;
    std::uint32_t arc_count;
    std::uint32_t honours_restrictions;
    std::uint32_t search_block_shift[2];
    std::uint32_t reserved[2];
    std::uint64_t smallest_node_weight[2];
    std::uint64_t fingerprint;
    std::uint64_t reserved_tail;
};
static_assert(sizeof(StoredRoutingHeader) == 64);

constexpr const char* kHeaderTag = "rg.header";
constexpr const char* kFirstArcTag = "rg.first_arc";
constexpr const char* kArcHeadTag = "rg.arc_head";
constexpr const char* kFirstReverseTag = "rg.first_rev";
constexpr const char* kReverseTailTag = "rg.rev_tail";
const char* search_tag(Metric metric) { return metric == Metric::time ? "rg.search.t" : "rg.search.d"; }

// An adjacency array: offsets start at 0, ascend and end at the arc count; every id < n.
void check_adjacency(std::span<const std::uint32_t> first, std::span<const NodeId> ids, const char* first_tag,
                     const char* ids_tag, std::uint32_t node_count) {
    if (first.front() != 0) refuse_stored_record(first_tag, 0, "the first offset is " + std::to_string(first.front()) + ", not 0");
    for (std::size_t i = 1; i < first.size(); ++i) {
        if (first[i] < first[i - 1]) {
            refuse_stored_record(first_tag, i, "offsets do not ascend (" + std::to_string(first[i]) + " after " +
                                                   std::to_string(first[i - 1]) + ")");
        }
    }
    if (first.back() != ids.size()) {
        refuse_stored_record(first_tag, first.size() - 1, "the last offset is " + std::to_string(first.back()) +
                                                              ", the arc count " + std::to_string(ids.size()));
    }
    for (std::size_t i = 0; i < ids.size(); ++i) {
        if (ids[i] >= node_count) {
            refuse_stored_record(ids_tag, i, "node " + std::to_string(ids[i]) + " is out of range (" +
                                                 std::to_string(node_count) + " nodes)");
        }
    }
}

// Each record's weight is its edge's cost, and its successor range lies inside the graph.
void check_search_nodes(std::span<const RoutingGraph::SearchNode> records, std::span<const graph::Edge> edges,
                        Metric metric) {
    const char* tag = search_tag(metric);
    const auto node_count = static_cast<std::uint64_t>(records.size());
    for (std::size_t node = 0; node < records.size(); ++node) {
        const RoutingGraph::SearchNode& record = records[node];
        if (record.weight != pack_weight(metric, edges[node].time_ds, edges[node].length_dm)) {
            refuse_stored_record(tag, node, "its weight is not the cost of edge " + std::to_string(node));
        }
        const std::uint32_t length = (record.successors >> 1) & 15u;
        if (length == RoutingGraph::kSuccessorList) continue;
        std::uint64_t first = record.successors >> 9;
        if (first == RoutingGraph::kFirstSuccessorElsewhere) first = record.first_successor;
        if (first + length > node_count) {
            refuse_stored_record(tag, node, "successor range " + std::to_string(first) + " + " + std::to_string(length) +
                                                " is out of range (" + std::to_string(node_count) + " nodes)");
        }
    }
}

} // namespace

std::optional<RoutingGraph> RoutingGraph::from_sections(const graph::RoadGraph& road_graph, RestrictionPolicy policy) {
    if (road_graph.section(kHeaderTag).empty()) return std::nullopt;
    const auto header = view_stored_section<StoredRoutingHeader>(road_graph, kHeaderTag, 1);
    const StoredRoutingHeader& head = header[0];
    if (head.layout_version != kRoutingLayoutVersion) return std::nullopt;
    const bool honour = should_honour_restrictions(road_graph, policy);
    if ((head.honours_restrictions != 0) != honour) return std::nullopt;

    const std::uint32_t n = road_graph.edge_count();
    if (head.node_count != n) {
        refuse_stored_record(kHeaderTag, 0, std::to_string(head.node_count) + " nodes, but the road graph has " +
                                                std::to_string(n) + " edges");
    }
    for (int metric = 0; metric < 2; ++metric) {
        if (head.search_block_shift[metric] < 32 || head.search_block_shift[metric] > 63) {
            refuse_stored_record(kHeaderTag, 0, "search block shift " + std::to_string(head.search_block_shift[metric]) +
                                                    " is outside [32, 63]");
        }
    }
    RoutingGraph graph;
    graph.first_arc_ = view_stored_section<std::uint32_t>(road_graph, kFirstArcTag, std::size_t{n} + 1);
    graph.arc_head_ = view_stored_section<NodeId>(road_graph, kArcHeadTag, head.arc_count);
    graph.first_reverse_arc_ = view_stored_section<std::uint32_t>(road_graph, kFirstReverseTag, std::size_t{n} + 1);
    graph.reverse_arc_tail_ = view_stored_section<NodeId>(road_graph, kReverseTailTag, head.arc_count);
    check_adjacency(graph.first_arc_, graph.arc_head_, kFirstArcTag, kArcHeadTag, n);
    check_adjacency(graph.first_reverse_arc_, graph.reverse_arc_tail_, kFirstReverseTag, kReverseTailTag, n);
    for (Metric metric : {Metric::time, Metric::distance}) {
        const int index = static_cast<int>(metric);
        graph.search_nodes_[index] = view_stored_section<SearchNode>(road_graph, search_tag(metric), n);
        check_search_nodes(graph.search_nodes_[index], road_graph.edges(), metric);
        graph.search_block_shift_[index] = head.search_block_shift[index];
        graph.smallest_node_weight_[index] = head.smallest_node_weight[index];
    }
    auto storage = std::make_shared<graph::RoadGraph>(road_graph);
    graph.edges_ = storage->edges();
    graph.storage_ = std::move(storage);
    graph.honours_restrictions_ = honour;
    graph.fingerprint_ = head.fingerprint;
    graph.stored_ = true;
    return graph;
}

RoutingGraph RoutingGraph::stored_or_derived(const graph::RoadGraph& road_graph, RestrictionPolicy policy) {
    std::optional<RoutingGraph> stored = from_sections(road_graph, policy);
    if (stored) return std::move(*stored);
    return RoutingGraph(road_graph, policy);
}

std::vector<graph::ExtraSection> RoutingGraph::to_sections() const {
    StoredRoutingHeader header{};
    header.layout_version = kRoutingLayoutVersion;
    header.node_count = node_count();
    header.arc_count = arc_count();
    header.honours_restrictions = honours_restrictions_ ? 1 : 0;
    for (int metric = 0; metric < 2; ++metric) {
        header.search_block_shift[metric] = search_block_shift_[metric];
        header.smallest_node_weight[metric] = smallest_node_weight_[metric];
    }
    header.fingerprint = fingerprint_;
    std::vector<graph::ExtraSection> sections;
    sections.push_back(make_stored_section(kHeaderTag, std::span<const StoredRoutingHeader>(&header, 1)));
    sections.push_back(make_stored_section(kFirstArcTag, first_arc_));
    sections.push_back(make_stored_section(kArcHeadTag, arc_head_));
    sections.push_back(make_stored_section(kFirstReverseTag, first_reverse_arc_));
    sections.push_back(make_stored_section(kReverseTailTag, reverse_arc_tail_));
    for (Metric metric : {Metric::time, Metric::distance}) {
        sections.push_back(make_stored_section(search_tag(metric), search_nodes_[static_cast<int>(metric)]));
    }
    return sections;
}

} // namespace ringroad::router
