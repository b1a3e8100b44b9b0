#pragma once
// plan_road_network: a short network of roads joining a set of sites (cable, pipe or shared
// delivery links laid along roads), by Mehlhorn's variant of the Kou–Markowsky–Berman
// Steiner-tree heuristic. Its length is at most 2(1 - 1/leaves) times the shortest possible
// network along roads, and never more than the minimum spanning tree of the site-to-site road
// distances (the sum of the "link" lengths it reports).
//
// Metric: road length, since cable and pipe cost follows length. A network follows roads
// regardless of travel direction (a pipe under a one-way street serves both ways), so every
// segment the profile can use in at least one direction counts both ways and link costs are
// symmetric: no symmetrisation rule is needed here.
//
// Sites sit on road segments (where snapping put them); a segment holding sites is split at them,
// so the network starts and ends exactly at the sites' road points and may use part of a segment.
//
// Steps: one multi-source Dijkstra grows a region around every site; each road piece between two
// regions proposes a link between their sites; Kruskal keeps a minimum spanning tree of those
// links (Mehlhorn 1988, cited from memory: it is also a minimum spanning tree of the sites'
// distance closure, which tests/router/road_network_test.cpp checks against Boost); each link
// expands into its road path; shared pieces merge; a spanning tree of that subgraph is taken again
// and branches ending at no site are pruned.

#include "graph/road_graph.hpp"

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

namespace ringroad::router {

struct NetworkSite {
    std::string id;                 // used in error messages
    graph::SegmentId segment = 0;
    double fraction = 0.0;          // 0 = the segment's first vertex, 1 = its last
};

struct NetworkLink {
    std::size_t from_site;          // indices into the sites
    std::size_t to_site;
    std::uint64_t length_dm;        // length of the road path the link expands to
};

// A stretch of one segment, from_fraction < to_fraction (fractions from its first vertex), or the
// whole segment (0, 1). Its length is round(to * L) - round(from * L) for a segment of length L,
// so the pieces of a segment add up to it exactly.
struct NetworkPiece {
    graph::SegmentId segment;
    double from_fraction;
    double to_fraction;
    std::uint32_t length_dm;
};

struct RoadNetwork {
    std::vector<NetworkLink> links;          // spanning tree of the sites (Kruskal order)
    std::uint64_t link_length_sum_dm = 0;    // sum of the links' lengths
    std::vector<NetworkPiece> pieces;        // unique road pieces, by segment then fraction;
                                             // touching stretches of one segment are merged
    std::uint64_t road_length_dm = 0;        // sum of the pieces' lengths
    // Shared road counted once: link_length_sum_dm - road_length_dm (never negative).
    std::uint64_t saving_dm() const { return link_length_sum_dm - road_length_dm; }
    // Distinct segments the network uses (ascending), whole or in part.
    std::vector<graph::SegmentId> segments() const;
};

// Throws InputError naming a site that no road joins to the first site, or a site whose segment
// is out of range or unusable. Fewer than two sites give an empty network.
RoadNetwork plan_road_network(const graph::RoadGraph& graph, const std::vector<NetworkSite>& sites);

} // namespace ringroad::router
