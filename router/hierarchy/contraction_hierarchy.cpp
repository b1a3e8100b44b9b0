// Building a contraction hierarchy (Geisberger, Sanders, Schultes, Delling 2008).
#include "router/hierarchy/contraction_hierarchy.hpp"

#include "router/hierarchy/contraction_rounds.hpp"
#include "router/hierarchy/rank_layout.hpp"

#include <algorithm>
#include <cstring>
#include <stdexcept>
#include <string_view>

namespace ringroad::router::hierarchy {

namespace {

// Section header for one metric's hierarchy (layout in router/hierarchy/HIERARCHY.md).
struct HierarchyHeader {
    std::uint32_t layout_version;
    std::uint32_t metric;
    std::uint32_t node_count;
    std::uint32_t climbing_arc_count;
    std::uint32_t descending_arc_count;
    std::uint32_t reserved;
    std::uint64_t routing_graph_fingerprint;
};
static_assert(sizeof(HierarchyHeader) == 32);
// 2: nodes numbered by rank, climbing and descending arcs apart (1: mixed arcs per routing node).
constexpr std::uint32_t kHierarchyLayoutVersion = 2;

std::string section_tag(Metric metric, std::string_view part) {
    return std::string(metric == Metric::time ? "ch.t." : "ch.d.").append(part);
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

// The views of a mapped arc direction, checked: offsets ascend and stay in range, every arc
// leads to a higher rank, every middle rank is lower than both ends.
bool view_arcs(const graph::RoadGraph& road_graph, Metric metric, const char* direction, std::uint32_t node_count,
               std::uint32_t arc_count, RankedArcViews& out) {
    const std::string prefix = std::string(direction) + ".";
    if (!view_as(road_graph.section(section_tag(metric, prefix + "first")), out.first) ||
        !view_as(road_graph.section(section_tag(metric, prefix + "arcs")), out.arcs) ||
        !view_as(road_graph.section(section_tag(metric, prefix + "mid")), out.middle)) {
        return false;
    }
    if (out.first.size() != std::size_t{node_count} + 1 || out.arcs.size() != arc_count ||
        out.middle.size() != arc_count || out.first.front() != 0 || out.first.back() != arc_count) {
        return false;
    }
    for (std::uint32_t rank = 0; rank < node_count; ++rank) {
        // Each rank's end checked before its arcs are read: offsets that climb past the arc count
        // and come back down must not read out of range.
        if (out.first[rank] > out.first[rank + 1] || out.first[rank + 1] > arc_count) return false;
        for (std::uint32_t i = out.first[rank]; i < out.first[rank + 1]; ++i) {
            if (out.arcs[i].other <= rank || out.arcs[i].other >= node_count) return false;
            if (out.middle[i] != kNoNode && out.middle[i] >= rank) return false;
        }
    }
    return true;
}

RankedArcViews views_of(const RankedArcArrays& arrays) { return {arrays.first, arrays.arcs, arrays.middle}; }

} // namespace

struct OwnedHierarchyStorage {
    RankLayout built;
    graph::RoadGraph mapped_graph;   // keeps mapped sections alive when viewing a file
};

ContractionHierarchy ContractionHierarchy::build(const RoutingGraph& routing_graph, Metric metric, Progress* progress,
                                                 unsigned threads) {
    auto storage = std::make_shared<OwnedHierarchyStorage>();
    storage->built = arrange_by_rank(contract_in_rounds(routing_graph, metric, threads, progress));
    ContractionHierarchy hierarchy;
    hierarchy.metric_ = metric;
    hierarchy.fingerprint_ = routing_graph.fingerprint();
    hierarchy.rank_ = storage->built.rank;
    hierarchy.node_at_ = storage->built.node_at;
    hierarchy.climbing_ = views_of(storage->built.climbing);
    hierarchy.descending_ = views_of(storage->built.descending);
    hierarchy.storage_ = storage;
    return hierarchy;
}

std::optional<ContractionHierarchy> ContractionHierarchy::from_sections(const graph::RoadGraph& road_graph,
                                                                        const RoutingGraph& routing_graph,
                                                                        Metric metric) {
    std::span<const HierarchyHeader> header;
    std::span<const std::uint32_t> rank;
    std::span<const NodeId> node_at;
    if (!view_as(road_graph.section(section_tag(metric, "header")), header) || header.size() != 1) return std::nullopt;
    const HierarchyHeader& head = header[0];
    const std::uint32_t n = routing_graph.node_count();
    if (head.layout_version != kHierarchyLayoutVersion || head.metric != static_cast<std::uint32_t>(metric) ||
        head.node_count != n || head.routing_graph_fingerprint != routing_graph.fingerprint()) {
        return std::nullopt;
    }
    if (!view_as(road_graph.section(section_tag(metric, "rank")), rank) || rank.size() != n) return std::nullopt;
    if (!view_as(road_graph.section(section_tag(metric, "node")), node_at) || node_at.size() != n) return std::nullopt;
    for (std::uint32_t r = 0; r < n; ++r) {
        if (node_at[r] >= n || rank[node_at[r]] != r) return std::nullopt;   // not inverse permutations
    }
    ContractionHierarchy hierarchy;
    if (!view_arcs(road_graph, metric, "up", n, head.climbing_arc_count, hierarchy.climbing_) ||
        !view_arcs(road_graph, metric, "down", n, head.descending_arc_count, hierarchy.descending_)) {
        return std::nullopt;
    }
    auto storage = std::make_shared<OwnedHierarchyStorage>();
    storage->mapped_graph = road_graph;
    hierarchy.metric_ = metric;
    hierarchy.fingerprint_ = head.routing_graph_fingerprint;
    hierarchy.rank_ = rank;
    hierarchy.node_at_ = node_at;
    hierarchy.storage_ = storage;
    return hierarchy;
}

std::vector<graph::ExtraSection> ContractionHierarchy::to_sections() const {
    const HierarchyHeader header{kHierarchyLayoutVersion,
                                 static_cast<std::uint32_t>(metric_),
                                 node_count(),
                                 static_cast<std::uint32_t>(climbing_.arcs.size()),
                                 static_cast<std::uint32_t>(descending_.arcs.size()),
                                 0,
                                 fingerprint_};
    std::vector<graph::ExtraSection> sections;
    sections.push_back(make_section(section_tag(metric_, "header"), std::span<const HierarchyHeader>(&header, 1)));
    sections.push_back(make_section(section_tag(metric_, "rank"), rank_));
    sections.push_back(make_section(section_tag(metric_, "node"), node_at_));
    for (const auto& [name, views] : {std::pair{"up.", &climbing_}, std::pair{"down.", &descending_}}) {
        const std::string prefix = name;
        sections.push_back(make_section(section_tag(metric_, prefix + "first"), views->first));
        sections.push_back(make_section(section_tag(metric_, prefix + "arcs"), views->arcs));
        sections.push_back(make_section(section_tag(metric_, prefix + "mid"), views->middle));
    }
    return sections;
}

std::uint32_t ContractionHierarchy::shortcut_count() const noexcept {
    std::uint32_t count = 0;
    for (const RankedArcViews* views : {&climbing_, &descending_}) {
        for (const std::uint32_t middle : views->middle) count += middle != kNoNode;
    }
    return count;
}

std::size_t ContractionHierarchy::byte_size() const noexcept {
    std::size_t bytes = rank_.size_bytes() + node_at_.size_bytes() + sizeof(HierarchyHeader);
    for (const RankedArcViews* views : {&climbing_, &descending_}) {
        bytes += views->first.size_bytes() + views->arcs.size_bytes() + views->middle.size_bytes();
    }
    return bytes;
}

namespace {

// The index of the arc `lower -> higher` (climbing) or `higher -> lower` (descending) of the given
// weight among `lower`'s arcs, or none.
std::optional<std::uint32_t> find_arc(const RankedArcViews& views, std::uint32_t lower, std::uint32_t higher,
                                      PackedWeight weight) {
    for (std::uint32_t i = views.first[lower]; i < views.first[lower + 1]; ++i) {
        if (views.arcs[i].other == higher && views.arcs[i].weight == weight) return i;
    }
    return std::nullopt;
}

} // namespace

void ContractionHierarchy::unpack_arc(std::uint32_t from, std::uint32_t to, PackedWeight weight,
                                      std::vector<NodeId>& out) const {
    // The arc is stored at its lower end: climbing when it leads upwards, else descending.
    const bool upwards = from < to;
    const RankedArcViews& views = upwards ? climbing_ : descending_;
    const std::optional<std::uint32_t> arc = find_arc(views, upwards ? from : to, upwards ? to : from, weight);
    if (!arc) throw std::logic_error("contraction hierarchy: cannot unpack an arc (corrupt hierarchy)");
    const std::uint32_t middle = views.middle[*arc];
    if (middle == kNoNode) {
        out.push_back(node_at_[to]);
        return;
    }
    // Both halves are stored at the middle rank, lower than both ends: from -> middle descends
    // into it, middle -> to climbs out of it. Several pairs may share the ends; take one whose
    // weights add up.
    for (std::uint32_t i = descending_.first[middle]; i < descending_.first[middle + 1]; ++i) {
        const RankedArc& first_half = descending_.arcs[i];
        if (first_half.other != from || first_half.weight > weight) continue;
        if (find_arc(climbing_, middle, to, weight - first_half.weight)) {
            unpack_arc(from, middle, first_half.weight, out);
            unpack_arc(middle, to, weight - first_half.weight, out);
            return;
        }
    }
    throw std::logic_error("contraction hierarchy: cannot unpack a shortcut (corrupt hierarchy)");
}

std::vector<graph::ExtraSection> build_hierarchy_sections(const graph::RoadGraph& road_graph, RestrictionPolicy policy,
                                                          Progress* progress) {
    // The stored routing graph when the caller attached it already: not derived a second time.
    const RoutingGraph routing_graph = RoutingGraph::stored_or_derived(road_graph, policy);
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

} // namespace ringroad::router::hierarchy
