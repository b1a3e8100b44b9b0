// `ringroad network (REGION.rrg --stops SITES.csv | --matrix MATRIX.csv) [--link-cost cheaper|dearer]
//  [--metric-closure] [--snap-radius M] [--far-stops error|skip] [--format json|geojson] [-o FILE]`
//
// The cheapest network joining every site.
//  * On a bare matrix: the minimum spanning tree of the sites by Kruskal's algorithm. A link can be
//    built in either direction, so an asymmetric matrix is made symmetric by a stated rule:
//    --link-cost cheaper (default) prices a link at min(c(a,b), c(b,a)), dearer at max.
//  * On a road graph: a network of road segments by Mehlhorn's variant of Kou–Markowsky–Berman,
//    measured in metres (cable and pipe cost follows length), with the links it was built from, the
//    saving from shared road, and the unique road pieces (GeoJSON MultiLineString with --format
//    geojson).
// The answer comes from the answer layer (daemon/answers/); output goes to stdout, or atomically
// to -o FILE (nothing half-written on error).

#include "common/input_error.hpp"
#include "daemon/answers/loaded_region.hpp"
#include "daemon/answers/renderings.hpp"
#include "daemon/cli/answer_request.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/far_stops_option.hpp"
#include "daemon/cli/output.hpp"
#include "daemon/cli/server_option.hpp"
#include "daemon/service/server_client.hpp"
#include "daemon/cli/snap_radius_option.hpp"
#include "planners/matrices/matrix_csv.hpp"
#include "router/road_router.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <memory>
#include <string>

namespace ringroad::cli {

namespace {

using json = nlohmann::ordered_json;

struct NetworkOptions {
    std::string region;
    std::string server;
    std::string stops;
    std::string matrix;
    std::string link_cost = "cheaper";
    bool metric_closure = false;
    std::string format = "json";
    std::string output;
    double snap_radius = 0;
    std::string far_stops = "error";
};

void check_options(const NetworkOptions& options) {
    if (options.matrix.empty() && options.stops.empty()) {
        throw CLI::ValidationError("network", "give REGION.rrg --stops SITES.csv, or --matrix MATRIX.csv");
    }
    if (!options.server.empty() && !options.region.empty()) {
        throw CLI::ValidationError("network", "--server answers on the service's region: give no REGION.rrg");
    }
    if (!options.stops.empty() && options.region.empty() && options.server.empty()) {
        throw CLI::ValidationError("network", "--stops needs a region graph: ringroad network REGION.rrg --stops SITES.csv");
    }
    if (!options.matrix.empty() && !options.region.empty()) {
        throw CLI::ValidationError("network", "--matrix takes no region graph (REGION.rrg is for --stops)");
    }
    if (!options.matrix.empty() && options.format == "geojson") {
        throw InputError("--format geojson draws roads: it needs REGION.rrg --stops, not --matrix", "format");
    }
    if (!options.stops.empty() && options.metric_closure) {
        throw InputError("--metric-closure applies to --matrix: road distances are already shortest paths",
                         "metric_closure");
    }
}

void run_network(const NetworkOptions& options) {
    check_options(options);
    json body = json::object();
    router::StopList stops;
    std::shared_ptr<const answers::LoadedRegion> region;
    if (!options.matrix.empty()) {
        body["matrix"] = matrix_body(planners::matrices::read_matrix_csv(options.matrix));
        body["link_cost"] = options.link_cost;
        if (options.metric_closure) body["metric_closure"] = true;
    } else {
        stops = router::read_stops_csv(options.stops);
        body["stops"] = stops_body(stops);
        body["snap_radius"] = options.snap_radius;
        if (options.far_stops != "error") body["far_stops"] = options.far_stops;
        if (options.format == "geojson") body["geometry"] = true;
        if (options.server.empty()) region = answers::load_region(options.region);
    }
    const json answer = answer_for_command_line(
        [&] {
            if (!options.server.empty()) return service::answer_from_server(options.server, answers::Question::network, body);
            return answers::answer_json(answers::Question::network, body, region.get(), command_line_limits());
        },
        options.matrix.empty() ? &stops : nullptr);
    emit_output(options.output, options.format == "geojson" ? answers::render_network_geojson(answer, body)
                                                            : answers::render_json(answer));
    report_skipped_stops(answer, "site");
}

} // namespace

void add_network_command(CLI::App& app) {
    auto options = std::make_shared<NetworkOptions>();
    auto* command = app.add_subcommand("network", "The cheapest network joining every site: a spanning tree of a "
                                                  "matrix, or shared road segments on a road graph.");
    command->add_option("region", options->region, "Region graph (.rrg); needed with --stops, unless --server");
    add_server_option(*command, options->server);
    auto* stops = command->add_option("--stops", options->stops, "Sites CSV (id,lat,lon,...); road length is minimised");
    auto* matrix = command->add_option("--matrix", options->matrix, "Cost matrix CSV (id,<id1>,<id2>,...)");
    stops->excludes(matrix);
    command->add_option("--link-cost", options->link_cost,
                        "Cost of a link on an asymmetric matrix: cheaper = min(c(a,b), c(b,a)) (default), "
                        "dearer = max(c(a,b), c(b,a))")
        ->check(CLI::IsMember({"cheaper", "dearer"}));
    command->add_flag("--metric-closure", options->metric_closure,
                      "Replace each matrix cost by the cheapest chain of costs (Floyd–Warshall) first");
    command->add_option("--format", options->format, "json (default) or geojson (needs a road graph)")
        ->check(CLI::IsMember({"json", "geojson"}));
    command->add_option("-o,--output", options->output, "Write to this file (atomically) instead of stdout");
    add_snap_radius_option(*command, options->snap_radius);
    add_far_stops_option(*command, options->far_stops);
    command->callback([options] { run_network(*options); });
}

} // namespace ringroad::cli
