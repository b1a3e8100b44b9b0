// `ringroad matrix REGION.rrg --stops STOPS.csv [--metric time|distance] [--format csv|json]
//  [--engine auto|hierarchy|dijkstra] [--snap-radius M] [-o FILE] [--second-table FILE]`
//
// The N x N travel matrix between the stops. CSV: one table of the chosen metric (seconds with
// one decimal for time, metres with one decimal for distance), header `id,<id1>,...`, an empty
// cell where no route exists; --second-table FILE writes the other quantity (metres for time,
// seconds for distance) in the same shape. JSON: ids, seconds, meters (null where no route),
// snapped positions, unreachable pairs and the caution. Unreachable pairs are also named in a
// summary on stderr.

#include "common/atomic_file.hpp"
#include "common/csv_writer.hpp"
#include "common/input_error.hpp"
#include "common/safety_notice.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/numeric_options.hpp"
#include "daemon/cli/output.hpp"
#include "daemon/cli/snap_radius_option.hpp"
#include "daemon/cli/unusable_hierarchy_note.hpp"
#include "graph/graph_file.hpp"
#include "router/road_router.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdio>
#include <iostream>
#include <memory>
#include <string>

namespace ringroad::cli {

namespace {

struct MatrixArguments {
    std::string region;
    std::string stops;
    std::string metric = "time";
    std::string format = "csv";
    std::string engine = "auto";
    double snap_radius = router::kDefaultSnapRadiusMeters;
    std::string output;
    std::string second_table;
    unsigned threads = 0;
};

std::string decimal(double value) {
    char text[32];
    std::snprintf(text, sizeof text, "%.1f", value);
    return text;
}

std::string csv_table(const router::StopList& stops, const router::TravelMatrix& matrix, bool seconds) {
    std::string out;
    std::vector<std::string> row{"id"};
    for (const router::Stop& stop : stops.stops) row.push_back(stop.id);
    append_csv_row(out, row);
    for (std::size_t from = 0; from < matrix.size(); ++from) {
        row.assign(1, stops.stops[from].id);
        for (std::size_t to = 0; to < matrix.size(); ++to) {
            if (!matrix.reachable(from, to)) {
                row.emplace_back();
            } else {
                row.push_back(decimal(seconds ? matrix.seconds(from, to) : matrix.meters(from, to)));
            }
        }
        append_csv_row(out, row);
    }
    return out;
}

nlohmann::json snapped_json(const router::RoadRouter& router, const router::Stop& stop, const router::SnappedStop& snapped,
                            const std::vector<std::string>& extra_columns) {
    const graph::Segment& segment = router.road_graph().segments()[snapped.segment];
    nlohmann::json entry{{"id", stop.id},
                         {"lat", snapped.requested.lat_e7 / 1e7},
                         {"lon", snapped.requested.lon_e7 / 1e7},
                         {"road_lat", snapped.on_road.lat_e7 / 1e7},
                         {"road_lon", snapped.on_road.lon_e7 / 1e7},
                         {"snap_meters", std::round(snapped.snap_distance_meters * 10.0) / 10.0},
                         {"segment", snapped.segment},
                         {"fraction", snapped.fraction}};
    if (segment.name != graph::kNoName) entry["road"] = std::string(router.road_graph().name(segment.name));
    if (!extra_columns.empty()) {
        nlohmann::json columns = nlohmann::json::object();
        for (std::size_t c = 0; c < extra_columns.size(); ++c) columns[extra_columns[c]] = stop.extra_values[c];
        entry["columns"] = columns;
    }
    return entry;
}

std::string json_report(const router::RoadRouter& router, const router::StopList& stops,
                        const std::vector<router::SnappedStop>& snapped, const router::TravelMatrix& matrix,
                        const std::string& metric, const std::string& engine) {
    nlohmann::json ids = nlohmann::json::array(), seconds = nlohmann::json::array(), meters = nlohmann::json::array();
    nlohmann::json unreachable = nlohmann::json::array(), snapped_list = nlohmann::json::array();
    for (std::size_t from = 0; from < matrix.size(); ++from) {
        ids.push_back(stops.stops[from].id);
        snapped_list.push_back(snapped_json(router, stops.stops[from], snapped[from], stops.extra_columns));
        nlohmann::json seconds_row = nlohmann::json::array(), meters_row = nlohmann::json::array();
        for (std::size_t to = 0; to < matrix.size(); ++to) {
            if (matrix.reachable(from, to)) {
                seconds_row.push_back(matrix.seconds(from, to));
                meters_row.push_back(matrix.meters(from, to));
            } else {
                seconds_row.push_back(nullptr);
                meters_row.push_back(nullptr);
                unreachable.push_back({{"from", stops.stops[from].id}, {"to", stops.stops[to].id}});
            }
        }
        seconds.push_back(std::move(seconds_row));
        meters.push_back(std::move(meters_row));
    }
    const nlohmann::json report{{"ids", ids},       {"metric", metric},         {"engine", engine},
                                {"seconds", seconds}, {"meters", meters},       {"snapped", snapped_list},
                                {"unreachable", unreachable}, {"caution", kSafetyNotice}};
    return report.dump(kJsonIndent) + "\n";
}

void report_unreachable(const router::StopList& stops, const router::TravelMatrix& matrix) {
    const std::size_t count = matrix.unreachable_count();
    if (count == 0) return;
    std::string names;
    std::size_t shown = 0;
    for (std::size_t from = 0; from < matrix.size() && shown < 10; ++from) {
        for (std::size_t to = 0; to < matrix.size() && shown < 10; ++to) {
            if (matrix.reachable(from, to)) continue;
            names += (shown == 0 ? "" : ", ") + stops.stops[from].id + " -> " + stops.stops[to].id;
            ++shown;
        }
    }
    if (count > shown) names += ", and " + std::to_string(count - shown) + " more";
    std::cerr << "ringroad: " << count << " unreachable pair" << (count == 1 ? "" : "s") << " (no route): " << names
              << '\n';
}

void run_matrix(const MatrixArguments& arguments) {
    const auto metric = router::metric_from_name(arguments.metric);
    const auto engine = router::engine_from_name(arguments.engine);
    if (!arguments.second_table.empty() && arguments.format != "csv") {
        throw InputError("--second-table: only with --format csv", "second-table");
    }
    // Read the stops before the (larger) graph, so a bad file fails fast.
    const router::StopList stops = router::read_stops_csv(arguments.stops);
    router::RouterOptions options;
    options.snap_radius_meters = arguments.snap_radius;
    options.threads = arguments.threads;
    const router::RoadRouter road_router(graph::load_road_graph(arguments.region), options);
    note_unusable_hierarchy(road_router, arguments.region, *metric, *engine);
    const std::vector<router::SnappedStop> snapped = road_router.snap_stops(stops);
    const router::TravelMatrix matrix = road_router.matrix(snapped, *metric, *engine);
    const std::string engine_used =
        *engine == router::Engine::dijkstra || (*engine == router::Engine::automatic && !road_router.has_stored_hierarchy(*metric))
            ? "dijkstra"
            : "hierarchy";

    if (arguments.format == "json") {
        emit_output(arguments.output, json_report(road_router, stops, snapped, matrix, arguments.metric, engine_used));
    } else {
        const bool time = *metric == router::Metric::time;
        std::vector<std::pair<std::string, std::string>> tables{{arguments.output, csv_table(stops, matrix, time)}};
        if (!arguments.second_table.empty()) tables.emplace_back(arguments.second_table, csv_table(stops, matrix, !time));
        emit_outputs(tables);   // both tables or neither
        print_caution();
    }
    report_unreachable(stops, matrix);
}

} // namespace

void add_matrix_command(CLI::App& app) {
    auto arguments = std::make_shared<MatrixArguments>();
    auto* command = app.add_subcommand("matrix", "Travel-time and distance matrix between stops");
    command->add_option("region", arguments->region, "Region graph (.rrg)")->required();
    command->add_option("--stops", arguments->stops, "Stops CSV: id,lat,lon[,...]")->required();
    command->add_option("--metric", arguments->metric, "time (fastest) or distance (shortest)")
        ->check(CLI::IsMember({"time", "distance"}));
    command->add_option("--format", arguments->format, "csv or json")->check(CLI::IsMember({"csv", "json"}));
    command->add_option("--engine", arguments->engine, "auto, hierarchy or dijkstra")
        ->check(CLI::IsMember({"auto", "hierarchy", "dijkstra"}));
    add_snap_radius_option(*command, arguments->snap_radius);
    command->add_option("-o,--output", arguments->output, "Output file (default: standard output)");
    command->add_option("--second-table", arguments->second_table,
                        "CSV only: write the other quantity (metres for time, seconds for distance) here");
    command->add_option("--threads", arguments->threads, "Threads (0 = all cores)")->check(count_between(0, kMostThreads));
    command->callback([arguments] { run_matrix(*arguments); });
}

} // namespace ringroad::cli
