// `ringroad route REGION.rrg --from LAT,LON --to LAT,LON [--format json|geojson|gpx]
//  [--metric time|distance] [--engine auto|hierarchy|dijkstra] [--snap-radius M] [-o FILE]`
//
// One route: total seconds and metres, the roads taken (consecutive pieces of the same name
// merged; unnamed roads have a null name), and the geometry as a GeoJSON LineString (RFC 7946,
// lon/lat) or a GPX 1.1 track. Every format carries the caution. The answer comes from the
// answer layer (daemon/answers/).

#include "common/csv_reader.hpp"
#include "common/input_error.hpp"
#include "daemon/answers/loaded_region.hpp"
#include "daemon/answers/renderings.hpp"
#include "daemon/cli/answer_request.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/output.hpp"
#include "daemon/cli/server_option.hpp"
#include "daemon/service/server_client.hpp"
#include "daemon/cli/snap_radius_option.hpp"
#include "daemon/cli/unusable_hierarchy_note.hpp"
#include "router/road_router.hpp"
#include "router/stops.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <memory>
#include <string>

namespace ringroad::cli {

namespace {

struct RouteArguments {
    std::string region;
    std::string server;
    std::string from;
    std::string to;
    std::string format = "json";
    std::string metric = "time";
    std::string engine = "auto";
    double snap_radius = router::kDefaultSnapRadiusMeters;
    std::string output;
};

// "LAT,LON" -> {"lat": .., "lon": ..}, the request body's form of a point.
nlohmann::ordered_json parse_lat_lon(const std::string& text, const std::string& option) {
    const auto comma = text.find(',');
    double lat = 0.0;
    double lon = 0.0;
    if (comma == std::string::npos || !parse_double_cell(text.substr(0, comma), lat) ||
        !parse_double_cell(text.substr(comma + 1), lon)) {
        throw InputError("--" + option + ": '" + text + "' is not LAT,LON (decimal degrees)", option);
    }
    router::check_coordinate_range(lat, lon, "--" + option);
    return {{"lat", lat}, {"lon", lon}};
}

void run_route(const RouteArguments& arguments) {
    const nlohmann::ordered_json body{{"from", parse_lat_lon(arguments.from, "from")},
                                      {"to", parse_lat_lon(arguments.to, "to")},
                                      {"metric", arguments.metric},
                                      {"engine", arguments.engine},
                                      {"snap_radius", arguments.snap_radius}};
    if (arguments.server.empty() == arguments.region.empty()) {
        throw CLI::ValidationError("route", "give REGION.rrg, or --server URL to ask a running service");
    }
    nlohmann::ordered_json answer;
    if (!arguments.server.empty()) {
        answer = answer_for_command_line(
            [&] { return service::answer_from_server(arguments.server, answers::Question::route, body); }, nullptr);
    } else {
        router::RouterOptions options;
        options.snap_radius_meters = arguments.snap_radius;
        const auto region = answers::load_region(arguments.region, options);
        note_unusable_hierarchy(*region->router, arguments.region, *router::metric_from_name(arguments.metric),
                                *router::engine_from_name(arguments.engine));
        answer = answer_for_command_line(
            [&] { return answers::answer_json(answers::Question::route, body, region.get(), command_line_limits()); },
            nullptr);
    }
    if (arguments.format == "gpx") {
        emit_output(arguments.output, answers::render_route_gpx(answer));
    } else if (arguments.format == "geojson") {
        emit_output(arguments.output, answers::render_route_geojson(answer));
    } else {
        emit_output(arguments.output, answers::render_json(answer));
    }
}

} // namespace

void add_route_command(CLI::App& app) {
    auto arguments = std::make_shared<RouteArguments>();
    auto* command = app.add_subcommand("route", "The fastest (or shortest) route between two points");
    command->add_option("region", arguments->region, "Region graph (.rrg); not with --server");
    add_server_option(*command, arguments->server);
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
