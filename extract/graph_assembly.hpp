#pragma once
// Graph assembly: turns what the reading passes collected (CollectedRoads) into
// graph::RoadGraphData. No libosmium here.
//
//  * A way that refers to a node missing from the extract is skipped whole (counted).
//  * Vertices: nodes used by two or more road pieces (or twice by one way), way ends, and barrier
//    nodes that block or delay the profile. A blocking barrier gets a separate vertex for every
//    segment end that touches it, so no route passes it.
//  * Segment length: the sum of haversine distances (graph::haversine_meters) over its points,
//    rounded to whole decimetres.
//  * Edge time in tenths of a second: round(length_dm * 3.6 / speed_kmh), i.e. the
//    segment's integer length over the speed, rounded half away from zero (std::lround).
//    A ferry with a duration shares it among its segments in proportion to their lengths.
//    A delaying barrier's delay is paid on every edge that ARRIVES at its vertex (edge_flag::
//    barrier_delay marks those edges); leaving it costs nothing extra.
//  * Turn restrictions are matched to the segments of the from/to ways that touch the via vertex.

#include "extract/collected_roads.hpp"

#include <cstdint>

namespace ringroad::extract {

struct AssemblyCounts {
    std::uint64_t road_ways = 0;            // ways that became segments
    std::uint64_t ways_missing_nodes = 0;   // skipped: a node absent from the extract
    std::uint64_t restrictions_read = 0;    // restrictions that apply to the profile
    std::uint64_t restrictions_unmatched = 0;
    std::uint64_t blocking_barriers = 0;
    std::uint64_t delaying_barriers = 0;
};

graph::RoadGraphData assemble_road_graph(const CollectedRoads& roads, AssemblyCounts& counts);

// The edge time rule above, exposed for tests: tenths of a second for `length_dm` at `speed_kmh`.
std::uint32_t travel_time_ds(std::uint32_t length_dm, double speed_kmh);

} // namespace ringroad::extract
