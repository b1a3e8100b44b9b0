// The matrix question: {"stops", "metric", "engine", "snap_radius", "far_stops"} -> ids, seconds,
// meters (null where no route), snapped positions, unreachable pairs, the caution; with
// far_stops "skip" also skipped_stops. Fields come out sorted by name (the layout the command
// line has always printed).

#include "common/safety_notice.hpp"
#include "daemon/answers/question_answers.hpp"
#include "daemon/answers/request_stops.hpp"

#include <cmath>

namespace ringroad::answers {

namespace {

nlohmann::json snapped_json(const router::RoadRouter& router, const RequestStop& stop, const router::SnappedStop& snapped) {
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
    if (!stop.extra.empty()) {
        nlohmann::json columns = nlohmann::json::object();
        for (const auto& [key, value] : stop.extra.items()) columns[key] = nlohmann::json(value);
        entry["columns"] = columns;
    }
    return entry;
}

} // namespace

Json answer_matrix(const Json& request, const LoadedRegion* region, const AnswerLimits& limits) {
    RequestObject body(request, "");
    const std::vector<RequestStop> stops = read_stops(body, limits);
    const router::Metric metric = read_metric(body);
    const router::Engine engine = read_engine(body);
    const double radius = read_snap_radius(body);
    const bool skip_far = read_skip_far(body);
    body.finish();
    check_table_size(stops.size(), kMatrixBytesPerCell, limits, "stops");
    const router::RoadRouter& router = region_router(region);

    const PlacedStops placed = place_stops(router, stops, radius, skip_far);
    const router::TravelMatrix matrix = router.matrix(placed.snapped, metric, engine);

    nlohmann::json ids = nlohmann::json::array(), seconds = nlohmann::json::array(), meters = nlohmann::json::array();
    nlohmann::json unreachable = nlohmann::json::array(), snapped_list = nlohmann::json::array();
    for (std::size_t from = 0; from < matrix.size(); ++from) {
        const RequestStop& stop = stops[placed.kept[from]];
        ids.push_back(stop.id);
        snapped_list.push_back(snapped_json(router, stop, placed.snapped[from]));
        nlohmann::json seconds_row = nlohmann::json::array(), meters_row = nlohmann::json::array();
        for (std::size_t to = 0; to < matrix.size(); ++to) {
            if (matrix.reachable(from, to)) {
                seconds_row.push_back(matrix.seconds(from, to));
                meters_row.push_back(matrix.meters(from, to));
            } else {
                seconds_row.push_back(nullptr);
                meters_row.push_back(nullptr);
                unreachable.push_back({{"from", stop.id}, {"to", stops[placed.kept[to]].id}});
            }
        }
        seconds.push_back(std::move(seconds_row));
        meters.push_back(std::move(meters_row));
    }
    nlohmann::json answer{{"ids", ids},
                          {"metric", std::string(router::metric_name(metric))},
                          {"engine", engine_used(router, metric, engine)},
                          {"seconds", seconds},
                          {"meters", meters},
                          {"snapped", snapped_list},
                          {"unreachable", unreachable},
                          {"caution", kSafetyNotice}};
    if (skip_far) answer["skipped_stops"] = nlohmann::json(placed.skipped);
    return Json(answer);
}

} // namespace ringroad::answers
