// `ringroad tour (REGION.rrg --stops STOPS.csv | --matrix MATRIX.csv) [--start ID] [--end ID | --open]
//  [--time-limit SECONDS] [--seed N] [--method auto|tree-doubling] [--exact-limit N]
//  [--metric-closure] [--snap-radius M] [--far-stops error|skip] [--format json|csv|geojson|gpx]
//  [-o FILE]`
//
// The best order to visit every stop, with a lower bound on the optimum so the planner knows how
// good it is. With a road graph the tour minimises travel time (the matrix comes from the router)
// and reports metres alongside; with a bare MATRIX.csv it minimises the matrix's own cost.
// The answer comes from the answer layer (daemon/answers/); output goes to stdout, or atomically
// to -o FILE (nothing half-written on error).

#include "common/input_error.hpp"
#include "daemon/answers/loaded_region.hpp"
#include "daemon/answers/renderings.hpp"
#include "daemon/answers/request_stops.hpp"
#include "daemon/cli/answer_request.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/far_stops_option.hpp"
#include "daemon/cli/numeric_options.hpp"
#include "daemon/cli/output.hpp"
#include "daemon/cli/server_option.hpp"
#include "daemon/service/server_client.hpp"
#include "daemon/cli/snap_radius_option.hpp"
#include "daemon/cli/unusable_hierarchy_note.hpp"
#include "planners/matrices/matrix_csv.hpp"
#include "router/road_router.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <memory>
#include <string>

namespace ringroad::cli {

namespace {

using json = nlohmann::ordered_json;

struct TourOptions {
    std::string region;
    std::string server;
    std::string stops;
    std::string matrix;
    std::string start;
    std::string end;
    bool open = false;
    double time_limit = 1.0;
    std::uint64_t seed = 1;
    std::string method = "auto";
    std::size_t exact_limit = 16;
    bool metric_closure = false;
    std::string format = "json";
    std::string output;
    double snap_radius = 0;
    std::string far_stops = "error";
};

void check_options(const TourOptions& options) {
    if (options.matrix.empty() && options.stops.empty()) {
        throw CLI::ValidationError("tour", "give REGION.rrg --stops STOPS.csv, or --matrix MATRIX.csv");
    }
    if (!options.server.empty() && !options.region.empty()) {
        throw CLI::ValidationError("tour", "--server answers on the service's region: give no REGION.rrg");
    }
    if (!options.stops.empty() && options.region.empty() && options.server.empty()) {
        throw CLI::ValidationError("tour", "--stops needs a region graph: ringroad tour REGION.rrg --stops STOPS.csv");
    }
    if (!options.matrix.empty() && !options.region.empty()) {
        throw CLI::ValidationError("tour", "--matrix takes no region graph (REGION.rrg is for --stops)");
    }
    if (!options.matrix.empty() && (options.format == "geojson" || options.format == "gpx")) {
        throw InputError("--format " + options.format + " draws roads: it needs REGION.rrg --stops, not --matrix",
                         "format");
    }
}

void run_tour(const TourOptions& options) {
    check_options(options);
    json body = json::object();
    router::StopList stops;
    if (!options.matrix.empty()) {
        body["matrix"] = matrix_body(planners::matrices::read_matrix_csv(options.matrix));
    } else {
        stops = router::read_stops_csv(options.stops);
        body["stops"] = stops_body(stops);
        body["snap_radius"] = options.snap_radius;
        if (options.far_stops != "error") body["far_stops"] = options.far_stops;
        if (options.format == "geojson" || options.format == "gpx") body["geometry"] = true;
    }
    if (!options.start.empty()) body["start"] = options.start;
    if (!options.end.empty()) body["end"] = options.end;
    if (options.open) body["open"] = true;
    body["time_limit"] = options.time_limit;
    body["seed"] = options.seed;
    body["method"] = options.method;
    body["exact_limit"] = options.exact_limit;
    if (options.metric_closure) body["metric_closure"] = true;

    const answers::AnswerLimits limits = command_line_limits();
    std::shared_ptr<const answers::LoadedRegion> region;
    if (options.matrix.empty() && options.server.empty()) {
        // The size check before the region is loaded, so an impossible request fails fast.
        answer_for_command_line(
            [&] {
                answers::check_table_size(stops.stops.size(), answers::kTourBytesPerCell, limits, "stops");
                return json();
            },
            &stops);
        router::RouterOptions router_options;
        router_options.snap_radius_meters = options.snap_radius;
        region = answers::load_region(options.region, router_options);
        note_unusable_hierarchy(*region->router, options.region, router::Metric::time, router::Engine::automatic);
    }
    const json answer = answer_for_command_line(
        [&] {
            if (!options.server.empty()) return service::answer_from_server(options.server, answers::Question::tour, body);
            return answers::answer_json(answers::Question::tour, body, region.get(), limits);
        },
        options.matrix.empty() ? &stops : nullptr);

    std::string text;
    if (options.format == "csv") {
        text = answers::render_tour_csv(answer, body);
        print_caution();
    } else if (options.format == "geojson") {
        text = answers::render_tour_geojson(answer, body);
    } else if (options.format == "gpx") {
        text = answers::render_tour_gpx(answer, body);
    } else {
        text = answers::render_json(answer);
    }
    emit_output(options.output, text);
    report_skipped_stops(answer, "stop");
}

} // namespace

void add_tour_command(CLI::App& app) {
    auto options = std::make_shared<TourOptions>();
    auto* command = app.add_subcommand(
        "tour", "The best order to visit every stop (closed tour or open trip), with a lower bound on the optimum.");
    command->add_option("region", options->region, "Region graph (.rrg); needed with --stops, unless --server");
    add_server_option(*command, options->server);
    auto* stops = command->add_option("--stops", options->stops, "Stops CSV (id,lat,lon,...); travel time is minimised");
    auto* matrix = command->add_option("--matrix", options->matrix, "Cost matrix CSV (id,<id1>,<id2>,...)");
    stops->excludes(matrix);
    command->add_option("--start", options->start, "Stop id the tour starts at (default: the first stop)");
    auto* end = command->add_option("--end", options->end, "Stop id an open trip ends at");
    auto* open = command->add_flag("--open", options->open, "Open trip with a free end");
    end->excludes(open);
    command->add_option("--time-limit", options->time_limit, "Search effort for large tours in seconds (default 1), turned into a fixed work budget so a seed always gives the same tour")
        ->check(number_between(0.0, kLargestTimeLimitSeconds));
    command->add_option("--seed", options->seed, "Seed of the randomised search (same seed, same tour)")
        ->check(count_between(0, UINT64_MAX));
    command->add_option("--method", options->method, "auto (exact when small, else search + bound) or tree-doubling")
        ->check(CLI::IsMember({"auto", "tree-doubling"}));
    command->add_option("--exact-limit", options->exact_limit, "Solve exactly up to this many stops (default 16, at most 20)")
        ->check(count_between(0, 20));
    command->add_flag("--metric-closure", options->metric_closure,
                      "Replace each cost by the cheapest chain of costs (Floyd–Warshall) before planning");
    command->add_option("--format", options->format, "json (default), csv, geojson or gpx (the last two need a road graph)")
        ->check(CLI::IsMember({"json", "csv", "geojson", "gpx"}));
    command->add_option("-o,--output", options->output, "Write to this file (atomically) instead of stdout");
    add_snap_radius_option(*command, options->snap_radius);
    add_far_stops_option(*command, options->far_stops);
    command->callback([options] { run_tour(*options); });
}

} // namespace ringroad::cli
