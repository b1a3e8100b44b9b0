#pragma once
// The outside reference for shortest paths: the Boost Graph Library's dijkstra_shortest_paths
// run on the same routing graph (same nodes, arcs and packed integer weights).

#include "router/routing_graph.hpp"

#include <boost/graph/adjacency_list.hpp>
#include <boost/graph/dijkstra_shortest_paths.hpp>

#include <vector>

namespace ringroad::test {

using BglGraph = boost::adjacency_list<boost::vecS, boost::vecS, boost::directedS, boost::no_property,
                                       boost::property<boost::edge_weight_t, std::uint64_t>>;

inline BglGraph to_bgl(const router::RoutingGraph& routing_graph, router::Metric metric) {
    BglGraph graph(routing_graph.node_count());
    for (router::NodeId tail = 0; tail < routing_graph.node_count(); ++tail) {
        for (router::NodeId head : routing_graph.successors(tail)) {
            boost::add_edge(tail, head, routing_graph.node_weight(metric, head), graph);
        }
    }
    return graph;
}

// Distances from one node (kUnreachableWeight where BGL leaves infinity).
inline std::vector<std::uint64_t> bgl_distances(const BglGraph& graph, router::NodeId source) {
    std::vector<std::uint64_t> distance(boost::num_vertices(graph));
    boost::dijkstra_shortest_paths(graph, source,
                                   boost::distance_map(boost::make_iterator_property_map(
                                       distance.begin(), boost::get(boost::vertex_index, graph))));
    return distance;
}

} // namespace ringroad::test
