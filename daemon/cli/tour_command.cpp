// `ringroad tour (REGION.rrg --stops STOPS.csv | --matrix MATRIX.csv) [--start ID] [--end ID | --open]
//  [--time-limit SECONDS] [--seed N] [--method auto|tree-doubling] [--exact-limit N]
//  [--metric-closure] [--format json|csv|geojson|gpx] [-o FILE]`
//
// The best order to visit every stop, with a lower bound on the optimum so the planner knows how
// good it is. With a road graph the tour minimises travel time (the matrix comes from the router)
// and reports metres alongside; with a bare MATRIX.csv it minimises the matrix's own cost.
// Output goes to stdout, or atomically to -o FILE (nothing half-written on error).

#include "common/csv_writer.hpp"
#include "common/input_error.hpp"
#include "common/safety_notice.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/numeric_options.hpp"
#include "daemon/cli/output.hpp"
#include "daemon/cli/snap_radius_option.hpp"
#include "daemon/cli/unusable_hierarchy_note.hpp"
#include "graph/graph_file.hpp"
#include "planners/matrices/matrix_csv.hpp"
#include "planners/matrices/matrix_diagnostics.hpp"
#include "planners/matrices/metric_closure.hpp"
#include "planners/tours/tour_planner.hpp"
#include "router/road_router.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace ringroad::cli {

namespace {

using json = nlohmann::ordered_json;

struct TourOptions {
    std::string region;
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
};

// The stops and what a hop between them costs: a bare matrix, or travel times on a road graph
// (then `router`, `stops`, `snapped` and `travel` are set, and metres are known for every hop).
struct TourInput {
    planners::matrices::LabelledMatrix matrix;
    std::unique_ptr<router::RoadRouter> router;
    router::StopList stops;          // with any further columns (name, ...), echoed in CSV/GeoJSON
    std::vector<router::SnappedStop> snapped;
    router::TravelMatrix travel;
    bool on_roads() const { return router != nullptr; }
};

TourInput load_input(const TourOptions& options) {
    TourInput input;
    if (!options.matrix.empty()) {
        input.matrix = planners::matrices::read_matrix_csv(options.matrix);
        return input;
    }
    input.stops = router::read_stops_csv(options.stops);
    router::RouterOptions router_options;
    router_options.snap_radius_meters = options.snap_radius;
    input.router = std::make_unique<router::RoadRouter>(graph::load_road_graph(options.region), router_options);
    note_unusable_hierarchy(*input.router, options.region, router::Metric::time, router::Engine::automatic);
    input.snapped = input.router->snap_stops(input.stops);
    input.travel = input.router->matrix(input.snapped, router::Metric::time);
    input.matrix.costs = input.travel.seconds_matrix();
    for (const router::Stop& stop : input.stops.stops) input.matrix.ids.push_back(stop.id);
    return input;
}

std::size_t index_of(const planners::matrices::LabelledMatrix& matrix, const std::string& id, const char* option,
                     const std::string& source) {
    for (std::size_t i = 0; i < matrix.ids.size(); ++i) {
        if (matrix.ids[i] == id) return i;
    }
    throw InputError(std::string(option) + ": unknown stop '" + id + "' (not in " + source + ")", option);
}

// A stop nothing leaves or nothing reaches makes every tour impossible; say which one.
void check_every_stop_connected(const planners::matrices::LabelledMatrix& matrix) {
    const std::size_t size = matrix.costs.size();
    if (size < 2) return;
    for (std::size_t stop = 0; stop < size; ++stop) {
        bool leaves = false;
        bool reached = false;
        for (std::size_t other = 0; other < size; ++other) {
            if (other == stop) continue;
            leaves = leaves || matrix.costs.has(stop, other);
            reached = reached || matrix.costs.has(other, stop);
        }
        if (!leaves) throw InputError("stop '" + matrix.ids[stop] + "' has no connection to any other stop", "stops");
        if (!reached) throw InputError("stop '" + matrix.ids[stop] + "' cannot be reached from any other stop", "stops");
    }
}

planners::tours::TourRequest make_request(const TourOptions& options, const planners::matrices::LabelledMatrix& matrix,
                                   const std::string& source) {
    planners::tours::TourRequest request;
    if (!options.start.empty()) request.start = index_of(matrix, options.start, "--start", source);
    if (options.open) {
        request.shape = planners::tours::TripShape::open_free_end;
    } else if (!options.end.empty()) {
        request.end = index_of(matrix, options.end, "--end", source);
        // Ending where it started is a closed tour.
        if (request.end != request.start) request.shape = planners::tours::TripShape::open_fixed_end;
    }
    request.time_limit_seconds = options.time_limit;
    request.seed = options.seed;
    request.exact_limit = options.exact_limit;
    request.method = options.method == "tree-doubling" ? planners::tours::TourMethod::tree_doubling
                                                       : planners::tours::TourMethod::automatic;
    request.stop_labels = matrix.ids;   // so the planner's messages name stops by id
    return request;
}

std::string trip_shape_name(planners::tours::TripShape shape) {
    switch (shape) {
    case planners::tours::TripShape::closed: return "closed";
    case planners::tours::TripShape::open_fixed_end: return "open, fixed end";
    case planners::tours::TripShape::open_free_end: return "open, free end";
    }
    return "closed";
}

// Tenths are exact in the graph; keep one decimal so JSON shows no binary noise.
double tenths(double value) { return std::round(value * 10.0) / 10.0; }

// Costs summed in floating point pick up binary noise (743.0999999999999); 12 significant digits
// keep every value a user could have written and drop the noise.
double tidy(double value) {
    if (!std::isfinite(value)) return value;
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.12g", value);
    return std::strtod(buffer, nullptr);
}

std::string format_significant(double value, int digits) {
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.*g", digits, value);
    return buffer;
}

json diagnostics_json(const planners::matrices::MatrixDiagnostics& report, const std::vector<std::string>& ids) {
    json missing = json::array();
    for (const auto& pair : report.missing_examples) missing.push_back({{"from", ids[pair.from]}, {"to", ids[pair.to]}});
    json asymmetric = json::array();
    for (const auto& pair : report.asymmetry_examples) {
        asymmetric.push_back({{"from", ids[pair.from]}, {"to", ids[pair.to]}});
    }
    json triangles = json::array();
    for (const auto& v : report.triangle_examples) {
        triangles.push_back({{"from", ids[v.from]}, {"via", ids[v.via]}, {"to", ids[v.to]},
                             {"direct", tidy(v.direct)}, {"through", tidy(v.through)}});
    }
    const std::string check = report.triangle_sampled
                                  ? "sampled: every pair against " + std::to_string(report.via_stops_checked) + " of " +
                                        std::to_string(report.size) + " stops as the middle stop (counts are lower bounds)"
                                  : "full";
    return {{"symmetric", report.symmetric},
            {"asymmetric_pairs", report.asymmetric_pairs},
            {"largest_asymmetry", tidy(report.largest_asymmetry)},
            {"asymmetry_examples", asymmetric},
            {"missing_entries", report.missing_entries},
            {"missing_examples", missing},
            {"triangle_violations", report.triangle_violations},
            {"triangle_examples", triangles},
            {"triangle_check", check}};
}

struct PlannedTour {
    planners::tours::TourResult result;
    planners::matrices::MatrixDiagnostics diagnostics;
    std::optional<planners::matrices::MetricClosure> closure;
    planners::tours::TripShape shape = planners::tours::TripShape::closed;
};

// The visits as (from, to) index pairs: a closed tour returns to its start.
std::vector<std::pair<std::size_t, std::size_t>> hop_pairs(const PlannedTour& tour) {
    const auto& order = tour.result.order;
    std::vector<std::pair<std::size_t, std::size_t>> hops;
    for (std::size_t i = 0; i + 1 < order.size(); ++i) hops.push_back({order[i], order[i + 1]});
    if (tour.shape == planners::tours::TripShape::closed && order.size() > 1) hops.push_back({order.back(), order.front()});
    return hops;
}

// Per hop: the ids, and its cost (bare matrix) or seconds and metres (road graph).
json hops_json(const TourInput& input, const PlannedTour& tour, double& total_meters) {
    const auto& ids = input.matrix.ids;
    json hops = json::array();
    total_meters = 0.0;
    const auto pairs = hop_pairs(tour);
    for (std::size_t i = 0; i < pairs.size(); ++i) {
        const auto [from, to] = pairs[i];
        json hop = {{"from", ids[from]}, {"to", ids[to]}};
        if (input.on_roads()) {
            hop["seconds"] = tenths(tour.result.hop_costs[i]);
            hop["meters"] = tenths(input.travel.meters(from, to));
            total_meters += input.travel.meters(from, to);
        } else {
            hop["cost"] = tidy(tour.result.hop_costs[i]);
        }
        hops.push_back(hop);
    }
    return hops;
}

json tour_json(const TourInput& input, const PlannedTour& tour, const TourOptions& options) {
    const auto& ids = input.matrix.ids;
    const auto& result = tour.result;
    json order = json::array();
    for (const std::size_t stop : result.order) order.push_back(ids[stop]);
    double total_meters = 0.0;
    const json hops = hops_json(input, tour, total_meters);
    json out = {{"stops", ids.size()}, {"trip", trip_shape_name(tour.shape)}, {"order", order}, {"hops", hops}};
    if (input.on_roads()) {
        out["metric"] = "time";
        out["total_seconds"] = tenths(result.cost);
        out["total_meters"] = tenths(total_meters);
    } else {
        out["cost"] = tidy(result.cost);
    }
    // On roads the bound is in seconds like the tour: shown in tenths, rounded down so it stays
    // a bound. The gap is a ratio: four significant digits say all it means.
    const bool bound_known = std::isfinite(result.lower_bound);
    out["lower_bound"] = !bound_known ? json(nullptr)
                         : input.on_roads() ? json(std::floor(result.lower_bound * 10.0 + 1e-9) / 10.0)
                                            : json(tidy(result.lower_bound));
    out["gap"] = std::isfinite(result.gap) ? json(std::stod(format_significant(result.gap, 4))) : json(nullptr);
    out["proven_optimal"] = result.proven_optimal;
    out["method"] = result.method;
    out["seed"] = options.seed;
    out["time_limit_seconds"] = options.time_limit;
    out["elapsed_seconds"] = std::round(result.elapsed_seconds * 1e6) / 1e6;
    out["diagnostics"] = diagnostics_json(tour.diagnostics, ids);
    json closure = {{"used", tour.closure.has_value()}};
    if (tour.closure) {
        closure["entries_shortened"] = tour.closure->entries_shortened;
        closure["entries_filled"] = tour.closure->entries_filled;
        closure["note"] = "costs are over the metric closure (Floyd–Warshall): a hop's cost is the cheapest chain "
                          "of entries between its stops, which may pass other stops";
    }
    out["metric_closure"] = closure;
    if (options.method == "tree-doubling" && !tour.closure && tour.diagnostics.triangle_violations > 0) {
        out["note"] = "the 2x guarantee of tree doubling assumes the triangle inequality, which this matrix violates "
                      "(see diagnostics; --metric-closure restores it)";
    }
    out["caution"] = kSafetyNotice;
    return out;
}

std::string format_number(double value) {
    if (!std::isfinite(value)) return "";
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.10g", value);
    return buffer;
}

// One row per visit; a closed tour ends with a row back at the start (RFC 4180).
std::string tour_csv(const TourInput& input, const PlannedTour& tour) {
    const auto& ids = input.matrix.ids;
    std::string out;
    if (input.on_roads()) {
        std::vector<std::string> header{"visit", "stop", "lat", "lon", "seconds_from_previous",
                                        "meters_from_previous", "total_seconds", "total_meters"};
        header.insert(header.end(), input.stops.extra_columns.begin(), input.stops.extra_columns.end());
        append_csv_row(out, header);
    } else {
        append_csv_row(out, {"visit", "stop", "cost_from_previous", "total_cost"});
    }
    const auto row = [&](std::size_t visit, std::size_t stop, double cost, double meters, double total_cost,
                         double total_meters) {
        if (input.on_roads()) {
            const auto& point = input.snapped[stop].requested;
            std::vector<std::string> fields{std::to_string(visit), ids[stop], format_number(point.lat()),
                                            format_number(point.lon()), format_number(tenths(cost)),
                                            format_number(tenths(meters)), format_number(tenths(total_cost)),
                                            format_number(tenths(total_meters))};
            const auto& extra = input.stops.stops[stop].extra_values;
            fields.insert(fields.end(), extra.begin(), extra.end());
            append_csv_row(out, fields);
        } else {
            append_csv_row(out, {std::to_string(visit), ids[stop], format_number(cost), format_number(total_cost)});
        }
    };
    row(0, tour.result.order.front(), 0.0, 0.0, 0.0, 0.0);
    double total_cost = 0.0;
    double total_meters = 0.0;
    const auto pairs = hop_pairs(tour);
    for (std::size_t i = 0; i < pairs.size(); ++i) {
        const double meters = input.on_roads() ? input.travel.meters(pairs[i].first, pairs[i].second) : 0.0;
        total_cost += tour.result.hop_costs[i];
        total_meters += meters;
        row(i + 1, pairs[i].second, tour.result.hop_costs[i], meters, total_cost, total_meters);
    }
    return out;
}

// The road geometry of every hop (the router's shortest path by time).
std::vector<router::RoutePath> hop_paths(const TourInput& input, const PlannedTour& tour) {
    std::vector<router::RoutePath> paths;
    for (const auto& [from, to] : hop_pairs(tour)) {
        auto path = input.router->route(input.snapped[from], input.snapped[to], router::Metric::time);
        if (!path) {
            throw InputError("no road path from stop '" + input.matrix.ids[from] + "' to stop '" +
                             input.matrix.ids[to] + "'");
        }
        paths.push_back(std::move(*path));
    }
    return paths;
}

json position(const graph::Coordinate& point) { return json::array({point.lon(), point.lat()}); }

// RFC 7946: a FeatureCollection with one LineString per hop and one Point per stop (in visit
// order); the summary and the caution are foreign members of the collection.
std::string tour_geojson(const TourInput& input, const PlannedTour& tour, const TourOptions& options) {
    const auto& ids = input.matrix.ids;
    json features = json::array();
    const auto& order = tour.result.order;
    for (std::size_t visit = 0; visit < order.size(); ++visit) {
        const auto& stop = input.snapped[order[visit]];
        json properties = {{"stop", ids[order[visit]]}, {"visit", visit}};
        const auto& extra = input.stops.stops[order[visit]].extra_values;
        for (std::size_t column = 0; column < extra.size(); ++column) {
            const std::string& name = input.stops.extra_columns[column];
            if (!properties.contains(name)) properties[name] = extra[column];
        }
        features.push_back({{"type", "Feature"},
                            {"geometry", {{"type", "Point"}, {"coordinates", position(stop.requested)}}},
                            {"properties", properties}});
    }
    const auto pairs = hop_pairs(tour);
    const auto paths = hop_paths(input, tour);
    for (std::size_t i = 0; i < pairs.size(); ++i) {
        json line = json::array();
        for (const auto& point : paths[i].geometry) line.push_back(position(point));
        features.push_back({{"type", "Feature"},
                            {"geometry", {{"type", "LineString"}, {"coordinates", line}}},
                            {"properties", {{"hop", i + 1}, {"from", ids[pairs[i].first]}, {"to", ids[pairs[i].second]},
                                            {"seconds", paths[i].seconds()}, {"meters", paths[i].meters()}}}});
    }
    json summary = tour_json(input, tour, options);
    json collection = {{"type", "FeatureCollection"}, {"features", features}};
    for (const char* key : {"order", "total_seconds", "total_meters", "lower_bound", "gap", "proven_optimal", "method",
                            "caution"}) {
        collection[key] = summary[key];
    }
    return collection.dump(kJsonIndent) + "\n";
}

std::string gpx_point(const char* tag, const graph::Coordinate& point) {
    char buffer[96];
    std::snprintf(buffer, sizeof buffer, "<%s lat=\"%.7f\" lon=\"%.7f\"", tag, point.lat(), point.lon());
    return buffer;
}

// GPX 1.1: the stops as waypoints in visit order, the road as one track with a segment per hop.
std::string tour_gpx(const TourInput& input, const PlannedTour& tour) {
    const auto& ids = input.matrix.ids;
    std::string out = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                      "<gpx version=\"1.1\" creator=\"ringroad\" xmlns=\"http://www.topografix.com/GPX/1/1\">\n";
    out += "  <metadata><desc>" + xml_escape(kSafetyNotice) + "</desc></metadata>\n";
    const auto& order = tour.result.order;
    for (std::size_t visit = 0; visit < order.size(); ++visit) {
        out += "  " + gpx_point("wpt", input.snapped[order[visit]].requested) + "><name>" +
               xml_escape(ids[order[visit]]) + "</name><desc>visit " + std::to_string(visit) + "</desc></wpt>\n";
    }
    out += "  <trk><name>tour</name>\n";
    for (const auto& path : hop_paths(input, tour)) {
        out += "    <trkseg>\n";
        for (const auto& point : path.geometry) out += "      " + gpx_point("trkpt", point) + "/>\n";
        out += "    </trkseg>\n";
    }
    out += "  </trk>\n</gpx>\n";
    return out;
}

void check_options(const TourOptions& options) {
    if (options.matrix.empty() && options.stops.empty()) {
        throw CLI::ValidationError("tour", "give REGION.rrg --stops STOPS.csv, or --matrix MATRIX.csv");
    }
    if (!options.stops.empty() && options.region.empty()) {
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
    TourInput input = load_input(options);
    const std::string source = options.matrix.empty() ? options.stops : options.matrix;
    PlannedTour tour;
    tour.diagnostics = planners::matrices::diagnose_matrix(input.matrix.costs);
    planners::matrices::CostMatrix planning_costs = input.matrix.costs;
    if (options.metric_closure) {
        tour.closure = planners::matrices::metric_closure(input.matrix.costs);
        planning_costs = tour.closure->costs;
    }
    const planners::tours::TourRequest request = make_request(options, input.matrix, source);
    tour.shape = request.shape;
    check_every_stop_connected({input.matrix.ids, planning_costs});
    tour.result = planners::tours::plan_tour(planning_costs, request);

    std::string text;
    if (options.format == "csv") {
        text = tour_csv(input, tour);
        print_caution();
    } else if (options.format == "geojson") {
        text = tour_geojson(input, tour, options);
    } else if (options.format == "gpx") {
        text = tour_gpx(input, tour);
    } else {
        text = tour_json(input, tour, options).dump(kJsonIndent) + "\n";
    }
    emit_output(options.output, text);
}

} // namespace

void add_tour_command(CLI::App& app) {
    auto options = std::make_shared<TourOptions>();
    auto* command = app.add_subcommand(
        "tour", "The best order to visit every stop (closed tour or open trip), with a lower bound on the optimum.");
    command->add_option("region", options->region, "Region graph (.rrg); needed with --stops");
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
    command->callback([options] { run_tour(*options); });
}

} // namespace ringroad::cli
