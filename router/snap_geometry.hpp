#pragma once
// The geometry both snapping indexes share (router/snapping.hpp): the local plane stops and road
// pieces are compared in, a piece's comparable (squared) distance in it, and the order that
// makes the candidate set deterministic. The stored index and the Boost.Geometry fallback call
// exactly these functions, so they rank pieces identically to the last bit.
//
// A piece is one straight stretch of a segment's geometry, between its points first_point and
// first_point + 1 (point 0 is the segment's first vertex).

#include "graph/haversine.hpp"
#include "graph/road_graph.hpp"

#include <cmath>
#include <cstdint>
#include <numbers>

namespace ringroad::router::snapping {

inline constexpr double kMetersPerDegree = graph::kEarthMeanRadiusMeters * std::numbers::pi / 180.0;
// Nearest pieces in the plane that are re-ranked by haversine distance.
inline constexpr std::size_t kCandidates = 8;

struct PlanePoint {
    double x = 0.0;
    double y = 0.0;
};

// An equirectangular plane around the region's mean latitude, in metres.
struct PlaneProjection {
    double reference_cos_lat = 1.0;
    PlanePoint operator()(double lat, double lon) const {
        return {lon * reference_cos_lat * kMetersPerDegree, lat * kMetersPerDegree};
    }
    PlanePoint operator()(graph::Coordinate point) const { return (*this)(point.lat(), point.lon()); }
};

// cos(mean latitude of the vertices): the plane's x scale.
inline double reference_cos_lat(const graph::RoadGraph& road_graph) {
    double lat_sum = 0.0;
    for (const graph::Coordinate& coordinate : road_graph.coordinates()) lat_sum += coordinate.lat();
    const double middle_lat = road_graph.vertex_count() > 0 ? lat_sum / road_graph.vertex_count() : 0.0;
    return std::cos(middle_lat * std::numbers::pi / 180.0);
}

// Number of points of a segment's geometry (its two vertices and the shape points between).
inline std::uint32_t segment_point_count(const graph::Segment& segment) {
    return segment.shape_end - segment.shape_begin + 2;
}
// Point `index` of a segment's geometry, without building the whole list.
inline graph::Coordinate segment_point(const graph::RoadGraph& road_graph, const graph::Segment& segment,
                                       std::uint32_t index) {
    if (index == 0) return road_graph.coordinates()[segment.first_vertex];
    if (index + 1 == segment_point_count(segment)) return road_graph.coordinates()[segment.last_vertex];
    return road_graph.shape_points()[segment.shape_begin + index - 1];
}

// Whether a segment is indexed: drivable in a direction and inside the main component.
inline bool is_snappable(const graph::RoadGraph& road_graph, const graph::Segment& segment) {
    if (segment.forward_edge == graph::kNoEdge && segment.backward_edge == graph::kNoEdge) return false;
    return road_graph.in_main_component(segment.first_vertex) && road_graph.in_main_component(segment.last_vertex);
}

// Squared plane distance from q to the piece a-b (the projected-point method: the foot of the
// perpendicular, clamped to the ends).
inline double comparable_distance(PlanePoint q, PlanePoint a, PlanePoint b) {
    const double vx = b.x - a.x, vy = b.y - a.y;
    const double wx = q.x - a.x, wy = q.y - a.y;
    const double along = wx * vx + wy * vy;
    if (along <= 0.0) return wx * wx + wy * wy;
    const double squared_length = vx * vx + vy * vy;
    if (squared_length <= along) {
        const double ux = q.x - b.x, uy = q.y - b.y;
        return ux * ux + uy * uy;
    }
    const double t = along / squared_length;
    const double dx = q.x - (a.x + t * vx), dy = q.y - (a.y + t * vy);
    return dx * dx + dy * dy;
}

// A candidate piece. Candidates are ordered by plane distance, then by (segment, first_point),
// the order pieces are enumerated in: ties (a stop nearest to a junction is equally near every
// road there) are settled by that order, not by the layout of an index.
struct Candidate {
    double distance = 0.0;                 // comparable_distance
    graph::SegmentId segment = 0;
    std::uint32_t first_point = 0;

    friend bool operator<(const Candidate& a, const Candidate& b) {
        if (a.distance != b.distance) return a.distance < b.distance;
        if (a.segment != b.segment) return a.segment < b.segment;
        return a.first_point < b.first_point;
    }
};

} // namespace ringroad::router::snapping
