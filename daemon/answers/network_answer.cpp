// The network question: {"stops" | "matrix", "link_cost", "metric_closure", "snap_radius",
// "far_stops", "geometry"} -> the cheapest network joining every site.
//  * On a bare matrix: Kruskal's minimum spanning tree; an asymmetric matrix is made symmetric
//    by the stated rule (link_cost "cheaper" = min(c(a,b), c(b,a)), "dearer" = max).
//  * On roads: a network of road segments (Mehlhorn's variant of Kou–Markowsky–Berman) measured
//    in metres, with its links, the saving from shared road and the unique road pieces;
//    "geometry": true adds each piece's coordinates and the sites' positions on the road.

#include "common/safety_notice.hpp"
#include "daemon/answers/question_answers.hpp"
#include "daemon/answers/request_stops.hpp"
#include "planners/matrices/matrix_diagnostics.hpp"
#include "planners/matrices/metric_closure.hpp"
#include "planners/networks/spanning_tree.hpp"
#include "router/road_network.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace ringroad::answers {

namespace {

double tenths_of(std::uint64_t decimetres) { return static_cast<double>(decimetres) / 10.0; }

// Costs summed in floating point pick up binary noise; 12 significant digits drop it.
double tidy(double value) {
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.12g", value);
    return std::strtod(buffer, nullptr);
}

Json position(const graph::Coordinate& point) { return Json::array({point.lon(), point.lat()}); }

Json network_on_matrix(planners::matrices::LabelledMatrix matrix, bool use_closure, const std::string& link_cost) {
    const planners::matrices::MatrixDiagnostics diagnostics = planners::matrices::diagnose_matrix(matrix.costs);
    Json closure = {{"used", use_closure}};
    if (use_closure) {
        planners::matrices::MetricClosure closed = planners::matrices::metric_closure(matrix.costs);
        closure["entries_shortened"] = closed.entries_shortened;
        closure["entries_filled"] = closed.entries_filled;
        closure["note"] = "link costs are over the metric closure (Floyd–Warshall): a link's cost is the cheapest "
                          "chain of entries between its stops";
        matrix.costs = std::move(closed.costs);
    }
    const auto rule = link_cost == "dearer" ? planners::networks::LinkCostRule::dearer_direction
                                            : planners::networks::LinkCostRule::cheaper_direction;
    planners::networks::SpanningForest tree;
    try {
        tree = planners::networks::minimum_spanning_tree(matrix, rule);
    } catch (const InputError& error) {
        refuse("matrix", error.what(), 422, "no_network");
    }
    Json links = Json::array();
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

Json piece_json(const graph::RoadGraph& graph, const router::NetworkPiece& piece, bool geometry) {
    const graph::Segment& segment = graph.segments()[piece.segment];
    Json out = {{"segment", piece.segment}, {"way_id", segment.way_id}};
    const std::string_view name = graph.name(segment.name);
    if (!name.empty()) out["name"] = std::string(name);
    out["meters"] = tenths_of(piece.length_dm);
    if (piece.from_fraction != 0.0 || piece.to_fraction != 1.0) {
        out["from_fraction"] = piece.from_fraction;
        out["to_fraction"] = piece.to_fraction;
    }
    if (geometry) {
        const router::PathPiece path_piece{piece.segment, true, piece.from_fraction, piece.to_fraction, 0, 0};
        Json line = Json::array();
        for (const auto& point : router::path_geometry(graph, {path_piece})) line.push_back(position(point));
        out["coordinates"] = line;
    }
    return out;
}

Json network_on_roads(const router::RoadRouter& router, const std::vector<RequestStop>& stops, double radius,
                      bool skip_far, bool geometry) {
    const PlacedStops placed = place_stops(router, stops, radius, skip_far);
    std::vector<router::NetworkSite> sites;
    for (const auto& snapped : placed.snapped) sites.push_back({snapped.id, snapped.segment, snapped.fraction});
    const graph::RoadGraph& graph = router.road_graph();
    router::RoadNetwork network;
    try {
        network = router::plan_road_network(graph, sites);
    } catch (const InputError& error) {
        refuse("stops", error.what(), 422, "no_network");
    }
    Json links = Json::array();
    for (const auto& link : network.links) {
        links.push_back({{"from", sites[link.from_site].id}, {"to", sites[link.to_site].id}, {"cost", tenths_of(link.length_dm)}});
    }
    Json segments = Json::array();
    for (const auto& piece : network.pieces) segments.push_back(piece_json(graph, piece, geometry));
    Json out = {{"sites", sites.size()},
                {"method", "Kou–Markowsky–Berman (Mehlhorn's variant) over road length"},
                {"metric", "meters"},
                {"links", links},
                {"cost", tenths_of(network.road_length_dm)},
                {"road_meters", tenths_of(network.road_length_dm)},
                {"link_meters_sum", tenths_of(network.link_length_sum_dm)},
                {"saving_meters", tenths_of(network.saving_dm())},
                {"segments", segments},
                {"note", "roads count in both directions (a cable or pipe along a one-way street serves both ways)"}};
    if (geometry) {
        Json snapped = Json::array();
        for (const auto& site : placed.snapped) {
            snapped.push_back({{"id", site.id},
                               {"road_lon", site.on_road.lon()},
                               {"road_lat", site.on_road.lat()},
                               {"snap_meters", std::round(site.snap_distance_meters * 10) / 10}});
        }
        out["snapped"] = snapped;
    }
    if (skip_far) out["skipped_stops"] = placed.skipped;
    return out;
}

} // namespace

Json answer_network(const Json& request, const LoadedRegion* region, const AnswerLimits& limits) {
    RequestObject body(request, "");
    const bool has_stops = body.has("stops");
    const bool has_matrix = body.has("matrix");
    if (has_stops == has_matrix) refuse("stops", "give either \"stops\" (on a region) or \"matrix\", not both or neither");
    planners::matrices::LabelledMatrix matrix;
    std::vector<RequestStop> stops;
    if (has_matrix) matrix = read_matrix(body, limits);
    else stops = read_stops(body, limits);
    const std::string link_cost = body.choice("link_cost", {"cheaper", "dearer"}, "cheaper");
    const bool use_closure = body.flag("metric_closure").value_or(false);
    const double radius = read_snap_radius(body);
    const bool skip_far = read_skip_far(body);
    const bool geometry = body.flag("geometry").value_or(false);
    body.finish();
    if (has_matrix) refuse_road_options_on_matrix(body, geometry, "sites");
    if (has_stops && use_closure) {
        refuse("metric_closure", "applies to a matrix: road distances are already shortest paths");
    }
    if (has_stops && body.has("link_cost")) {
        refuse("link_cost", "applies to a matrix: a road can be laid in either direction");
    }
    Json out = has_matrix ? network_on_matrix(std::move(matrix), use_closure, link_cost)
                          : network_on_roads(region_router(region), stops, radius, skip_far, geometry);
    out["caution"] = kSafetyNotice;
    return out;
}

} // namespace ringroad::answers
