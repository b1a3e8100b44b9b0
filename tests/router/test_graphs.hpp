#pragma once
// Graphs for the router tests: a small builder for hand-made road graphs and a generator of
// random street grids (jittered grid, random one-ways, speeds, missing streets and turn
// restrictions), both going through graph::build_road_graph like a real extract. Invented data
// at an invented spot; used only in tests.

#include "graph/haversine.hpp"
#include "graph/road_graph.hpp"

#include <cmath>
#include <cstdint>
#include <random>
#include <string>
#include <vector>

namespace ringroad::test {

class GraphBuilder {
public:
    graph::VertexId add_vertex(double lat, double lon) {
        data_.coordinates.push_back(graph::Coordinate::from_degrees(lat, lon));
        data_.vertex_osm_ids.push_back(static_cast<std::int64_t>(data_.coordinates.size()));
        return static_cast<graph::VertexId>(data_.coordinates.size() - 1);
    }

    // A road from a to b; forward/backward say which directions are open. Returns the segment.
    graph::SegmentId add_road(graph::VertexId a, graph::VertexId b, double speed_kmh, bool forward = true,
                              bool backward = true, const std::string& name = {},
                              std::vector<graph::Coordinate> shape = {}) {
        graph::Segment segment{};
        segment.first_vertex = a;
        segment.last_vertex = b;
        segment.shape_begin = static_cast<std::uint32_t>(data_.shape_points.size());
        for (const auto& point : shape) data_.shape_points.push_back(point);
        segment.shape_end = static_cast<std::uint32_t>(data_.shape_points.size());
        double meters = 0.0;
        graph::Coordinate previous = data_.coordinates[a];
        shape.push_back(data_.coordinates[b]);
        for (const auto& point : shape) {
            meters += graph::haversine_meters(previous, point);
            previous = point;
        }
        segment.length_dm = static_cast<std::uint32_t>(std::lround(meters * 10.0));
        segment.name = name.empty() ? graph::kNoName : data_.add_name(name);
        segment.forward_edge = graph::kNoEdge;
        segment.backward_edge = graph::kNoEdge;
        segment.way_id = static_cast<std::int64_t>(data_.segments.size() + 1);
        const auto id = static_cast<graph::SegmentId>(data_.segments.size());
        data_.segments.push_back(segment);
        const auto time_ds = static_cast<std::uint32_t>(std::lround(meters / (speed_kmh / 3.6) * 10.0));
        if (forward) data_.edges.push_back({a, graph::Edge{b, id, time_ds, segment.length_dm, 0, 11, 0}});
        if (backward) data_.edges.push_back({b, graph::Edge{a, id, time_ds, segment.length_dm, 0, 11, 1}});
        return id;
    }

    void add_restriction(graph::SegmentId from, graph::VertexId via, graph::SegmentId to, graph::RestrictionKind kind) {
        graph::TurnRestriction restriction{};
        restriction.from_segment = from;
        restriction.via_vertex = via;
        restriction.to_segment = to;
        restriction.kind = static_cast<std::uint8_t>(kind);
        restriction.relation_id = static_cast<std::int64_t>(data_.turn_restrictions.size() + 1);
        data_.turn_restrictions.push_back(restriction);
    }

    graph::RoadGraphData& data() { return data_; }
    graph::RoadGraph build() { return graph::build_road_graph(data_); }

private:
    graph::RoadGraphData data_;
};

struct RandomGridOptions {
    std::uint32_t rows = 20;
    std::uint32_t columns = 20;
    double missing_street_share = 0.1;
    double one_way_share = 0.2;
    std::uint32_t restrictions = 40;
    std::uint64_t seed = 1;
};

// The square grids the benchmarks compare (router_bench, hierarchy_build_bench): one turn
// restriction per 50 junctions, a fixed seed.
inline RandomGridOptions benchmark_grid_options(std::uint32_t rows) {
    RandomGridOptions grid;
    grid.rows = rows;
    grid.columns = rows;
    grid.restrictions = rows * rows / 50;
    grid.seed = 2024;
    return grid;
}

// A jittered street grid about 100 m apart near 17 N, 140 W (open Pacific, no real place).
inline graph::RoadGraph random_grid_graph(const RandomGridOptions& options) {
    std::mt19937_64 random(options.seed);
    std::uniform_real_distribution<double> unit(0.0, 1.0);
    GraphBuilder builder;
    const auto at = [&](std::uint32_t row, std::uint32_t column) { return row * options.columns + column; };
    for (std::uint32_t row = 0; row < options.rows; ++row) {
        for (std::uint32_t column = 0; column < options.columns; ++column) {
            builder.add_vertex(17.0 + row * 0.0009 + (unit(random) - 0.5) * 0.0003,
                               -140.0 + column * 0.00095 + (unit(random) - 0.5) * 0.0003);
        }
    }
    const double speeds[] = {20.0, 30.0, 50.0, 70.0};
    std::vector<std::pair<graph::SegmentId, std::pair<graph::VertexId, graph::VertexId>>> roads;
    const auto maybe_road = [&](graph::VertexId a, graph::VertexId b) {
        if (unit(random) < options.missing_street_share) return;
        const bool one_way = unit(random) < options.one_way_share;
        const bool reversed = unit(random) < 0.5;
        std::vector<graph::Coordinate> shape;
        if (unit(random) < 0.3) {   // a bend in the middle
            const auto& data = builder.data();
            const graph::Coordinate pa = data.coordinates[a], pb = data.coordinates[b];
            // The midpoint in 64 bits: two longitudes near -140 degrees (-1.4e9 in 1e-7 degrees)
            // overflow a 32-bit sum.
            const auto midpoint = [](std::int32_t a, std::int32_t b) {
                return static_cast<std::int32_t>((std::int64_t{a} + std::int64_t{b}) / 2);
            };
            shape.push_back({midpoint(pa.lat_e7, pb.lat_e7) + static_cast<std::int32_t>((unit(random) - 0.5) * 1500),
                             midpoint(pa.lon_e7, pb.lon_e7) + static_cast<std::int32_t>((unit(random) - 0.5) * 1500)});
        }
        const double speed = speeds[static_cast<std::size_t>(unit(random) * 4) % 4];
        const graph::SegmentId id = builder.add_road(a, b, speed, !one_way || !reversed, !one_way || reversed,
                                                     "Street " + std::to_string(roads.size() % 17), shape);
        roads.push_back({id, {a, b}});
    };
    for (std::uint32_t row = 0; row < options.rows; ++row) {
        for (std::uint32_t column = 0; column < options.columns; ++column) {
            if (column + 1 < options.columns) maybe_road(at(row, column), at(row, column + 1));
            if (row + 1 < options.rows) maybe_road(at(row, column), at(row + 1, column));
        }
    }
    // Random restrictions between two roads meeting at a vertex.
    std::vector<std::vector<graph::SegmentId>> roads_at(builder.data().coordinates.size());
    for (const auto& [id, ends] : roads) {
        roads_at[ends.first].push_back(id);
        roads_at[ends.second].push_back(id);
    }
    for (std::uint32_t r = 0; r < options.restrictions; ++r) {
        const auto via = static_cast<graph::VertexId>(unit(random) * roads_at.size()) % roads_at.size();
        if (roads_at[via].size() < 3) continue;
        const auto& around = roads_at[via];
        const graph::SegmentId from = around[static_cast<std::size_t>(unit(random) * around.size()) % around.size()];
        const graph::SegmentId to = around[static_cast<std::size_t>(unit(random) * around.size()) % around.size()];
        if (from == to) continue;
        builder.add_restriction(from, via, to, unit(random) < 0.7 ? graph::RestrictionKind::no_turn
                                                                 : graph::RestrictionKind::only_turn);
    }
    builder.data().metadata.push_back({"profile", "car"});
    return builder.build();
}

// A 3 x 3 grid of two-way streets about 100 m apart near 18.05 N, 141 W (open Pacific), named
// "Row Street N" and "Column Road N", with a dead-end "Spur Lane" east of the middle of the east
// side. With `trap_spur`, turn restrictions forbid every turn into the spur, so a stop on it can
// be left but never reached: the pairs towards it are unreachable.
inline graph::RoadGraph small_test_town(bool trap_spur) {
    GraphBuilder builder;
    graph::VertexId at[3][3];
    for (int row = 0; row < 3; ++row) {
        for (int column = 0; column < 3; ++column) at[row][column] = builder.add_vertex(18.05 + row * 0.0009, -141.0 + column * 0.00095);
    }
    std::vector<graph::SegmentId> at_east_middle;
    for (int row = 0; row < 3; ++row) {
        for (int column = 0; column < 2; ++column) {
            const auto id = builder.add_road(at[row][column], at[row][column + 1], 30, true, true, "Row Street " + std::to_string(row));
            if (row == 1 && column == 1) at_east_middle.push_back(id);
        }
    }
    for (int column = 0; column < 3; ++column) {
        for (int row = 0; row < 2; ++row) {
            const auto id = builder.add_road(at[row][column], at[row + 1][column], 50, true, true, "Column Road " + std::to_string(column));
            if (column == 2) at_east_middle.push_back(id);
        }
    }
    const auto spur_end = builder.add_vertex(18.0509, -140.9971);
    const auto spur = builder.add_road(at[1][2], spur_end, 20, true, true, "Spur Lane");
    if (trap_spur) {
        for (graph::SegmentId from : at_east_middle) builder.add_restriction(from, at[1][2], spur, graph::RestrictionKind::no_turn);
    }
    builder.data().metadata.push_back({"profile", "car"});
    return builder.build();
}

} // namespace ringroad::test
