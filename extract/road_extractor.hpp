#pragma once
// The road-graph extractor: reads an OSM extract (PBF, or XML as .osm, .osm.bz2, .osm.gz) and
// produces the compact road graph of one profile.
//
// It reads the file twice with libosmium's multithreaded reader: first the ways and relations
// (which ways are roads, which nodes they use, which turn restrictions exist), then the nodes,
// keeping the locations and barrier tags of road nodes only, so memory grows with the road
// network rather than with the whole extract. (A nodes-first PBF is split so that each pass
// decompresses only the blocks it needs: see road_scan.hpp.) Vertices are junctions (nodes shared by roads or
// used twice by one road), road ends and barrier nodes; the nodes between them become the shape
// points of a segment.
//
// Bad input (missing file, not an OSM file, a truncated or corrupt file, an unreadable id or
// coordinate, a road node outside [-90, 90] x [-180, 180], no roads) throws ringroad::InputError
// with one line naming the file.

#include "extract/profile.hpp"
#include "graph/road_graph.hpp"

#include <string>

namespace ringroad { class Progress; }

namespace ringroad::extract {

struct ExtractOptions {
    std::string input_path;
    Profile profile;
};

// `progress` may be null. The metadata carries source, source_timestamp, profile, built_at,
// road_ways, ways_missing_nodes, restrictions_read, restrictions_unmatched, barrier counts and
// names_repaired (road names that were not UTF-8, stored with U+FFFD in place of each bad sequence).
graph::RoadGraphData extract_road_graph(const ExtractOptions& options, Progress* progress);

// extract_road_graph followed by graph::build_road_graph.
graph::RoadGraph extract_and_build_road_graph(const ExtractOptions& options, Progress* progress);

} // namespace ringroad::extract
