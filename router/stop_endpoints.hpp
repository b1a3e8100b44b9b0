#pragma once
// StopEndpoints: how a snapped stop joins the routing graph.
//
// A stop at fraction t of segment s can leave along each direction s allows: leaving forward it
// reaches routing node forward_edge(s) after paying the rest of that edge; leaving backward it
// reaches backward_edge(s) after paying the part from the stop to the first vertex. It can be
// reached along each allowed direction d: from any node with an allowed turn into d's edge,
// paying the part of d's edge up to the stop. A stop is a standstill: a trip may leave it in
// either allowed direction whichever way the vehicle came (a turn-around at a stop costs 0 s; see
// router/hierarchy/HIERARCHY.md "Stops"). Two stops on the same segment are also joined directly when the
// direction from one to the other is allowed.
//
// A stop that snaps exactly onto a vertex (fraction 0 or 1) is a junction stop: it is reached by
// arriving at the junction along any road (arrival entries with stop_edge == kNoNode and cost 0)
// and left along any road leaving it (departures paying the whole edge).
//
// Partial costs are integers: the part before the stop is round(p * cost) with p the stop's
// position along the direction of travel, the part after is cost minus that, so both halves
// always add up to the edge's cost.

#include "router/metric.hpp"
#include "router/routing_graph.hpp"
#include "router/snapping.hpp"

#include <cstdint>
#include <optional>
#include <vector>

namespace ringroad::router {

struct NodeCost {
    NodeId node = kNoNode;
    std::uint32_t time_ds = 0;
    std::uint32_t length_dm = 0;
    PackedWeight weight(Metric metric) const { return pack_weight(metric, time_ds, length_dm); }
};

struct ArrivalEntry {
    NodeId from_node = kNoNode;     // the node reached before turning into the stop's edge
    NodeId stop_edge = kNoNode;     // the stop's edge (routing node) driven partly; kNoNode
                                    // at a junction stop (arriving at the junction suffices)
    std::uint32_t time_ds = 0;      // the part of stop_edge up to the stop
    std::uint32_t length_dm = 0;
    PackedWeight weight(Metric metric) const { return pack_weight(metric, time_ds, length_dm); }
};

struct StopEndpoints {
    graph::SegmentId segment = 0;
    double fraction = 0.0;
    graph::VertexId junction = graph::kNoVertex;   // set for a junction stop
    std::vector<NodeCost> departures;      // one per allowed direction
    std::vector<ArrivalEntry> arrivals;    // one per allowed turn into an allowed direction
};

StopEndpoints stop_endpoints(const graph::RoadGraph& road_graph, const RoutingGraph& routing_graph,
                             const SnappedStop& stop);

// The direct trip along the shared segment, when `from` and `to` sit on the same segment and the
// direction from one to the other is allowed; otherwise nullopt. `.node` is the edge driven.
std::optional<NodeCost> direct_trip(const graph::RoadGraph& road_graph, const StopEndpoints& from,
                                    const StopEndpoints& to);

} // namespace ringroad::router
