// `ringroad route REGION.rrg --from LAT,LON --to LAT,LON [--format json|geojson|gpx]
//  [--metric time|distance] [--engine auto|hierarchy|dijkstra] [--snap-radius M] [-o FILE]`
//
// One route: total seconds and metres, the roads taken (consecutive pieces of the same name
// merged; unnamed roads have a null name), and the geometry as a GeoJSON LineString (RFC 7946,
// lon/lat) or a GPX 1.1 track. Every format carries the caution.

#include "common/csv_reader.hpp"
#include "common/input_error.hpp"
#include "common/safety_notice.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/output.hpp"
#include "daemon/cli/snap_radius_option.hpp"
#include "daemon/cli/unusable_hierarchy_note.hpp"
#include "graph/graph_file.hpp"
#include "router/road_router.hpp"
#include "router/stops.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdio>
#include <memory>
#include <optional>
#include <string>

namespace ringroad::cli {

namespace {

struct RouteArguments {
    std::string region;
    std::string from;
    std::string to;
    std::string format = "json";
    std::string metric = "time";
    std::string engine = "auto";
    double snap_radius = router::kDefaultSnapRadiusMeters;
    std::string output;
};

struct LatLon {
    double lat = 0;
    double lon = 0;
};

LatLon parse_lat_lon(const std::string& text, const std::string& option) {
    const auto comma = text.find(',');
    LatLon result;
    if (comma == std::string::npos || !parse_double_cell(text.substr(0, comma), result.lat) ||
        !parse_double_cell(text.substr(comma + 1), result.lon)) {
        throw InputError("--" + option + ": '" + text + "' is not LAT,LON (decimal degrees)", option);
    }
    router::check_coordinate_range(result.lat, result.lon, "--" + option);
    return result;
}

// Decimal-exact JSON numbers: dividing (not multiplying) by a power of ten gives the double
// nearest the decimal, which prints without trailing noise.
double degrees(std::int32_t e7) { return e7 / 1e7; }
double one_decimal(double value) { return std::round(value * 10.0) / 10.0; }

struct RoadStretch {
    std::optional<std::string> name;
    std::uint64_t time_ds = 0;
    std::uint64_t length_dm = 0;
};

std::vector<RoadStretch> roads_taken(const graph::RoadGraph& graph, const router::RoutePath& path) {
    std::vector<RoadStretch> roads;
    for (const router::PathPiece& piece : path.pieces) {
        const graph::Segment& segment = graph.segments()[piece.segment];
        std::optional<std::string> name;
        if (segment.name != graph::kNoName) name = std::string(graph.name(segment.name));
        if (roads.empty() || roads.back().name != name) roads.push_back({name, 0, 0});
        roads.back().time_ds += piece.time_ds;
        roads.back().length_dm += piece.length_dm;
    }
    return roads;
}

nlohmann::ordered_json roads_json(const std::vector<RoadStretch>& roads) {
    nlohmann::ordered_json list = nlohmann::ordered_json::array();
    for (const RoadStretch& road : roads) {
        list.push_back({{"name", road.name ? nlohmann::ordered_json(*road.name) : nlohmann::ordered_json(nullptr)},
                        {"seconds", road.time_ds / 10.0},
                        {"meters", road.length_dm / 10.0}});
    }
    return list;
}

nlohmann::ordered_json line_string(const router::RoutePath& path) {
    nlohmann::ordered_json coordinates = nlohmann::ordered_json::array();
    for (const graph::Coordinate& point : path.geometry) {
        coordinates.push_back({degrees(point.lon_e7), degrees(point.lat_e7)});
    }
    // RFC 7946 wants two or more positions; a route from a point to itself repeats it.
    if (coordinates.size() == 1) coordinates.push_back(coordinates.front());
    return {{"type", "LineString"}, {"coordinates", coordinates}};
}

nlohmann::ordered_json stop_json(const router::SnappedStop& stop) {
    return {{"lat", degrees(stop.requested.lat_e7)},    {"lon", degrees(stop.requested.lon_e7)},
            {"road_lat", degrees(stop.on_road.lat_e7)}, {"road_lon", degrees(stop.on_road.lon_e7)},
            {"snap_meters", one_decimal(stop.snap_distance_meters)}};
}

std::string gpx_track(const router::RoutePath& path) {
    std::string out = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                      "<gpx version=\"1.1\" creator=\"ringroad\" xmlns=\"http://www.topografix.com/GPX/1/1\">\n"
                      " <metadata><desc>" + xml_escape(kSafetyNotice) + "</desc></metadata>\n"
                      " <trk>\n  <name>route</name>\n";
    char line[160];
    std::snprintf(line, sizeof line, "  <desc>%.1f s, %.1f m</desc>\n  <trkseg>\n", path.seconds(), path.meters());
    out += line;
    for (const graph::Coordinate& point : path.geometry) {
        std::snprintf(line, sizeof line, "   <trkpt lat=\"%.7f\" lon=\"%.7f\"/>\n", point.lat(), point.lon());
        out += line;
    }
    out += "  </trkseg>\n </trk>\n</gpx>\n";
    return out;
}

void run_route(const RouteArguments& arguments) {
    const LatLon from = parse_lat_lon(arguments.from, "from");
    const LatLon to = parse_lat_lon(arguments.to, "to");
    const router::Metric metric = *router::metric_from_name(arguments.metric);
    const router::Engine engine = *router::engine_from_name(arguments.engine);
    router::RouterOptions options;
    options.snap_radius_meters = arguments.snap_radius;
    const router::RoadRouter road_router(graph::load_road_graph(arguments.region), options);
    note_unusable_hierarchy(road_router, arguments.region, metric, engine);
    const router::SnappedStop start = road_router.snap("from", from.lat, from.lon);
    const router::SnappedStop end = road_router.snap("to", to.lat, to.lon);
    const std::optional<router::RoutePath> path = road_router.route(start, end, metric, engine);
    if (!path) throw InputError("no route from --from to --to: the roads there are not connected in that direction");

    std::string content;
    const std::vector<RoadStretch> roads = roads_taken(road_router.road_graph(), *path);
    if (arguments.format == "gpx") {
        content = gpx_track(*path);
    } else if (arguments.format == "geojson") {
        const nlohmann::ordered_json properties{{"seconds", path->seconds()}, {"meters", path->meters()},
                                                {"metric", arguments.metric}, {"roads", roads_json(roads)},
                                                {"caution", kSafetyNotice}};
        const nlohmann::ordered_json feature{
            {"type", "Feature"}, {"geometry", line_string(*path)}, {"properties", properties}};
        content = nlohmann::ordered_json{{"type", "FeatureCollection"}, {"features", {feature}}}.dump(kJsonIndent) + "\n";
    } else {
        // Insertion order: the answer first, then where it starts and ends, then the detail.
        const nlohmann::ordered_json report{{"seconds", path->seconds()},     {"meters", path->meters()},
                                            {"metric", arguments.metric},     {"from", stop_json(start)},
                                            {"to", stop_json(end)},           {"roads", roads_json(roads)},
                                            {"geometry", line_string(*path)}, {"caution", kSafetyNotice}};
        content = report.dump(kJsonIndent) + "\n";
    }
    emit_output(arguments.output, content);
}

} // namespace

void add_route_command(CLI::App& app) {
    auto arguments = std::make_shared<RouteArguments>();
    auto* command = app.add_subcommand("route", "The fastest (or shortest) route between two points");
    command->add_option("region", arguments->region, "Region graph (.rrg)")->required();
    command->add_option("--from", arguments->from, "Start as LAT,LON")->required();
    command->add_option("--to", arguments->to, "End as LAT,LON")->required();
    command->add_option("--format", arguments->format, "json, geojson or gpx")
        ->check(CLI::IsMember({"json", "geojson", "gpx"}));
    command->add_option("--metric", arguments->metric, "time (fastest) or distance (shortest)")
        ->check(CLI::IsMember({"time", "distance"}));
    command->add_option("--engine", arguments->engine, "auto, hierarchy or dijkstra")
        ->check(CLI::IsMember({"auto", "hierarchy", "dijkstra"}));
    add_snap_radius_option(*command, arguments->snap_radius);
    command->add_option("-o,--output", arguments->output, "Output file (default: standard output)");
    command->callback([arguments] { run_route(*arguments); });
}

} // namespace ringroad::cli
