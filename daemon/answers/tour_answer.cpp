// The tour question: {"stops" | "matrix", "start", "end", "open", "time_limit", "seed", "method",
// "exact_limit", "metric_closure", "snap_radius", "far_stops", "geometry"} -> the order, the hops,
// totals, the lower bound and gap, diagnostics of the matrix, and the caution. On roads the tour
// minimises travel time and hops carry seconds and metres; on a bare matrix its own cost.
// "geometry": true adds each hop's road as a GeoJSON LineString (what the GeoJSON and GPX
// renderings draw).

#include "common/safety_notice.hpp"
#include "daemon/answers/question_answers.hpp"
#include "daemon/answers/request_stops.hpp"
#include "planners/matrices/matrix_diagnostics.hpp"
#include "planners/matrices/metric_closure.hpp"
#include "planners/tours/tour_planner.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <limits>
#include <optional>

namespace ringroad::answers {

namespace {

namespace matrices = planners::matrices;
namespace tours = planners::tours;

// The stops and what a hop between them costs: a bare matrix, or travel times on roads (then
// `router` is set, `snapped` and `travel` hold the stops that were placed).
struct TourInput {
    matrices::LabelledMatrix matrix;
    const router::RoadRouter* router = nullptr;
    std::vector<RequestStop> stops;
    PlacedStops placed;
    router::TravelMatrix travel;
    bool on_roads() const { return router != nullptr; }
};

std::string trip_shape_name(tours::TripShape shape) {
    switch (shape) {
    case tours::TripShape::closed: return "closed";
    case tours::TripShape::open_fixed_end: return "open, fixed end";
    case tours::TripShape::open_free_end: return "open, free end";
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

double significant(double value, int digits) {
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.*g", digits, value);
    return std::strtod(buffer, nullptr);
}

Json diagnostics_json(const matrices::MatrixDiagnostics& report, const std::vector<std::string>& ids) {
    Json missing = Json::array();
    for (const auto& pair : report.missing_examples) missing.push_back({{"from", ids[pair.from]}, {"to", ids[pair.to]}});
    Json asymmetric = Json::array();
    for (const auto& pair : report.asymmetry_examples) asymmetric.push_back({{"from", ids[pair.from]}, {"to", ids[pair.to]}});
    Json triangles = Json::array();
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

std::size_t index_of(const TourInput& input, const std::string& id, const char* field) {
    for (std::size_t i = 0; i < input.matrix.ids.size(); ++i) {
        if (input.matrix.ids[i] == id) return i;
    }
    if (input.on_roads()) {
        for (const auto& skipped : input.placed.skipped) {
            if (skipped.at("id").get<std::string>() == id) {
                refuse(field, "stop '" + id + "' was skipped: it is " + skipped.at("meters_to_road").dump() +
                                  " m from the nearest road",
                       422, "far_from_road");
            }
        }
    }
    refuse(field, "unknown stop '" + id + "'", 404, "unknown_stop");
}

// The road of each hop (the router's fastest path), [lon, lat] as the coordinates print.
Json hop_geometry(const TourInput& input, std::size_t from, std::size_t to) {
    const auto path = input.router->route(input.placed.snapped[from], input.placed.snapped[to], router::Metric::time);
    if (!path) {
        refuse("stops", "no road path from stop '" + input.matrix.ids[from] + "' to stop '" + input.matrix.ids[to] + "'",
               422, "unreachable");
    }
    Json line = Json::array();
    for (const auto& point : path->geometry) line.push_back(Json::array({point.lon(), point.lat()}));
    return {{"type", "LineString"}, {"coordinates", line}};
}

} // namespace

Json answer_tour(const Json& request, const LoadedRegion* region, const AnswerLimits& limits) {
    RequestObject body(request, "");
    TourInput input;
    const bool has_stops = body.has("stops");
    const bool has_matrix = body.has("matrix");
    if (has_stops == has_matrix) refuse("stops", "give either \"stops\" (on a region) or \"matrix\", not both or neither");
    if (has_matrix) input.matrix = read_matrix(body, limits);
    else input.stops = read_stops(body, limits);
    const std::optional<std::string> start = body.text("start");
    const std::optional<std::string> end = body.text("end");
    const bool open = body.flag("open").value_or(false);
    if (open && end) refuse("end", "an open trip (\"open\": true) has a free end; give \"end\" or \"open\", not both");
    tours::TourRequest plan;
    plan.time_limit_seconds =
        body.number("time_limit", 0.0, limits.max_time_limit_seconds).value_or(limits.default_time_limit_seconds);
    plan.seed = body.whole("seed", 0, std::numeric_limits<std::uint64_t>::max()).value_or(1);
    const std::string method = body.choice("method", {"auto", "tree-doubling"}, "auto");
    plan.method = method == "tree-doubling" ? tours::TourMethod::tree_doubling : tours::TourMethod::automatic;
    plan.exact_limit = body.whole("exact_limit", 0, 20).value_or(16);
    const bool use_closure = body.flag("metric_closure").value_or(false);
    const double radius = read_snap_radius(body);
    const bool skip_far = read_skip_far(body);
    const bool geometry = body.flag("geometry").value_or(false);
    body.finish();
    if (has_matrix) refuse_road_options_on_matrix(body, geometry, "stops");

    if (!has_matrix) {
        check_table_size(input.stops.size(), kTourBytesPerCell, limits, "stops");
        input.router = &region_router(region);
        input.placed = place_stops(*input.router, input.stops, radius, skip_far);
        input.travel = input.router->matrix(input.placed.snapped, router::Metric::time);
        input.matrix.costs = input.travel.seconds_matrix();
        for (const std::size_t kept : input.placed.kept) input.matrix.ids.push_back(input.stops[kept].id);
    }
    const auto& ids = input.matrix.ids;

    const matrices::MatrixDiagnostics diagnostics = matrices::diagnose_matrix(input.matrix.costs);
    std::optional<matrices::MetricClosure> closure;
    matrices::CostMatrix planning_costs = input.matrix.costs;
    if (use_closure) {
        closure = matrices::metric_closure(input.matrix.costs);
        planning_costs = closure->costs;
    }
    if (start) plan.start = index_of(input, *start, "start");
    if (open) {
        plan.shape = tours::TripShape::open_free_end;
    } else if (end) {
        plan.end = index_of(input, *end, "end");
        // Ending where it started is a closed tour.
        if (plan.end != plan.start) plan.shape = tours::TripShape::open_fixed_end;
    }
    plan.stop_labels = ids;   // so the planner's messages name stops by id
    tours::TourResult result;
    try {
        // The planner checks that every stop can be left, entered and reached as the trip's
        // shape needs (an open trip's start need not be entered).
        result = tours::plan_tour(planning_costs, plan);
    } catch (const RequestError&) {
        throw;
    } catch (const InputError& error) {
        refuse(has_matrix ? "matrix" : "stops", error.what(), 422, "no_tour");
    }

    // The visits as (from, to) pairs: a closed tour returns to its start.
    const auto& order = result.order;
    std::vector<std::pair<std::size_t, std::size_t>> pairs;
    for (std::size_t i = 0; i + 1 < order.size(); ++i) pairs.push_back({order[i], order[i + 1]});
    if (plan.shape == tours::TripShape::closed && order.size() > 1) pairs.push_back({order.back(), order.front()});

    Json hops = Json::array();
    double total_meters = 0.0;
    for (std::size_t i = 0; i < pairs.size(); ++i) {
        const auto [from, to] = pairs[i];
        Json hop = {{"from", ids[from]}, {"to", ids[to]}};
        if (input.on_roads()) {
            hop["seconds"] = tenths(result.hop_costs[i]);
            hop["meters"] = tenths(input.travel.meters(from, to));
            total_meters += input.travel.meters(from, to);
            if (geometry) hop["geometry"] = hop_geometry(input, from, to);
        } else {
            hop["cost"] = tidy(result.hop_costs[i]);
        }
        hops.push_back(std::move(hop));
    }
    Json order_ids = Json::array();
    for (const std::size_t stop : order) order_ids.push_back(ids[stop]);
    Json out = {{"stops", ids.size()}, {"trip", trip_shape_name(plan.shape)}, {"order", order_ids}, {"hops", hops}};
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
    out["lower_bound"] = !bound_known ? Json(nullptr)
                         : input.on_roads() ? Json(std::floor(result.lower_bound * 10.0 + 1e-9) / 10.0)
                                            : Json(tidy(result.lower_bound));
    out["gap"] = std::isfinite(result.gap) ? Json(significant(result.gap, 4)) : Json(nullptr);
    out["proven_optimal"] = result.proven_optimal;
    out["method"] = result.method;
    out["seed"] = plan.seed;
    out["time_limit_seconds"] = plan.time_limit_seconds;
    out["elapsed_seconds"] = std::round(result.elapsed_seconds * 1e6) / 1e6;
    out["diagnostics"] = diagnostics_json(diagnostics, ids);
    Json closure_json = {{"used", closure.has_value()}};
    if (closure) {
        closure_json["entries_shortened"] = closure->entries_shortened;
        closure_json["entries_filled"] = closure->entries_filled;
        closure_json["note"] = "costs are over the metric closure (Floyd–Warshall): a hop's cost is the cheapest chain "
                               "of entries between its stops, which may pass other stops";
    }
    out["metric_closure"] = closure_json;
    if (method == "tree-doubling" && !closure && diagnostics.triangle_violations > 0) {
        out["note"] = "the 2x guarantee of tree doubling assumes the triangle inequality, which this matrix violates "
                      "(see diagnostics; --metric-closure restores it)";
    }
    if (skip_far) out["skipped_stops"] = input.placed.skipped;
    out["caution"] = kSafetyNotice;
    return out;
}

} // namespace ringroad::answers
