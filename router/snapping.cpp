// The only file that includes Boost.Geometry's R-tree (heavy to compile).
#include "router/snapping.hpp"

#include "common/input_error.hpp"
#include "graph/haversine.hpp"
#include "router/stops.hpp"

#include <boost/geometry.hpp>
#include <boost/geometry/geometries/point.hpp>
#include <boost/geometry/geometries/segment.hpp>
#include <boost/geometry/index/rtree.hpp>

#include <cmath>
#include <cstdio>
#include <limits>
#include <numbers>
#include <sstream>

namespace ringroad::router {

namespace bg = boost::geometry;
namespace bgi = boost::geometry::index;

namespace {

using PlanePoint = bg::model::point<double, 2, bg::cs::cartesian>;
using PlaneSegment = bg::model::segment<PlanePoint>;

constexpr double kMetersPerDegree = graph::kEarthMeanRadiusMeters * std::numbers::pi / 180.0;
constexpr std::size_t kCandidates = 8;   // R-tree neighbours re-ranked by haversine
constexpr double kBoundsMarginMeters = 2000.0;

// One straight piece of a segment's geometry.
struct Piece {
    graph::SegmentId segment;
    std::uint32_t first_point;        // index into the segment's geometry
    double meters_before;             // haversine length of the segment before this piece
    double segment_meters;            // haversine length of the whole segment
};

struct Bounds {
    bool known = false;
    double min_lon = 0, min_lat = 0, max_lon = 0, max_lat = 0;
};

Bounds parse_bounds(const std::string& text) {
    Bounds bounds;
    if (text.empty()) return bounds;
    std::istringstream in(text);
    char comma1 = 0, comma2 = 0, comma3 = 0;
    in >> bounds.min_lon >> comma1 >> bounds.min_lat >> comma2 >> bounds.max_lon >> comma3 >> bounds.max_lat;
    bounds.known = !in.fail() && comma1 == ',' && comma2 == ',' && comma3 == ',';
    return bounds;
}

std::string format_meters(double meters) {
    char text[32];
    std::snprintf(text, sizeof text, "%.0f", meters);
    return text;
}

} // namespace

struct RoadSnapper::Index {
    double reference_cos_lat = 1.0;   // the plane's x scale: cos(latitude of the region's middle)
    Bounds bounds;
    std::vector<Piece> pieces;
    bgi::rtree<std::pair<PlaneSegment, std::uint32_t>, bgi::rstar<16>> tree;

    PlanePoint to_plane(double lat, double lon) const {
        return {lon * reference_cos_lat * kMetersPerDegree, lat * kMetersPerDegree};
    }
};

RoadSnapper::RoadSnapper(const graph::RoadGraph& road_graph)
    : road_graph_(&road_graph), index_(std::make_unique<Index>()) {
    Index& index = *index_;
    index.bounds = parse_bounds(road_graph.metadata_value("bbox"));
    double lat_sum = 0.0;
    for (const graph::Coordinate& coordinate : road_graph.coordinates()) lat_sum += coordinate.lat();
    const double middle_lat = road_graph.vertex_count() > 0 ? lat_sum / road_graph.vertex_count() : 0.0;
    index.reference_cos_lat = std::cos(middle_lat * std::numbers::pi / 180.0);

    std::vector<std::pair<PlaneSegment, std::uint32_t>> values;
    const auto segments = road_graph.segments();
    for (graph::SegmentId s = 0; s < road_graph.segment_count(); ++s) {
        const graph::Segment& segment = segments[s];
        if (segment.forward_edge == graph::kNoEdge && segment.backward_edge == graph::kNoEdge) continue;
        if (!road_graph.in_main_component(segment.first_vertex) || !road_graph.in_main_component(segment.last_vertex)) {
            continue;
        }
        const std::vector<graph::Coordinate> points = road_graph.segment_geometry(s);
        double total = 0.0;
        for (std::size_t i = 1; i < points.size(); ++i) total += graph::haversine_meters(points[i - 1], points[i]);
        double before = 0.0;
        for (std::size_t i = 1; i < points.size(); ++i) {
            const auto piece_index = static_cast<std::uint32_t>(index.pieces.size());
            index.pieces.push_back({s, static_cast<std::uint32_t>(i - 1), before, total});
            values.emplace_back(PlaneSegment{index.to_plane(points[i - 1].lat(), points[i - 1].lon()),
                                             index.to_plane(points[i].lat(), points[i].lon())},
                                piece_index);
            before += graph::haversine_meters(points[i - 1], points[i]);
        }
    }
    index.tree = decltype(index.tree)(values.begin(), values.end());   // packing: faster queries
}

RoadSnapper::~RoadSnapper() = default;
RoadSnapper::RoadSnapper(RoadSnapper&&) noexcept = default;
RoadSnapper& RoadSnapper::operator=(RoadSnapper&&) noexcept = default;

bool RoadSnapper::nearest(double lat, double lon, SnappedStop& result) const {
    const Index& index = *index_;
    if (index.tree.empty()) return false;
    const PlanePoint query = index.to_plane(lat, lon);
    const graph::Coordinate requested = graph::Coordinate::from_degrees(lat, lon);
    double best_meters = std::numeric_limits<double>::infinity();
    for (auto it = index.tree.qbegin(bgi::nearest(query, kCandidates)); it != index.tree.qend(); ++it) {
        const Piece& piece = index.pieces[it->second];
        const std::vector<graph::Coordinate> points = road_graph_->segment_geometry(piece.segment);
        const graph::Coordinate a = points[piece.first_point];
        const graph::Coordinate b = points[piece.first_point + 1];
        // Foot of the perpendicular in the plane, as a parameter along the piece.
        const PlanePoint pa = it->first.first;
        const PlanePoint pb = it->first.second;
        const double dx = bg::get<0>(pb) - bg::get<0>(pa);
        const double dy = bg::get<1>(pb) - bg::get<1>(pa);
        const double squared = dx * dx + dy * dy;
        double t = squared > 0.0 ? ((bg::get<0>(query) - bg::get<0>(pa)) * dx + (bg::get<1>(query) - bg::get<1>(pa)) * dy) / squared
                                 : 0.0;
        t = std::clamp(t, 0.0, 1.0);
        graph::Coordinate foot{
            static_cast<std::int32_t>(std::lround(a.lat_e7 + t * (static_cast<double>(b.lat_e7) - a.lat_e7))),
            static_cast<std::int32_t>(std::lround(a.lon_e7 + t * (static_cast<double>(b.lon_e7) - a.lon_e7)))};
        // On an end point to the 1e-7 degree: say so exactly, so a stop on a junction is one.
        if (foot == a) t = 0.0;
        if (foot == b) t = 1.0;
        if (t == 0.0) foot = a;
        if (t == 1.0) foot = b;
        const double meters = graph::haversine_meters(requested, foot);
        if (meters >= best_meters) continue;
        best_meters = meters;
        const double along = piece.meters_before + t * graph::haversine_meters(a, b);
        double fraction = piece.segment_meters > 0.0 ? along / piece.segment_meters : 0.0;
        // Exactly at a vertex: say so exactly, so the stop is treated as a junction stop.
        if (t == 0.0 && piece.first_point == 0) fraction = 0.0;
        if (t == 1.0 && piece.first_point + 2 == points.size()) fraction = 1.0;
        result.requested = requested;
        result.on_road = foot;
        result.segment = piece.segment;
        result.fraction = std::clamp(fraction, 0.0, 1.0);
        result.snap_distance_meters = meters;
    }
    return true;
}

SnappedStop RoadSnapper::snap(std::string_view stop_id, double lat, double lon, double radius_meters) const {
    const std::string name = "stop '" + std::string(stop_id) + "'";
    check_coordinate_range(lat, lon, name);
    const Bounds& bounds = index_->bounds;
    if (bounds.known) {
        // Widened so that a stop just outside the region still gets the more useful "n m from the
        // nearest road"; far outside (swapped coordinates, another region) it gets this.
        const double margin_lat = std::max(2.0 * radius_meters, kBoundsMarginMeters) / kMetersPerDegree;
        const double margin_lon = margin_lat / std::max(index_->reference_cos_lat, 0.01);
        if (lat < bounds.min_lat - margin_lat || lat > bounds.max_lat + margin_lat ||
            lon < bounds.min_lon - margin_lon || lon > bounds.max_lon + margin_lon) {
            std::ostringstream message;
            message << name << ": " << lat << "," << lon << " is outside the region's bounds (lon "
                    << bounds.min_lon << " to " << bounds.max_lon << ", lat " << bounds.min_lat << " to "
                    << bounds.max_lat << ")";
            throw InputError(message.str());
        }
    }
    SnappedStop result;
    if (!nearest(lat, lon, result)) throw InputError(name + ": the region has no roads to snap to");
    if (result.snap_distance_meters > radius_meters) {
        throw InputError(name + " is " + format_meters(result.snap_distance_meters) +
                         " m from the nearest road (snap radius " + format_meters(radius_meters) + " m)");
    }
    result.id = std::string(stop_id);
    return result;
}

} // namespace ringroad::router
