#include "router/stop_endpoints.hpp"

#include <algorithm>
#include <cmath>

namespace ringroad::router {

namespace {

// round(position * cost), kept within [0, cost].
std::uint32_t part_before(double position, std::uint32_t cost) {
    const double scaled = std::lround(std::clamp(position, 0.0, 1.0) * static_cast<double>(cost));
    return static_cast<std::uint32_t>(std::clamp(scaled, 0.0, static_cast<double>(cost)));
}

struct DirectionOfTravel {
    graph::EdgeId edge;
    double position;        // where the stop sits along this direction (0 = where it starts)
};

std::vector<DirectionOfTravel> allowed_directions(const graph::Segment& segment, double fraction) {
    std::vector<DirectionOfTravel> result;
    if (segment.forward_edge != graph::kNoEdge) result.push_back({segment.forward_edge, fraction});
    if (segment.backward_edge != graph::kNoEdge) result.push_back({segment.backward_edge, 1.0 - fraction});
    return result;
}

void add_junction_endpoints(const graph::RoadGraph& road_graph, const RoutingGraph& routing_graph,
                            graph::VertexId vertex, StopEndpoints& endpoints) {
    endpoints.junction = vertex;
    const auto first_out = road_graph.first_out();
    for (graph::EdgeId edge = first_out[vertex]; edge < first_out[vertex + 1]; ++edge) {
        endpoints.departures.push_back({edge, routing_graph.node_time_ds(edge), routing_graph.node_length_dm(edge)});
    }
    // Edges entering the vertex: scanning every edge would be O(m); the segments' edges are
    // found from the out-edges' reverses instead, plus one-way roads found via predecessors of
    // out-edges (every edge entering a vertex with an exit has an allowed turn or is a dead end).
    std::vector<NodeId> entering;
    for (graph::EdgeId edge = first_out[vertex]; edge < first_out[vertex + 1]; ++edge) {
        for (NodeId predecessor : routing_graph.predecessors(edge)) entering.push_back(predecessor);
        const graph::Segment& segment = road_graph.segments()[road_graph.edges()[edge].segment];
        for (graph::EdgeId candidate : {segment.forward_edge, segment.backward_edge}) {
            if (candidate != graph::kNoEdge && road_graph.edges()[candidate].head == vertex) entering.push_back(candidate);
        }
    }
    std::sort(entering.begin(), entering.end());
    entering.erase(std::unique(entering.begin(), entering.end()), entering.end());
    for (NodeId node : entering) endpoints.arrivals.push_back({node, kNoNode, 0, 0});
}

} // namespace

StopEndpoints stop_endpoints(const graph::RoadGraph& road_graph, const RoutingGraph& routing_graph,
                             const SnappedStop& stop) {
    StopEndpoints endpoints;
    endpoints.segment = stop.segment;
    endpoints.fraction = stop.fraction;
    const graph::Segment& segment = road_graph.segments()[stop.segment];
    if (stop.fraction <= 0.0 || stop.fraction >= 1.0) {
        add_junction_endpoints(road_graph, routing_graph,
                               stop.fraction <= 0.0 ? segment.first_vertex : segment.last_vertex, endpoints);
        return endpoints;
    }
    for (const DirectionOfTravel& direction : allowed_directions(segment, stop.fraction)) {
        const std::uint32_t time = routing_graph.node_time_ds(direction.edge);
        const std::uint32_t length = routing_graph.node_length_dm(direction.edge);
        const std::uint32_t time_before = part_before(direction.position, time);
        const std::uint32_t length_before = part_before(direction.position, length);
        endpoints.departures.push_back({direction.edge, time - time_before, length - length_before});
        for (NodeId predecessor : routing_graph.predecessors(direction.edge)) {
            endpoints.arrivals.push_back({predecessor, direction.edge, time_before, length_before});
        }
    }
    return endpoints;
}

std::optional<NodeCost> direct_trip(const graph::RoadGraph& road_graph, const StopEndpoints& from,
                                    const StopEndpoints& to) {
    if (from.junction != graph::kNoVertex && from.junction == to.junction) return NodeCost{kNoNode, 0, 0};
    if (from.segment != to.segment) return std::nullopt;
    const graph::Segment& segment = road_graph.segments()[from.segment];
    std::optional<NodeCost> best;
    for (const DirectionOfTravel& start : allowed_directions(segment, from.fraction)) {
        const double end_position = start.edge == segment.forward_edge ? to.fraction : 1.0 - to.fraction;
        if (end_position < start.position) continue;
        const graph::Edge& edge = road_graph.edges()[start.edge];
        const std::uint32_t time = part_before(end_position, edge.time_ds) - part_before(start.position, edge.time_ds);
        const std::uint32_t length =
            part_before(end_position, edge.length_dm) - part_before(start.position, edge.length_dm);
        const NodeCost candidate{start.edge, time, length};
        if (!best || std::pair(time, length) < std::pair(best->time_ds, best->length_dm)) best = candidate;
    }
    return best;
}

} // namespace ringroad::router
