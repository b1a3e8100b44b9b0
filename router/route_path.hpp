#pragma once
// RoutePath: one shortest path between two snapped stops, as the road pieces driven in order and
// as a polyline. A piece is a stretch of one segment in one direction; the first and last pieces
// may cover part of their segment only (the stops sit mid-edge).

#include "graph/coordinate.hpp"
#include "graph/road_graph.hpp"

#include <cstdint>
#include <vector>

namespace ringroad::router {

struct PathPiece {
    graph::SegmentId segment = 0;
    bool forward = true;            // driven from the segment's first vertex towards its last
    double from_fraction = 0.0;     // fractions along the segment from its FIRST vertex: a
    double to_fraction = 1.0;       // forward piece has from < to, a backward one from > to
    std::uint32_t time_ds = 0;      // the part of the edge's cost this piece pays
    std::uint32_t length_dm = 0;
};

struct RoutePath {
    std::uint64_t time_ds = 0;      // totals: the sums over pieces, equal to the matrix entry
    std::uint64_t length_dm = 0;
    std::vector<PathPiece> pieces;
    std::vector<graph::Coordinate> geometry;   // from the start stop's road point to the end's

    double seconds() const noexcept { return static_cast<double>(time_ds) / 10.0; }
    double meters() const noexcept { return static_cast<double>(length_dm) / 10.0; }
};

// The polyline of a list of pieces (consecutive duplicate points removed).
std::vector<graph::Coordinate> path_geometry(const graph::RoadGraph& road_graph,
                                             const std::vector<PathPiece>& pieces);

} // namespace ringroad::router
