#include "router/route_path.hpp"

#include "graph/haversine.hpp"

#include <algorithm>
#include <cmath>

namespace ringroad::router {

namespace {

graph::Coordinate interpolate(graph::Coordinate a, graph::Coordinate b, double t) {
    return {static_cast<std::int32_t>(std::lround(a.lat_e7 + t * (static_cast<double>(b.lat_e7) - a.lat_e7))),
            static_cast<std::int32_t>(std::lround(a.lon_e7 + t * (static_cast<double>(b.lon_e7) - a.lon_e7)))};
}

// The part of a polyline between two fractions of its haversine length (low <= high).
std::vector<graph::Coordinate> polyline_between(const std::vector<graph::Coordinate>& points, double low,
                                                double high) {
    std::vector<double> cumulative(points.size(), 0.0);
    for (std::size_t i = 1; i < points.size(); ++i) {
        cumulative[i] = cumulative[i - 1] + graph::haversine_meters(points[i - 1], points[i]);
    }
    const double total = cumulative.back();
    if (total <= 0.0) return {points.front(), points.back()};
    const double low_meters = low * total;
    const double high_meters = high * total;
    const auto point_at = [&](double meters) {
        std::size_t piece = 1;
        while (piece + 1 < points.size() && cumulative[piece] < meters) ++piece;
        const double piece_length = cumulative[piece] - cumulative[piece - 1];
        const double t = piece_length > 0.0 ? (meters - cumulative[piece - 1]) / piece_length : 0.0;
        return interpolate(points[piece - 1], points[piece], std::clamp(t, 0.0, 1.0));
    };
    std::vector<graph::Coordinate> result{point_at(low_meters)};
    for (std::size_t i = 1; i + 1 < points.size(); ++i) {
        if (cumulative[i] > low_meters && cumulative[i] < high_meters) result.push_back(points[i]);
    }
    result.push_back(point_at(high_meters));
    return result;
}

} // namespace

std::vector<graph::Coordinate> path_geometry(const graph::RoadGraph& road_graph,
                                             const std::vector<PathPiece>& pieces) {
    std::vector<graph::Coordinate> geometry;
    for (const PathPiece& piece : pieces) {
        const std::vector<graph::Coordinate> points = road_graph.segment_geometry(piece.segment);
        const double low = std::min(piece.from_fraction, piece.to_fraction);
        const double high = std::max(piece.from_fraction, piece.to_fraction);
        std::vector<graph::Coordinate> part = polyline_between(points, low, high);
        if (!piece.forward) std::reverse(part.begin(), part.end());
        for (const graph::Coordinate& point : part) {
            if (geometry.empty() || !(geometry.back() == point)) geometry.push_back(point);
        }
    }
    return geometry;
}

} // namespace ringroad::router
