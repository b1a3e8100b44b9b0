#pragma once
// Helpers for the extractor tests: build a fixture's graph in memory and look at its edges by
// OSM ids, so that a test reads like the fixture it checks.

#include "extract/road_extractor.hpp"
#include "graph/road_graph.hpp"
#include "tests/support/run_command.hpp"

#include <osmium/geom/coordinates.hpp>
#include <osmium/geom/haversine.hpp>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <string>
#include <utility>
#include <vector>

namespace ringroad::test {

inline graph::RoadGraph build_fixture(const std::string& relative_path, const char* profile_name) {
    const auto profile = extract::profile_from_name(profile_name);
    return extract::extract_and_build_road_graph({fixture_path(relative_path), *profile}, nullptr);
}

struct DirectedEdge {
    graph::VertexId tail;
    graph::Edge edge;
};

inline std::vector<DirectedEdge> all_edges(const graph::RoadGraph& graph) {
    std::vector<DirectedEdge> edges;
    for (graph::VertexId tail = 0; tail < graph.vertex_count(); ++tail) {
        for (const auto& edge : graph.out_edges(tail)) edges.push_back({tail, edge});
    }
    return edges;
}

// Edges that came from OSM way `way_id`.
inline std::vector<DirectedEdge> edges_of_way(const graph::RoadGraph& graph, std::int64_t way_id) {
    std::vector<DirectedEdge> edges;
    for (const auto& directed : all_edges(graph)) {
        if (graph.segments()[directed.edge.segment].way_id == way_id) edges.push_back(directed);
    }
    return edges;
}

// (tail node id, head node id) of every edge of a way, sorted: the directions it may be travelled.
inline std::vector<std::pair<std::int64_t, std::int64_t>> directions_of_way(const graph::RoadGraph& graph,
                                                                            std::int64_t way_id) {
    std::vector<std::pair<std::int64_t, std::int64_t>> directions;
    for (const auto& directed : edges_of_way(graph, way_id)) {
        directions.emplace_back(graph.vertex_osm_ids()[directed.tail], graph.vertex_osm_ids()[directed.edge.head]);
    }
    std::sort(directions.begin(), directions.end());
    return directions;
}

inline std::vector<std::pair<std::int64_t, std::int64_t>> one_way(std::int64_t from, std::int64_t to) {
    return {{from, to}};
}

inline std::vector<std::pair<std::int64_t, std::int64_t>> both_ways(std::int64_t a, std::int64_t b) {
    std::vector<std::pair<std::int64_t, std::int64_t>> directions{{a, b}, {b, a}};
    std::sort(directions.begin(), directions.end());
    return directions;
}

inline std::vector<std::pair<std::int64_t, std::int64_t>> no_way() { return {}; }

// The stated rounding of edge times, written out independently of the extractor: length in
// decimetres over speed in km/h gives tenths of a second (x 3.6), rounded half away from zero.
inline std::uint32_t expected_time_ds(std::uint32_t length_dm, double speed_kmh) {
    return static_cast<std::uint32_t>(std::lround(length_dm * 3.6 / speed_kmh));
}

// libosmium's haversine distance (osmium::geom::haversine::distance) rescaled from its Earth
// radius (6 372 797.560856 m) to the WGS84 mean radius the project uses (6 371 008.8 m): the
// formula is the same, only the radius differs (by 0.028 %).
inline double libosmium_distance_on_mean_radius(double lat1, double lon1, double lat2, double lon2) {
    const double metres = osmium::geom::haversine::distance(osmium::geom::Coordinates{lon1, lat1},
                                                            osmium::geom::Coordinates{lon2, lat2});
    return metres * (6371008.8 / osmium::geom::haversine::EARTH_RADIUS_IN_METERS);
}

inline std::string metadata(const graph::RoadGraph& graph, const char* key) { return graph.metadata_value(key); }

} // namespace ringroad::test
