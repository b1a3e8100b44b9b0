// `ringroad network (REGION.rrg --stops SITES.csv | --matrix MATRIX.csv) [--link-cost cheaper|dearer]
//  [--metric-closure] [--format json|geojson] [-o FILE]`
//
// The cheapest network joining every site.
//  * On a bare matrix: the minimum spanning tree of the sites by Kruskal's algorithm. A link can be
//    built in either direction, so an asymmetric matrix is made symmetric by a stated rule:
//    --link-cost cheaper (default) prices a link at min(c(a,b), c(b,a)), dearer at max.
//  * On a road graph: a network of road segments by Mehlhorn's variant of Kou–Markowsky–Berman,
//    measured in metres (cable and pipe cost follows length), with the links it was built from, the
//    saving from shared road, and the unique road pieces (GeoJSON MultiLineString with --format
//    geojson).
// Output goes to stdout, or atomically to -o FILE (nothing half-written on error).

#include "common/input_error.hpp"
#include "common/safety_notice.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/output.hpp"
#include "daemon/cli/snap_radius_option.hpp"
#include "graph/graph_file.hpp"
#include "planners/matrices/matrix_csv.hpp"
#include "planners/matrices/matrix_diagnostics.hpp"
#include "planners/matrices/metric_closure.hpp"
#include "planners/networks/spanning_tree.hpp"
#include "router/road_network.hpp"
#include "router/road_router.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <memory>
#include <string>
#include <vector>

namespace ringroad::cli {

namespace {

using json = nlohmann::ordered_json;

struct NetworkOptions {
    std::string region;
    std::string stops;
    std::string matrix;
    std::string link_cost = "cheaper";
    bool metric_closure = false;
    std::string format = "json";
    std::string output;
    double snap_radius = 0;
};

double tenths_of(std::uint64_t decimetres) { return static_cast<double>(decimetres) / 10.0; }

// Costs summed in floating point pick up binary noise; 12 significant digits drop it.
double tidy(double value) {
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.12g", value);
    return std::strtod(buffer, nullptr);
}

json position(const graph::Coordinate& point) { return json::array({point.lon(), point.lat()}); }

json matrix_network_json(const NetworkOptions& options) {
    planners::matrices::LabelledMatrix matrix = planners::matrices::read_matrix_csv(options.matrix);
    const planners::matrices::MatrixDiagnostics diagnostics = planners::matrices::diagnose_matrix(matrix.costs);
    json closure = {{"used", options.metric_closure}};
    if (options.metric_closure) {
        planners::matrices::MetricClosure closed = planners::matrices::metric_closure(matrix.costs);
        closure["entries_shortened"] = closed.entries_shortened;
        closure["entries_filled"] = closed.entries_filled;
        closure["note"] = "link costs are over the metric closure (Floyd–Warshall): a link's cost is the cheapest "
                          "chain of entries between its stops";
        matrix.costs = std::move(closed.costs);
    }
    const auto rule = options.link_cost == "dearer" ? planners::networks::LinkCostRule::dearer_direction
                                                    : planners::networks::LinkCostRule::cheaper_direction;
    const planners::networks::SpanningForest tree = planners::networks::minimum_spanning_tree(matrix, rule);
    json links = json::array();
    for (const auto& link : tree.links) {
        links.push_back({{"from", matrix.ids[link.from]}, {"to", matrix.ids[link.to]}, {"cost", tidy(link.cost)}});
    }
    return {{"sites", matrix.ids.size()},
            {"method", "kruskal minimum spanning tree"},
            {"links", links},
            {"cost", tidy(tree.cost)},
            {"link_cost_rule", std::string(planners::networks::link_cost_rule_name(rule)) +
                                   (diagnostics.symmetric ? " (the matrix is symmetric: the rule changes nothing)"
                                                          : " (the matrix is asymmetric)")},
            {"symmetric", diagnostics.symmetric},
            {"missing_entries", diagnostics.missing_entries},
            {"metric_closure", closure}};
}

struct RoadNetworkAnswer {
    graph::RoadGraph graph;
    router::StopList stops;     // with any further columns (name, ...), echoed in GeoJSON
    std::vector<router::SnappedStop> sites;
    router::RoadNetwork network;
};

RoadNetworkAnswer plan_on_roads(const NetworkOptions& options) {
    router::StopList stops = router::read_stops_csv(options.stops);
    graph::RoadGraph graph = graph::load_road_graph(options.region);
    // The snapper alone is enough: a network needs site positions, not the routing engine.
    const router::RoadSnapper snapper(graph);
    RoadNetworkAnswer answer{graph, stops, {}, {}};
    std::vector<router::NetworkSite> sites;
    for (const router::Stop& stop : stops.stops) {
        try {
            answer.sites.push_back(snapper.snap(stop.id, stop.lat, stop.lon, options.snap_radius));
        } catch (const InputError& error) {
            throw InputError(stops.source + ":" + std::to_string(stop.line) + ": " + error.what(), error.field());
        }
        sites.push_back({stop.id, answer.sites.back().segment, answer.sites.back().fraction});
    }
    answer.network = router::plan_road_network(graph, sites);
    return answer;
}

json piece_json(const graph::RoadGraph& graph, const router::NetworkPiece& piece) {
    const graph::Segment& segment = graph.segments()[piece.segment];
    json out = {{"segment", piece.segment}, {"way_id", segment.way_id}};
    const std::string_view name = graph.name(segment.name);
    if (!name.empty()) out["name"] = std::string(name);
    out["meters"] = tenths_of(piece.length_dm);
    if (piece.from_fraction != 0.0 || piece.to_fraction != 1.0) {
        out["from_fraction"] = piece.from_fraction;
        out["to_fraction"] = piece.to_fraction;
    }
    return out;
}

json road_network_json(const RoadNetworkAnswer& answer) {
    const auto& network = answer.network;
    json links = json::array();
    for (const auto& link : network.links) {
        links.push_back({{"from", answer.sites[link.from_site].id},
                         {"to", answer.sites[link.to_site].id},
                         {"cost", tenths_of(link.length_dm)}});
    }
    json segments = json::array();
    for (const auto& piece : network.pieces) segments.push_back(piece_json(answer.graph, piece));
    return {{"sites", answer.sites.size()},
            {"method", "Kou–Markowsky–Berman (Mehlhorn's variant) over road length"},
            {"metric", "meters"},
            {"links", links},
            {"cost", tenths_of(network.road_length_dm)},
            {"road_meters", tenths_of(network.road_length_dm)},
            {"link_meters_sum", tenths_of(network.link_length_sum_dm)},
            {"saving_meters", tenths_of(network.saving_dm())},
            {"segments", segments},
            {"note", "roads count in both directions (a cable or pipe along a one-way street serves both ways)"}};
}

// RFC 7946: the road pieces as one MultiLineString feature, the sites as Point features; the
// summary is a foreign member of the collection.
json road_network_geojson(const RoadNetworkAnswer& answer, json summary) {
    json lines = json::array();
    for (const auto& piece : answer.network.pieces) {
        const router::PathPiece path_piece{piece.segment, true, piece.from_fraction, piece.to_fraction, 0, 0};
        json line = json::array();
        for (const auto& point : router::path_geometry(answer.graph, {path_piece})) line.push_back(position(point));
        lines.push_back(line);
    }
    json features = json::array();
    features.push_back({{"type", "Feature"},
                        {"geometry", {{"type", "MultiLineString"}, {"coordinates", lines}}},
                        {"properties", {{"road_meters", summary["road_meters"]}, {"segments", lines.size()}}}});
    for (std::size_t i = 0; i < answer.sites.size(); ++i) {
        const auto& site = answer.sites[i];
        json properties = {{"site", site.id}, {"snap_meters", std::round(site.snap_distance_meters * 10) / 10}};
        const auto& extra = answer.stops.stops[i].extra_values;
        for (std::size_t column = 0; column < extra.size(); ++column) {
            const std::string& name = answer.stops.extra_columns[column];
            if (!properties.contains(name)) properties[name] = extra[column];
        }
        features.push_back({{"type", "Feature"},
                            {"geometry", {{"type", "Point"}, {"coordinates", position(site.on_road)}}},
                            {"properties", properties}});
    }
    summary.erase("segments");
    return {{"type", "FeatureCollection"}, {"features", features}, {"network", summary}, {"caution", kSafetyNotice}};
}

void check_options(const NetworkOptions& options) {
    if (options.matrix.empty() && options.stops.empty()) {
        throw CLI::ValidationError("network", "give REGION.rrg --stops SITES.csv, or --matrix MATRIX.csv");
    }
    if (!options.stops.empty() && options.region.empty()) {
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
    std::string text;
    if (!options.matrix.empty()) {
        json out = matrix_network_json(options);
        out["caution"] = kSafetyNotice;
        text = out.dump(kJsonIndent) + "\n";
    } else {
        const RoadNetworkAnswer answer = plan_on_roads(options);
        json out = road_network_json(answer);
        if (options.format == "geojson") {
            text = road_network_geojson(answer, out).dump(kJsonIndent) + "\n";
        } else {
            out["caution"] = kSafetyNotice;
            text = out.dump(kJsonIndent) + "\n";
        }
    }
    emit_output(options.output, text);
}

} // namespace

void add_network_command(CLI::App& app) {
    auto options = std::make_shared<NetworkOptions>();
    auto* command = app.add_subcommand("network", "The cheapest network joining every site: a spanning tree of a "
                                                  "matrix, or shared road segments on a road graph.");
    command->add_option("region", options->region, "Region graph (.rrg); needed with --stops");
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
    command->callback([options] { run_network(*options); });
}

} // namespace ringroad::cli
