#pragma once
// ContractionHierarchy: the routing graph with its nodes ranked and shortcuts added, so that a
// shortest path always exists that first climbs in rank and then descends (Geisberger et al.
// 2008, "Contraction Hierarchies"). Queries search upwards only, from both ends, and visit a few
// hundred nodes instead of the whole graph, while returning exactly the Dijkstra optimum.
//
//  * Build: nodes are contracted in rounds of independent sets chosen by a priority (edge
//    difference + contracted neighbours + search-space depth), on all cores, with the same
//    result whatever the thread count (router/contraction_rounds.hpp); a shortcut u -> w through
//    v is added only when a bounded witness search finds no path u -> w avoiding v at most as
//    cheap. Shortcuts remember their middle node for unpacking.
//  * Storage: upward arcs in an adjacency array per node (each arc usable forwards, backwards or
//    both), ranks and a header; written as graph::ExtraSection arrays (layout in
//    router/HIERARCHY.md) and mapped back without parsing.
//  * One hierarchy per metric: the weights are the packed (primary, secondary) pairs.

#include "graph/road_graph.hpp"
#include "router/metric.hpp"
#include "router/routing_graph.hpp"

#include <cstdint>
#include <memory>
#include <optional>
#include <span>
#include <vector>

namespace ringroad { class Progress; }

namespace ringroad::router {

// One upward arc stored at its lower node. Layout is part of the file format (HIERARCHY.md).
struct HierarchyArc {
    NodeId higher_node;
    NodeId middle_node;          // kNoNode for an original turn arc, else the shortcut's middle
    PackedWeight weight;
    std::uint32_t directions;    // kArcForward: lower -> higher exists; kArcBackward: higher -> lower
    std::uint32_t padding;
};
static_assert(sizeof(HierarchyArc) == 24);
inline constexpr std::uint32_t kArcForward = 1;
inline constexpr std::uint32_t kArcBackward = 2;

class ContractionHierarchy {
public:
    ContractionHierarchy() = default;

    // Contracts the whole graph on `threads` threads (0 = all cores); the result is the same
    // whatever the thread count. `progress` may be null.
    static ContractionHierarchy build(const RoutingGraph& routing_graph, Metric metric,
                                      Progress* progress = nullptr, unsigned threads = 0);
    // The hierarchy stored in the graph's sections for this metric, or nullopt when there is
    // none or it was built for another routing graph (fingerprint mismatch).
    static std::optional<ContractionHierarchy> from_sections(const graph::RoadGraph& road_graph,
                                                             const RoutingGraph& routing_graph,
                                                             Metric metric);
    // The sections ("ch.t.head", "ch.t.rank", ... for time; "ch.d.*" for distance).
    std::vector<graph::ExtraSection> to_sections() const;

    Metric metric() const noexcept { return metric_; }
    std::uint32_t node_count() const noexcept { return static_cast<std::uint32_t>(rank_.size()); }
    std::uint32_t arc_count() const noexcept { return static_cast<std::uint32_t>(arcs_.size()); }
    std::uint32_t shortcut_count() const noexcept;
    std::size_t byte_size() const noexcept;

    std::uint32_t rank(NodeId node) const { return rank_[node]; }
    std::span<const HierarchyArc> upward_arcs(NodeId node) const {
        return arcs_.subspan(first_arc_[node], first_arc_[node + 1] - first_arc_[node]);
    }

    // The original routing nodes an arc stands for, appended in driving order after `from`
    // (the lower->higher or higher->lower traversal of the arc, `from` excluded).
    void unpack_arc(NodeId from, NodeId to, PackedWeight weight, std::vector<NodeId>& out) const;

private:
    Metric metric_ = Metric::time;
    std::uint64_t fingerprint_ = 0;
    std::shared_ptr<const void> storage_;   // owns the arrays when built in memory
    std::span<const std::uint32_t> rank_;
    std::span<const std::uint32_t> first_arc_;
    std::span<const HierarchyArc> arcs_;
};

// Builds the hierarchies (time and distance) for `ringroad build`; the caller attaches them with
// graph::attach_sections before writing the file. `progress` may be null.
std::vector<graph::ExtraSection> build_hierarchy_sections(const graph::RoadGraph& road_graph,
                                                          RestrictionPolicy policy = RestrictionPolicy::automatic,
                                                          Progress* progress = nullptr);

// Whether the graph carries a stored hierarchy for `metric`.
bool has_hierarchy_sections(const graph::RoadGraph& road_graph, Metric metric);

} // namespace ringroad::router
