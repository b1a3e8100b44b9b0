// The only file that includes Boost.Geometry's R-tree (heavy to compile): the fallback index
// for region files without a stored one.
#include "router/snapping.hpp"

#include "common/input_error.hpp"
#include "graph/haversine.hpp"
#include "router/snap_geometry.hpp"
#include "router/snap_index.hpp"
#include "router/stops.hpp"

#include <boost/geometry.hpp>
#include <boost/geometry/geometries/point.hpp>
#include <boost/geometry/geometries/segment.hpp>
#include <boost/geometry/index/rtree.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <optional>
#include <vector>
#include <limits>
#include <numbers>
#include <sstream>

namespace ringroad::router {

namespace bg = boost::geometry;
namespace bgi = boost::geometry::index;

using snapping::Candidate;
using snapping::kMetersPerDegree;
using snapping::PlanePoint;
using snapping::PlaneProjection;

namespace {

using BoostPoint = bg::model::point<double, 2, bg::cs::cartesian>;
using BoostSegment = bg::model::segment<BoostPoint>;
// A piece in the fallback tree: its plane segment and (segment, first_point).
using BoostValue = std::pair<BoostSegment, std::pair<graph::SegmentId, std::uint32_t>>;

constexpr double kBoundsMarginMeters = 2000.0;

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

BoostPoint boost_point(PlanePoint point) { return {point.x, point.y}; }

// Haversine length of a segment's pieces before `first_point`, and of the whole segment, summed
// in geometry order.
std::pair<double, double> piece_meters(const graph::RoadGraph& road_graph, const graph::Segment& segment,
                                       std::uint32_t first_point) {
    double before = 0.0, total = 0.0;
    const std::uint32_t count = snapping::segment_point_count(segment);
    graph::Coordinate previous = snapping::segment_point(road_graph, segment, 0);
    for (std::uint32_t i = 1; i < count; ++i) {
        const graph::Coordinate point = snapping::segment_point(road_graph, segment, i);
        const double meters = graph::haversine_meters(previous, point);
        total += meters;
        if (i <= first_point) before += meters;
        previous = point;
    }
    return {before, total};
}

} // namespace

struct RoadSnapper::Index {
    PlaneProjection plane;
    Bounds bounds;
    std::optional<snapping::PackedPieceIndex> stored;
    bgi::rtree<BoostValue, bgi::rstar<16>> tree;   // the fallback, when nothing is stored

    bool empty() const { return stored ? stored->empty() : tree.empty(); }

    // The kCandidates nearest pieces in Candidate order.
    void candidates(PlanePoint query, std::vector<Candidate>& out) const {
        if (stored) {
            stored->nearest(query, out);
            return;
        }
        // Boost returns neighbours by increasing distance but orders equal ones by its tree's
        // layout: take every piece as near as the kCandidates-th (give or take rounding between
        // its distance and ours), then keep the first kCandidates in Candidate order.
        out.clear();
        const BoostPoint point = boost_point(query);
        double last_kept = 0.0;
        for (auto it = tree.qbegin(bgi::nearest(point, static_cast<unsigned>(tree.size()))); it != tree.qend(); ++it) {
            const double boost_distance = bg::comparable_distance(point, it->first);
            if (out.size() >= snapping::kCandidates && boost_distance > last_kept + last_kept * 1e-6 + 1e-6) break;
            if (out.size() < snapping::kCandidates) last_kept = boost_distance;
            const PlanePoint a{bg::get<0, 0>(it->first), bg::get<0, 1>(it->first)};
            const PlanePoint b{bg::get<1, 0>(it->first), bg::get<1, 1>(it->first)};
            out.push_back({snapping::comparable_distance(query, a, b), it->second.first, it->second.second});
        }
        std::sort(out.begin(), out.end());
        if (out.size() > snapping::kCandidates) out.resize(snapping::kCandidates);
    }
};

RoadSnapper::RoadSnapper(const graph::RoadGraph& road_graph, SnapIndexSource source)
    : road_graph_(&road_graph), index_(std::make_unique<Index>()) {
    Index& index = *index_;
    index.bounds = parse_bounds(road_graph.metadata_value("bbox"));
    if (source == SnapIndexSource::stored_when_present) index.stored = snapping::PackedPieceIndex::from_sections(road_graph);
    if (index.stored) {
        index.plane = PlaneProjection{index.stored->reference_cos_lat()};
        return;
    }
    index.plane = PlaneProjection{snapping::reference_cos_lat(road_graph)};
    std::vector<BoostValue> values;
    const auto segments = road_graph.segments();
    for (graph::SegmentId s = 0; s < road_graph.segment_count(); ++s) {
        const graph::Segment& segment = segments[s];
        if (!snapping::is_snappable(road_graph, segment)) continue;
        for (std::uint32_t point = 0; point + 1 < snapping::segment_point_count(segment); ++point) {
            values.emplace_back(BoostSegment{boost_point(index.plane(snapping::segment_point(road_graph, segment, point))),
                                             boost_point(index.plane(snapping::segment_point(road_graph, segment, point + 1)))},
                                std::pair{s, point});
        }
    }
    index.tree = decltype(index.tree)(values.begin(), values.end());   // packing: faster queries
}

RoadSnapper::~RoadSnapper() = default;
RoadSnapper::RoadSnapper(RoadSnapper&&) noexcept = default;
RoadSnapper& RoadSnapper::operator=(RoadSnapper&&) noexcept = default;

bool RoadSnapper::uses_stored_index() const noexcept { return index_->stored.has_value(); }

bool RoadSnapper::nearest(double lat, double lon, SnappedStop& result) const {
    const Index& index = *index_;
    if (index.empty()) return false;
    const PlanePoint query = index.plane(lat, lon);
    const graph::Coordinate requested = graph::Coordinate::from_degrees(lat, lon);
    std::vector<Candidate> candidates;
    index.candidates(query, candidates);
    double best_meters = std::numeric_limits<double>::infinity();
    for (const Candidate& candidate : candidates) {
        const graph::Segment& segment = road_graph_->segments()[candidate.segment];
        const graph::Coordinate a = snapping::segment_point(*road_graph_, segment, candidate.first_point);
        const graph::Coordinate b = snapping::segment_point(*road_graph_, segment, candidate.first_point + 1);
        // Foot of the perpendicular in the plane, as a parameter along the piece.
        const PlanePoint pa = index.plane(a);
        const PlanePoint pb = index.plane(b);
        const double dx = pb.x - pa.x;
        const double dy = pb.y - pa.y;
        const double squared = dx * dx + dy * dy;
        double t = squared > 0.0 ? ((query.x - pa.x) * dx + (query.y - pa.y) * dy) / squared : 0.0;
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
        const auto [meters_before, segment_meters] = piece_meters(*road_graph_, segment, candidate.first_point);
        const double along = meters_before + t * graph::haversine_meters(a, b);
        double fraction = segment_meters > 0.0 ? along / segment_meters : 0.0;
        // Exactly at a vertex: say so exactly, so the stop is treated as a junction stop.
        if (t == 0.0 && candidate.first_point == 0) fraction = 0.0;
        if (t == 1.0 && candidate.first_point + 2 == snapping::segment_point_count(segment)) fraction = 1.0;
        result.requested = requested;
        result.on_road = foot;
        result.segment = candidate.segment;
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
        const double margin_lon = margin_lat / std::max(index_->plane.reference_cos_lat, 0.01);
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
