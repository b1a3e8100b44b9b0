#pragma once
// ContractionHierarchy: the routing graph with its nodes ranked and shortcuts added, so that a
// shortest path always exists that first climbs in rank and then descends (Geisberger et al.
// 2008, "Contraction Hierarchies"). Queries search upwards only, from both ends, and visit a few
// hundred nodes instead of the whole graph, while returning exactly the Dijkstra optimum.
//
//  * Build: nodes are contracted in rounds of independent sets chosen by a priority (edge
//    difference + contracted neighbours + search-space depth), on all cores, with the same
//    result whatever the thread count (router/hierarchy/contraction_rounds.hpp); a shortcut u -> w through
//    v is added only when a bounded witness search finds no path u -> w avoiding v at most as
//    cheap. Shortcuts remember their middle node for unpacking.
//  * Storage, laid out for the searches: nodes are numbered by rank, so the few thousand nodes
//    near the top that every search visits sit together in memory; each rank has its climbing
//    arcs (to higher ranks) and its descending arcs (from higher ranks) in two adjacency arrays
//    of 12-byte records, so a search reads only arcs of its own direction. Middle nodes, needed
//    only to unpack a path, are kept apart. Written as graph::ExtraSection arrays (layout in
//    router/hierarchy/HIERARCHY.md) and mapped back without parsing.
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

namespace ringroad::router::hierarchy {

// One arc of the stored hierarchy, kept at its lower end: `other` is the rank of the higher end.
// 12 bytes (weight at offset 4): a search reads these records and little else. Layout is part of
// the file format (HIERARCHY.md).
#pragma pack(push, 4)
struct RankedArc {
    std::uint32_t other;
    PackedWeight weight;
};
#pragma pack(pop)
static_assert(sizeof(RankedArc) == 12);

// The arcs at each rank in one direction, as an adjacency array; middle[i] is arc i's middle
// rank when it is a shortcut, kNoNode for an original turn arc.
struct RankedArcViews {
    std::span<const std::uint32_t> first;   // rank r's arcs are [first[r], first[r + 1])
    std::span<const RankedArc> arcs;
    std::span<const std::uint32_t> middle;
};

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
    // Directed upward arcs (climbing + descending); an arc usable both ways counts twice.
    std::uint32_t arc_count() const noexcept {
        return static_cast<std::uint32_t>(climbing_.arcs.size() + descending_.arcs.size());
    }
    std::uint32_t shortcut_count() const noexcept;
    std::size_t byte_size() const noexcept;

    // Searches number nodes by rank (0 = contracted first); these translate.
    std::uint32_t rank(NodeId node) const { return rank_[node]; }
    NodeId node_at(std::uint32_t rank) const { return node_at_[rank]; }
    // Arcs rank -> higher rank (driving from `rank` upwards), and higher rank -> rank (driving
    // down into `rank`), both stored at `rank` with `other` the higher end.
    std::span<const RankedArc> climbing_arcs(std::uint32_t rank) const { return arcs_at(climbing_, rank); }
    std::span<const RankedArc> descending_arcs(std::uint32_t rank) const { return arcs_at(descending_, rank); }

    // The routing nodes the arc between ranks `from` and `to` (either direction) stands for,
    // appended in driving order after `from` (excluded).
    void unpack_arc(std::uint32_t from, std::uint32_t to, PackedWeight weight, std::vector<NodeId>& out) const;

private:
    Metric metric_ = Metric::time;
    std::uint64_t fingerprint_ = 0;
    std::shared_ptr<const void> storage_;   // owns the arrays (built in memory or mapped)
    std::span<const std::uint32_t> rank_;
    std::span<const NodeId> node_at_;
    RankedArcViews climbing_;
    RankedArcViews descending_;

    static std::span<const RankedArc> arcs_at(const RankedArcViews& views, std::uint32_t rank) {
        return views.arcs.subspan(views.first[rank], views.first[rank + 1] - views.first[rank]);
    }
};

// Builds the hierarchies (time and distance) for `ringroad build`; the caller attaches them with
// graph::attach_sections before writing the file. `progress` may be null.
std::vector<graph::ExtraSection> build_hierarchy_sections(const graph::RoadGraph& road_graph,
                                                          RestrictionPolicy policy = RestrictionPolicy::automatic,
                                                          Progress* progress = nullptr);

// Whether the graph carries a stored hierarchy for `metric`.
bool has_hierarchy_sections(const graph::RoadGraph& road_graph, Metric metric);

} // namespace ringroad::router::hierarchy
