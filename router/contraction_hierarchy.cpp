// Building a contraction hierarchy (Geisberger, Sanders, Schultes, Delling 2008).
#include "router/contraction_hierarchy.hpp"

#include "router/contraction_rounds.hpp"

#include <algorithm>
#include <cstring>
#include <stdexcept>

namespace ringroad::router {

namespace {

// Section header for one metric's hierarchy (layout in router/HIERARCHY.md).
struct HierarchyHeader {
    std::uint32_t layout_version;
    std::uint32_t metric;
    std::uint32_t node_count;
    std::uint32_t arc_count;
    std::uint64_t routing_graph_fingerprint;
};
static_assert(sizeof(HierarchyHeader) == 24);
constexpr std::uint32_t kHierarchyLayoutVersion = 1;

std::string section_tag(Metric metric, const char* part) {
    return std::string(metric == Metric::time ? "ch.t." : "ch.d.") + part;
}

template <typename T>
graph::ExtraSection make_section(std::string tag, std::span<const T> values) {
    static_assert(std::is_trivially_copyable_v<T>);
    graph::ExtraSection section;
    section.tag = std::move(tag);
    section.bytes.resize(values.size_bytes());
    if (!values.empty()) std::memcpy(section.bytes.data(), values.data(), values.size_bytes());
    return section;
}

template <typename T>
bool view_as(std::span<const std::byte> bytes, std::span<const T>& out) {
    if (bytes.size() % sizeof(T) != 0) return false;
    if (reinterpret_cast<std::uintptr_t>(bytes.data()) % alignof(T) != 0) return false;
    out = {reinterpret_cast<const T*>(bytes.data()), bytes.size() / sizeof(T)};
    return true;
}

} // namespace

struct OwnedHierarchyStorage {
    ContractedGraph built;
    graph::RoadGraph mapped_graph;   // keeps mapped sections alive when viewing a file
};

ContractionHierarchy ContractionHierarchy::build(const RoutingGraph& routing_graph, Metric metric, Progress* progress,
                                                 unsigned threads) {
    auto storage = std::make_shared<OwnedHierarchyStorage>();
    storage->built = contract_in_rounds(routing_graph, metric, threads, progress);
    ContractionHierarchy hierarchy;
    hierarchy.metric_ = metric;
    hierarchy.fingerprint_ = routing_graph.fingerprint();
    hierarchy.rank_ = storage->built.rank;
    hierarchy.first_arc_ = storage->built.first_arc;
    hierarchy.arcs_ = storage->built.arcs;
    hierarchy.storage_ = storage;
    return hierarchy;
}

std::optional<ContractionHierarchy> ContractionHierarchy::from_sections(const graph::RoadGraph& road_graph,
                                                                        const RoutingGraph& routing_graph,
                                                                        Metric metric) {
    std::span<const HierarchyHeader> header;
    std::span<const std::uint32_t> rank;
    std::span<const std::uint32_t> first_arc;
    std::span<const HierarchyArc> arcs;
    if (!view_as(road_graph.section(section_tag(metric, "header")), header) || header.size() != 1) return std::nullopt;
    if (!view_as(road_graph.section(section_tag(metric, "rank")), rank)) return std::nullopt;
    if (!view_as(road_graph.section(section_tag(metric, "first")), first_arc)) return std::nullopt;
    if (!view_as(road_graph.section(section_tag(metric, "arcs")), arcs)) return std::nullopt;
    const HierarchyHeader& head = header[0];
    const std::uint32_t n = routing_graph.node_count();
    if (head.layout_version != kHierarchyLayoutVersion || head.metric != static_cast<std::uint32_t>(metric) ||
        head.node_count != n || head.routing_graph_fingerprint != routing_graph.fingerprint() ||
        rank.size() != n || first_arc.size() != std::size_t{n} + 1 || arcs.size() != head.arc_count ||
        first_arc.back() != head.arc_count) {
        return std::nullopt;
    }
    for (std::uint32_t node = 0; node < n; ++node) {
        if (first_arc[node] > first_arc[node + 1]) return std::nullopt;
    }
    for (const HierarchyArc& arc : arcs) {
        if (arc.higher_node >= n || (arc.middle_node != kNoNode && arc.middle_node >= n)) return std::nullopt;
    }
    auto storage = std::make_shared<OwnedHierarchyStorage>();
    storage->mapped_graph = road_graph;
    ContractionHierarchy hierarchy;
    hierarchy.metric_ = metric;
    hierarchy.fingerprint_ = head.routing_graph_fingerprint;
    hierarchy.rank_ = rank;
    hierarchy.first_arc_ = first_arc;
    hierarchy.arcs_ = arcs;
    hierarchy.storage_ = storage;
    return hierarchy;
}

std::vector<graph::ExtraSection> ContractionHierarchy::to_sections() const {
    const HierarchyHeader header{kHierarchyLayoutVersion, static_cast<std::uint32_t>(metric_), node_count(),
                                 arc_count(), fingerprint_};
    std::vector<graph::ExtraSection> sections;
    sections.push_back(make_section(section_tag(metric_, "header"), std::span<const HierarchyHeader>(&header, 1)));
    sections.push_back(make_section(section_tag(metric_, "rank"), rank_));
    sections.push_back(make_section(section_tag(metric_, "first"), first_arc_));
    sections.push_back(make_section(section_tag(metric_, "arcs"), arcs_));
    return sections;
}

std::uint32_t ContractionHierarchy::shortcut_count() const noexcept {
    std::uint32_t count = 0;
    for (const HierarchyArc& arc : arcs_) count += arc.middle_node != kNoNode;
    return count;
}

std::size_t ContractionHierarchy::byte_size() const noexcept {
    return rank_.size_bytes() + first_arc_.size_bytes() + arcs_.size_bytes() + sizeof(HierarchyHeader);
}

void ContractionHierarchy::unpack_arc(NodeId from, NodeId to, PackedWeight weight, std::vector<NodeId>& out) const {
    // The arc is stored at its lower end; find it by direction and weight.
    const bool upwards = rank_[from] < rank_[to];
    const NodeId lower = upwards ? from : to;
    const NodeId higher = upwards ? to : from;
    const std::uint32_t direction = upwards ? kArcForward : kArcBackward;
    for (const HierarchyArc& arc : upward_arcs(lower)) {
        if (arc.higher_node != higher || !(arc.directions & direction) || arc.weight != weight) continue;
        if (arc.middle_node == kNoNode) {
            out.push_back(to);
            return;
        }
        // from -> middle is stored at middle (lower than both) as an arc towards `from`.
        const NodeId middle = arc.middle_node;
        for (const HierarchyArc& first_half : upward_arcs(middle)) {
            if (first_half.higher_node != from || !(first_half.directions & kArcBackward)) continue;
            if (first_half.weight > weight) continue;
            const PackedWeight second_weight = weight - first_half.weight;
            for (const HierarchyArc& second_half : upward_arcs(middle)) {
                if (second_half.higher_node == to && (second_half.directions & kArcForward) &&
                    second_half.weight == second_weight) {
                    unpack_arc(from, middle, first_half.weight, out);
                    unpack_arc(middle, to, second_weight, out);
                    return;
                }
            }
        }
    }
    throw std::logic_error("contraction hierarchy: cannot unpack an arc (corrupt hierarchy)");
}

std::vector<graph::ExtraSection> build_hierarchy_sections(const graph::RoadGraph& road_graph, RestrictionPolicy policy,
                                                          Progress* progress) {
    const RoutingGraph routing_graph(road_graph, policy);
    std::vector<graph::ExtraSection> sections;
    for (Metric metric : {Metric::time, Metric::distance}) {
        std::vector<graph::ExtraSection> part = ContractionHierarchy::build(routing_graph, metric, progress).to_sections();
        for (auto& section : part) sections.push_back(std::move(section));
    }
    return sections;
}

bool has_hierarchy_sections(const graph::RoadGraph& road_graph, Metric metric) {
    return !road_graph.section(section_tag(metric, "header")).empty();
}

} // namespace ringroad::router
