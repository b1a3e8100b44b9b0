#pragma once
// plan_road_network: a short network of roads joining a set of sites (cable, pipe or shared
// delivery links laid along roads), by Mehlhorn's variant of the Kou–Markowsky–Berman
// Steiner-tree heuristic. Its length is at most 2(1 - 1/leaves) times the shortest possible
// network along roads, and never more than the minimum spanning tree of the site-to-site road
// distances (the sum of "link" lengths it reports).
//
// Metric: road length, since cable and pipe cost follows length. A network follows roads
// regardless of travel direction (a pipe under a one-way street serves both ways), so every
// segment the profile can use in at least one direction counts both ways and link costs are
// symmetric: no symmetrisation rule is needed here.
//
// Steps: one multi-source Dijkstra grows a region around every site; each road segment between
// two regions proposes a link between their sites; Kruskal keeps a minimum spanning tree of those
// links (Mehlhorn 1988: it is also a minimum spanning tree of the sites' distance closure); each
// link expands into its road path; shared segments merge; a spanning tree of that subgraph is
// taken again and branches ending at no site are pruned. Sites must be graph vertices (snap first).

#include "graph/road_graph.hpp"

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

namespace ringroad::router {

struct NetworkSite {
    std::string id;               // used in error messages
    graph::VertexId vertex;
};

struct NetworkLink {
    std::size_t from_site;        // indices into the sites
    std::size_t to_site;
    std::uint64_t length_dm;      // length of the road path the link expands to
};

struct RoadNetwork {
    std::vector<NetworkLink> links;          // spanning tree of the sites (Kruskal order)
    std::uint64_t link_length_sum_dm = 0;    // sum of the links' lengths
    std::vector<graph::SegmentId> segments;  // unique road segments of the network, ascending
    std::uint64_t road_length_dm = 0;        // sum of the segments' lengths
    // Shared road counted once: link_length_sum_dm - road_length_dm (never negative).
    std::uint64_t saving_dm() const { return link_length_sum_dm - road_length_dm; }
};

// Throws InputError naming a site that no road joins to the first site, or a site vertex out of
// range. Fewer than two sites give an empty network.
RoadNetwork plan_road_network(const graph::RoadGraph& graph, const std::vector<NetworkSite>& sites);

} // namespace ringroad::router
