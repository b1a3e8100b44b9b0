#include "daemon/answers/request_stops.hpp"

#include "router/snapping.hpp"
#include "router/stops.hpp"

#include <cmath>
#include <cstdio>
#include <unordered_map>

namespace ringroad::answers {

namespace {

std::string gigabytes(double bytes) {
    char text[40];
    std::snprintf(text, sizeof text, "%.1f GB", bytes / 1e9);
    return text;
}

void check_stop_count(std::size_t count, const AnswerLimits& limits, const std::string& path) {
    if (count > limits.max_stops) {
        refuse(path, std::to_string(count) + " stops is over the limit of " + std::to_string(limits.max_stops) +
                         " stops per request",
               413, "too_large");
    }
}

double one_decimal(double value) { return std::round(value * 10.0) / 10.0; }

} // namespace

void check_table_size(std::size_t stops, std::size_t bytes_per_cell, const AnswerLimits& limits, const std::string& field) {
    const double cells = static_cast<double>(stops) * static_cast<double>(stops);
    if (cells <= static_cast<double>(limits.max_matrix_cells)) return;
    const auto largest = static_cast<std::size_t>(std::floor(std::sqrt(static_cast<double>(limits.max_matrix_cells))));
    refuse(field,
           std::to_string(stops) + " stops need a " + std::to_string(stops) + " x " + std::to_string(stops) +
               " table (about " + gigabytes(cells * static_cast<double>(bytes_per_cell)) + "); the limit is " +
               std::to_string(limits.max_matrix_cells) + " cells (" + std::to_string(largest) + " stops, about " +
               gigabytes(static_cast<double>(limits.max_matrix_cells) * static_cast<double>(bytes_per_cell)) + ")",
           413, "too_large");
}

std::vector<RequestStop> read_stops(RequestObject& body, const AnswerLimits& limits) {
    const std::string path = field_path(body.path(), "stops");
    const Json& list = body.required("stops");
    if (!list.is_array()) refuse(path, "must be an array of {\"id\", \"lat\", \"lon\"} objects");
    if (list.empty()) refuse(path, "no stops (the array is empty)");
    check_stop_count(list.size(), limits, path);
    std::vector<RequestStop> stops;
    stops.reserve(list.size());
    std::unordered_map<std::string, std::size_t> first_index;
    for (std::size_t i = 0; i < list.size(); ++i) {
        const std::string item = item_path(path, i);
        RequestObject object(list[i], item);
        RequestStop stop;
        const std::optional<std::string> id = object.text("id");
        if (!id) refuse(field_path(item, "id"), "missing (required)");
        if (id->empty()) refuse(field_path(item, "id"), "empty id");
        stop.id = *id;
        stop.lat = finite_number(object.required("lat"), field_path(item, "lat"));
        stop.lon = finite_number(object.required("lon"), field_path(item, "lon"));
        try {
            router::check_coordinate_range(stop.lat, stop.lon, "stop '" + stop.id + "'");
        } catch (const InputError& error) {
            refuse(field_path(item, error.field()), error.what());
        }
        for (const auto& [key, value] : list[i].items()) {
            if (key != "id" && key != "lat" && key != "lon") stop.extra[key] = value;
        }
        const auto [where, inserted] = first_index.emplace(stop.id, i);
        if (!inserted) {
            refuse(field_path(item, "id"), "duplicate id '" + stop.id + "' (first at " + item_path(path, where->second) + ")");
        }
        stops.push_back(std::move(stop));
    }
    return stops;
}

planners::matrices::LabelledMatrix read_matrix(RequestObject& body, const AnswerLimits& limits) {
    const std::string path = field_path(body.path(), "matrix");
    RequestObject matrix(body.required("matrix"), path);
    const std::string ids_path = field_path(path, "ids");
    const std::string costs_path = field_path(path, "costs");
    const Json& ids = matrix.required("ids");
    const Json& costs = matrix.required("costs");
    matrix.finish();
    if (!ids.is_array()) refuse(ids_path, "must be an array of stop ids");
    if (ids.empty()) refuse(ids_path, "no stops (the array is empty)");
    check_stop_count(ids.size(), limits, ids_path);
    check_table_size(ids.size(), kTourBytesPerCell, limits, costs_path);
    planners::matrices::LabelledMatrix result;
    std::unordered_map<std::string, std::size_t> first_index;
    for (std::size_t i = 0; i < ids.size(); ++i) {
        const std::string item = item_path(ids_path, i);
        if (!ids[i].is_string()) refuse(item, "must be a string");
        const std::string id = ids[i].get<std::string>();
        if (id.empty()) refuse(item, "empty id");
        const auto [where, inserted] = first_index.emplace(id, i);
        if (!inserted) refuse(item, "duplicate stop id '" + id + "' (first at " + item_path(ids_path, where->second) + ")");
        result.ids.push_back(id);
    }
    const std::size_t n = ids.size();
    if (!costs.is_array()) refuse(costs_path, "must be an array of rows");
    if (costs.size() != n) {
        refuse(costs_path, "has " + std::to_string(costs.size()) + " rows for " + std::to_string(n) + " ids");
    }
    result.costs = planners::matrices::CostMatrix(n);
    for (std::size_t from = 0; from < n; ++from) {
        const std::string row_path = item_path(costs_path, from);
        const Json& row = costs[from];
        if (!row.is_array()) refuse(row_path, "must be an array of costs");
        if (row.size() != n) {
            refuse(row_path, "has " + std::to_string(row.size()) + " entries for " + std::to_string(n) + " ids");
        }
        for (std::size_t to = 0; to < n; ++to) {
            const std::string cell = item_path(row_path, to);
            if (row[to].is_null()) {
                if (from != to) result.costs(from, to) = planners::matrices::kMissingCost;
                continue;
            }
            const double cost = finite_number(row[to], cell);
            if (cost < 0.0) refuse(cell, "a cost cannot be negative");
            if (from == to && cost != 0.0) refuse(cell, "the cost from a stop to itself must be 0 or null");
            result.costs(from, to) = cost;
        }
    }
    return result;
}

PlacedStops place_stops(const router::RoadRouter& router, const std::vector<RequestStop>& stops, double radius_meters,
                        bool skip_far) {
    PlacedStops placed;
    for (std::size_t i = 0; i < stops.size(); ++i) {
        const RequestStop& stop = stops[i];
        try {
            placed.snapped.push_back(router.snapper().snap(stop.id, stop.lat, stop.lon, radius_meters));
            placed.kept.push_back(i);
        } catch (const InputError& error) {
            router::SnappedStop nearest;
            if (!skip_far || !router.snapper().nearest(stop.lat, stop.lon, nearest)) {
                refuse(item_path("stops", i), error.what(), 422, "far_from_road");
            }
            placed.skipped.push_back({{"id", stop.id}, {"meters_to_road", one_decimal(nearest.snap_distance_meters)}});
        }
    }
    if (placed.kept.empty()) {
        refuse("stops", "no stop is within " + std::to_string(static_cast<long long>(std::llround(radius_meters))) +
                            " m of a road (all " + std::to_string(stops.size()) + " skipped)",
               422, "far_from_road");
    }
    return placed;
}

double read_snap_radius(RequestObject& body) {
    return body.number("snap_radius", 0.0, 1e6, /*low_open=*/true).value_or(router::kDefaultSnapRadiusMeters);
}

bool read_skip_far(RequestObject& body) { return body.choice("far_stops", {"error", "skip"}, "error") == "skip"; }

void refuse_road_options_on_matrix(RequestObject& body, bool geometry, const std::string& what) {
    if (geometry || body.has("far_stops") || body.has("snap_radius")) {
        refuse(geometry ? "geometry" : body.has("far_stops") ? "far_stops" : "snap_radius",
               "places " + what + " on roads: it needs \"stops\" on a region, not \"matrix\"");
    }
}

const router::RoadRouter& region_router(const LoadedRegion* region) {
    if (region == nullptr || !region->router) {
        throw RequestError(422, "no_region", "this question needs a region graph (stops are placed on its roads)");
    }
    return *region->router;
}

} // namespace ringroad::answers
