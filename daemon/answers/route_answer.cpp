// The route question: {"from": {"lat", "lon"}, "to": {"lat", "lon"}, "metric", "engine",
// "snap_radius"} -> seconds, meters, where it starts and ends on the road, the roads taken
// (consecutive pieces of one name merged; unnamed roads null) and the geometry (a GeoJSON
// LineString, lon/lat), with the caution.

#include "common/safety_notice.hpp"
#include "daemon/answers/question_answers.hpp"
#include "daemon/answers/request_stops.hpp"
#include "router/stops.hpp"

#include <cmath>
#include <optional>

namespace ringroad::answers {

namespace {

// Decimal-exact JSON numbers: dividing (not multiplying) by a power of ten gives the double
// nearest the decimal, which prints without trailing noise.
double degrees(std::int32_t e7) { return e7 / 1e7; }
double one_decimal(double value) { return std::round(value * 10.0) / 10.0; }

struct Place {
    double lat = 0.0;
    double lon = 0.0;
};

// A point is {"lat": .., "lon": ..} (the same names as a stop; an array would leave the order
// to guess).
Place read_place(RequestObject& body, const std::string& key) {
    RequestObject point(body.required(key), key);
    Place place;
    place.lat = finite_number(point.required("lat"), key + ".lat");
    place.lon = finite_number(point.required("lon"), key + ".lon");
    point.finish();
    try {
        router::check_coordinate_range(place.lat, place.lon, key);
    } catch (const InputError& error) {
        refuse(key + "." + error.field(), error.what());
    }
    return place;
}

Json roads_json(const graph::RoadGraph& graph, const router::RoutePath& path) {
    struct Stretch {
        std::optional<std::string> name;
        std::uint64_t time_ds = 0;
        std::uint64_t length_dm = 0;
    };
    std::vector<Stretch> roads;
    for (const router::PathPiece& piece : path.pieces) {
        const graph::Segment& segment = graph.segments()[piece.segment];
        std::optional<std::string> name;
        if (segment.name != graph::kNoName) name = std::string(graph.name(segment.name));
        if (roads.empty() || roads.back().name != name) roads.push_back({name, 0, 0});
        roads.back().time_ds += piece.time_ds;
        roads.back().length_dm += piece.length_dm;
    }
    Json list = Json::array();
    for (const Stretch& road : roads) {
        list.push_back({{"name", road.name ? Json(*road.name) : Json(nullptr)},
                        {"seconds", road.time_ds / 10.0},
                        {"meters", road.length_dm / 10.0}});
    }
    return list;
}

Json line_string(const router::RoutePath& path) {
    Json coordinates = Json::array();
    for (const graph::Coordinate& point : path.geometry) coordinates.push_back({degrees(point.lon_e7), degrees(point.lat_e7)});
    // RFC 7946 wants two or more positions; a route from a point to itself repeats it.
    if (coordinates.size() == 1) coordinates.push_back(coordinates.front());
    return {{"type", "LineString"}, {"coordinates", coordinates}};
}

Json end_json(const router::SnappedStop& stop) {
    return {{"lat", degrees(stop.requested.lat_e7)},    {"lon", degrees(stop.requested.lon_e7)},
            {"road_lat", degrees(stop.on_road.lat_e7)}, {"road_lon", degrees(stop.on_road.lon_e7)},
            {"snap_meters", one_decimal(stop.snap_distance_meters)}};
}

} // namespace

Json answer_route(const Json& request, const LoadedRegion* region, const AnswerLimits&) {
    RequestObject body(request, "");
    const Place from = read_place(body, "from");
    const Place to = read_place(body, "to");
    const router::Metric metric = read_metric(body);
    const router::Engine engine = read_engine(body);
    const double radius = read_snap_radius(body);
    body.finish();
    const router::RoadRouter& router = region_router(region);

    const auto snap = [&](const char* name, const Place& place) {
        try {
            return router.snapper().snap(name, place.lat, place.lon, radius);
        } catch (const InputError& error) {
            refuse(name, error.what(), 422, "far_from_road");
        }
    };
    const router::SnappedStop start = snap("from", from);
    const router::SnappedStop end = snap("to", to);
    const std::optional<router::RoutePath> path = router.route(start, end, metric, engine);
    if (!path) {
        throw RequestError(422, "unreachable",
                           "no route from 'from' to 'to': the roads there are not connected in that direction", "to");
    }
    // The answer first, then where it starts and ends, then the detail.
    return {{"seconds", path->seconds()},
            {"meters", path->meters()},
            {"metric", std::string(router::metric_name(metric))},
            {"from", end_json(start)},
            {"to", end_json(end)},
            {"roads", roads_json(router.road_graph(), *path)},
            {"geometry", line_string(*path)},
            {"caution", kSafetyNotice}};
}

} // namespace ringroad::answers
