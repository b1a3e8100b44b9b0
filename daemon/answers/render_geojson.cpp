#include "common/input_error.hpp"
#include "daemon/answers/renderings.hpp"
#include "daemon/answers/request_stop_lookup.hpp"

namespace ringroad::answers {

using Json = nlohmann::ordered_json;

namespace {

Json position(const graph::Coordinate& point) { return Json::array({point.lon(), point.lat()}); }

// The further fields of a stop as GeoJSON properties, without overwriting ours.
void add_stop_fields(Json& properties, const StopEcho& stop) {
    for (const auto& [key, value] : stop.stop->items()) {
        if (key == "id" || key == "lat" || key == "lon" || properties.contains(key)) continue;
        properties[key] = value;
    }
}

void require_geometry(bool present, const char* what) {
    if (!present) throw InputError(std::string(what) + ": the answer carries no geometry (ask with \"geometry\": true)");
}

} // namespace

std::string render_route_geojson(const Json& answer) {
    const Json properties{{"seconds", answer.at("seconds")}, {"meters", answer.at("meters")},
                          {"metric", answer.at("metric")},   {"roads", answer.at("roads")},
                          {"caution", answer.at("caution")}};
    const Json feature{{"type", "Feature"}, {"geometry", answer.at("geometry")}, {"properties", properties}};
    return render_json(Json{{"type", "FeatureCollection"}, {"features", {feature}}});
}

// RFC 7946: a FeatureCollection with one Point per stop (in visit order) and one LineString per
// hop; the summary and the caution are foreign members of the collection.
std::string render_tour_geojson(const Json& answer, const Json& request) {
    const RequestStopLookup stops(request);
    Json features = Json::array();
    const Json& order = answer.at("order");
    for (std::size_t visit = 0; visit < order.size(); ++visit) {
        const std::string id = order[visit].get<std::string>();
        const StopEcho& stop = stops[id];
        Json properties = {{"stop", id}, {"visit", visit}};
        add_stop_fields(properties, stop);
        features.push_back({{"type", "Feature"},
                            {"geometry", {{"type", "Point"}, {"coordinates", position(stop.position)}}},
                            {"properties", properties}});
    }
    const Json& hops = answer.at("hops");
    for (std::size_t i = 0; i < hops.size(); ++i) {
        const Json& hop = hops[i];
        require_geometry(hop.contains("geometry"), "tour");
        features.push_back({{"type", "Feature"},
                            {"geometry", hop.at("geometry")},
                            {"properties", {{"hop", i + 1}, {"from", hop.at("from")}, {"to", hop.at("to")},
                                            {"seconds", hop.at("seconds")}, {"meters", hop.at("meters")}}}});
    }
    Json collection = {{"type", "FeatureCollection"}, {"features", features}};
    for (const char* key : {"order", "total_seconds", "total_meters", "lower_bound", "gap", "proven_optimal", "method",
                            "skipped_stops", "caution"}) {
        if (answer.contains(key)) collection[key] = answer.at(key);
    }
    return render_json(collection);
}

// RFC 7946: the road pieces as one MultiLineString feature, the sites (where they meet the road)
// as Point features; the summary is a foreign member of the collection.
std::string render_network_geojson(const Json& answer, const Json& request) {
    const RequestStopLookup stops(request);
    require_geometry(answer.contains("snapped"), "network");
    Json lines = Json::array();
    for (const auto& piece : answer.at("segments")) {
        require_geometry(piece.contains("coordinates"), "network");
        lines.push_back(piece.at("coordinates"));
    }
    Json features = Json::array();
    features.push_back({{"type", "Feature"},
                        {"geometry", {{"type", "MultiLineString"}, {"coordinates", lines}}},
                        {"properties", {{"road_meters", answer.at("road_meters")}, {"segments", lines.size()}}}});
    for (const auto& site : answer.at("snapped")) {
        const std::string id = site.at("id").get<std::string>();
        Json properties = {{"site", id}, {"snap_meters", site.at("snap_meters")}};
        add_stop_fields(properties, stops[id]);
        features.push_back({{"type", "Feature"},
                            {"geometry",
                             {{"type", "Point"}, {"coordinates", Json::array({site.at("road_lon"), site.at("road_lat")})}}},
                            {"properties", properties}});
    }
    Json summary = answer;
    for (const char* key : {"segments", "snapped", "caution"}) summary.erase(key);
    return render_json(
        Json{{"type", "FeatureCollection"}, {"features", features}, {"network", summary}, {"caution", answer.at("caution")}});
}

} // namespace ringroad::answers
