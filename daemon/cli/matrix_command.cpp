// `ringroad matrix REGION.rrg --stops STOPS.csv [--metric time|distance] [--format csv|json]
//  [--engine auto|hierarchy|dijkstra] [--snap-radius M] [--far-stops error|skip] [-o FILE]
//  [--second-table FILE]`
//
// The N x N travel matrix between the stops. CSV: one table of the chosen metric (seconds with
// one decimal for time, metres with one decimal for distance), header `id,<id1>,...`, an empty
// cell where no route exists; --second-table FILE writes the other quantity (metres for time,
// seconds for distance) in the same shape. JSON: ids, seconds, meters (null where no route),
// snapped positions, unreachable pairs and the caution. Unreachable pairs are also named in a
// summary on stderr. The answer comes from the answer layer (daemon/answers/).

#include "common/atomic_file.hpp"
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
#include "router/road_router.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <iostream>
#include <memory>
#include <string>

namespace ringroad::cli {

namespace {

struct MatrixArguments {
    std::string region;
    std::string server;
    std::string stops;
    std::string metric = "time";
    std::string format = "csv";
    std::string engine = "auto";
    double snap_radius = router::kDefaultSnapRadiusMeters;
    std::string far_stops = "error";
    std::string output;
    std::string second_table;
    unsigned threads = 0;
};

void report_unreachable(const nlohmann::ordered_json& unreachable) {
    const std::size_t count = unreachable.size();
    if (count == 0) return;
    std::string names;
    const std::size_t shown = std::min<std::size_t>(count, 10);
    for (std::size_t i = 0; i < shown; ++i) {
        names += (i == 0 ? "" : ", ") + unreachable[i].at("from").get<std::string>() + " -> " +
                 unreachable[i].at("to").get<std::string>();
    }
    if (count > shown) names += ", and " + std::to_string(count - shown) + " more";
    std::cerr << "ringroad: " << count << " unreachable pair" << (count == 1 ? "" : "s") << " (no route): " << names
              << '\n';
}

nlohmann::ordered_json answer_locally(const MatrixArguments& arguments, const nlohmann::ordered_json& body,
                                      const router::StopList& stops) {
    const answers::AnswerLimits limits = command_line_limits();
    // The size check before the region is loaded, so an impossible request fails fast.
    answer_for_command_line(
        [&] {
            answers::check_table_size(stops.stops.size(), answers::kMatrixBytesPerCell, limits, "stops");
            return nlohmann::ordered_json();
        },
        &stops);
    router::RouterOptions options;
    options.snap_radius_meters = arguments.snap_radius;
    options.threads = arguments.threads;
    const auto region = answers::load_region(arguments.region, options);
    note_unusable_hierarchy(*region->router, arguments.region, *router::metric_from_name(arguments.metric),
                            *router::engine_from_name(arguments.engine));
    return answer_for_command_line(
        [&] { return answers::answer_json(answers::Question::matrix, body, region.get(), limits); }, &stops);
}

void run_matrix(const MatrixArguments& arguments) {
    if (!arguments.second_table.empty() && arguments.format != "csv") {
        throw InputError("--second-table: only with --format csv", "second-table");
    }
    // Read the stops before the (larger) graph, so a bad file fails fast.
    const router::StopList stops = router::read_stops_csv(arguments.stops);
    nlohmann::ordered_json body{{"stops", stops_body(stops)},
                                {"metric", arguments.metric},
                                {"engine", arguments.engine},
                                {"snap_radius", arguments.snap_radius}};
    if (arguments.far_stops != "error") body["far_stops"] = arguments.far_stops;
    if (arguments.server.empty() == arguments.region.empty()) {
        throw CLI::ValidationError("matrix", "give REGION.rrg, or --server URL to ask a running service");
    }
    nlohmann::ordered_json answer;
    if (!arguments.server.empty()) {
        answer = answer_for_command_line(
            [&] { return service::answer_from_server(arguments.server, answers::Question::matrix, body); }, &stops);
    } else {
        answer = answer_locally(arguments, body, stops);
    }

    if (arguments.format == "json") {
        emit_output(arguments.output, answers::render_json(answer));
    } else {
        const bool time = arguments.metric == "time";
        std::vector<std::pair<std::string, std::string>> tables{{arguments.output, answers::render_matrix_csv(answer, time)}};
        if (!arguments.second_table.empty()) {
            tables.emplace_back(arguments.second_table, answers::render_matrix_csv(answer, !time));
        }
        emit_outputs(tables);   // both tables or neither
        print_caution();
    }
    report_skipped_stops(answer, "stop");
    report_unreachable(answer.at("unreachable"));
}

} // namespace

void add_matrix_command(CLI::App& app) {
    auto arguments = std::make_shared<MatrixArguments>();
    auto* command = app.add_subcommand("matrix", "Travel-time and distance matrix between stops");
    command->add_option("region", arguments->region, "Region graph (.rrg); not with --server");
    command->add_option("--stops", arguments->stops, "Stops CSV: id,lat,lon[,...]")->required();
    add_server_option(*command, arguments->server);
    command->add_option("--metric", arguments->metric, "time (fastest) or distance (shortest)")
        ->check(CLI::IsMember({"time", "distance"}));
    command->add_option("--format", arguments->format, "csv or json")->check(CLI::IsMember({"csv", "json"}));
    command->add_option("--engine", arguments->engine, "auto, hierarchy or dijkstra")
        ->check(CLI::IsMember({"auto", "hierarchy", "dijkstra"}));
    add_snap_radius_option(*command, arguments->snap_radius);
    add_far_stops_option(*command, arguments->far_stops);
    command->add_option("-o,--output", arguments->output, "Output file (default: standard output)");
    command->add_option("--second-table", arguments->second_table,
                        "CSV only: write the other quantity (metres for time, seconds for distance) here");
    command->add_option("--threads", arguments->threads, "Threads (0 = all cores)")->check(count_between(0, kMostThreads));
    command->callback([arguments] { run_matrix(*arguments); });
}

} // namespace ringroad::cli
