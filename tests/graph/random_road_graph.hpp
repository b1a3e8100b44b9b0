#pragma once
// Test helper: a small random road graph built by graph::build_road_graph, with names, shape
// points, one-way and two-way roads and one turn restriction, for the .rrg file tests.

#include "graph/road_graph.hpp"

#include <random>
#include <string>

namespace ringroad::test {

// `vertices` positions on a 17-column grid and `roads` random roads between them; every fourth
// road is one-way, every third is named, each has one shape point.
inline graph::RoadGraph random_road_graph(std::uint32_t vertices, std::uint32_t roads, unsigned seed) {
    using namespace graph;
    std::mt19937 random(seed);
    RoadGraphData data;
    for (std::uint32_t v = 0; v < vertices; ++v) {
        data.coordinates.push_back(Coordinate::from_degrees(43.5 + 0.001 * (v % 17), 7.4 + 0.001 * (v / 17)));
        data.vertex_osm_ids.push_back(1000 + v);
    }
    std::uniform_int_distribution<std::uint32_t> pick(0, vertices - 1);
    for (std::uint32_t r = 0; r < roads; ++r) {
        const VertexId a = pick(random), b = pick(random);
        Segment segment{a, b, static_cast<std::uint32_t>(data.shape_points.size()), 0, 0, kNoName, kNoEdge, kNoEdge, r};
        data.shape_points.push_back(Coordinate::from_degrees(43.6, 7.45));
        segment.shape_end = static_cast<std::uint32_t>(data.shape_points.size());
        segment.length_dm = 10 + random() % 1000;
        if (r % 3 == 0) segment.name = data.add_name("Road " + std::to_string(r));
        const auto s = static_cast<SegmentId>(data.segments.size());
        data.segments.push_back(segment);
        const auto time = static_cast<std::uint32_t>(1 + random() % 500);
        data.edges.push_back({a, Edge{b, s, time, segment.length_dm, 0, 11, 0}});
        if (r % 4 != 0) data.edges.push_back({b, Edge{a, s, time, segment.length_dm, 0, 11, 1}});
    }
    data.turn_restrictions.push_back({0, data.segments[0].last_vertex, 1, 0, {}, 77});
    data.metadata.emplace_back("source", "random");
    return build_road_graph(std::move(data));
}

} // namespace ringroad::test
