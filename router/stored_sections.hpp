#pragma once
// What `ringroad build` stores for queries besides the hierarchy: the routing graph (`rg.`) and
// the snapping index (`snap.`), so that opening a region derives nothing (router/STORED.md).

#include "graph/road_graph.hpp"
#include "router/routing_graph.hpp"

#include <vector>

namespace ringroad::router {

// The `rg.` sections (for the restriction setting `policy` means for this graph) and the `snap.`
// sections; attach them with graph::attach_sections before writing the file.
std::vector<graph::ExtraSection> build_query_sections(const graph::RoadGraph& road_graph,
                                                      RestrictionPolicy policy = RestrictionPolicy::automatic);

} // namespace ringroad::router
