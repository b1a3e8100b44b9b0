#pragma once
// CollectedRoads: what the two reading passes learn from an OSM file, handed to the graph
// assembly (graph_assembly.hpp). Internal to extract/: no libosmium types, so the assembly and
// its tests compile without the reader headers.

#include "extract/barrier_rules.hpp"
#include "extract/way_rules.hpp"
#include "graph/coordinate.hpp"
#include "graph/road_graph.hpp"

#include <cstdint>
#include <string>
#include <vector>

namespace ringroad::extract {

struct CollectedWay {
    std::int64_t way_id = 0;
    std::uint32_t first_node = 0;   // its node ids are way_node_ids[first_node, first_node + node_count)
    std::uint32_t node_count = 0;
    std::uint32_t name = graph::kNoName;   // offset into CollectedRoads::names
    WayRule rule;
};

// A type=restriction relation that applies to the profile, with its members resolved to ids.
struct CollectedRestriction {
    std::int64_t relation_id = 0;
    graph::RestrictionKind kind = graph::RestrictionKind::no_turn;
    bool readable = true;             // false: unknown value, via way, or members missing
    std::vector<std::int64_t> from_ways;
    std::int64_t via_node = 0;
    std::vector<std::int64_t> to_ways;
};

struct RoadNode {
    graph::Coordinate location;
    bool found = false;               // the extract contained the node with a valid location
    BarrierRule barrier;
};

struct CollectedRoads {
    std::vector<CollectedWay> ways;
    std::vector<std::int64_t> way_node_ids;   // the road ways' node lists, concatenated
    std::string names;                        // NUL-terminated names (graph::RoadGraphData layout)
    std::vector<CollectedRestriction> restrictions;

    // Filled between the passes: the nodes roads use, sorted by id, and (by the second pass)
    // what the extract says about each.
    std::vector<std::int64_t> road_node_ids;
    std::vector<RoadNode> road_nodes;

    std::string replication_timestamp;        // from the file header, may be empty
    std::uint64_t names_repaired = 0;         // ways whose name was not UTF-8 (U+FFFD put in)
};

} // namespace ringroad::extract
