#include "common/input_error.hpp"
#include "daemon/answers/renderings.hpp"
#include "daemon/answers/request_stop_lookup.hpp"

#include <cstdio>

namespace ringroad::answers {

using Json = nlohmann::ordered_json;

namespace {

// A position from a GeoJSON [lon, lat] pair.
std::string gpx_point(const char* tag, double lat, double lon) {
    char buffer[96];
    std::snprintf(buffer, sizeof buffer, "<%s lat=\"%.7f\" lon=\"%.7f\"", tag, lat, lon);
    return buffer;
}

} // namespace

std::string render_route_gpx(const Json& answer) {
    std::string out = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                      "<gpx version=\"1.1\" creator=\"ringroad\" xmlns=\"http://www.topografix.com/GPX/1/1\">\n"
                      " <metadata><desc>" + xml_escape(answer.at("caution").get<std::string>()) + "</desc></metadata>\n"
                      " <trk>\n  <name>route</name>\n";
    char line[160];
    std::snprintf(line, sizeof line, "  <desc>%.1f s, %.1f m</desc>\n  <trkseg>\n", answer.at("seconds").get<double>(),
                  answer.at("meters").get<double>());
    out += line;
    const Json& points = answer.at("geometry").at("coordinates");
    // The GeoJSON line repeats a lone point (RFC 7946 wants two); a track needs it once.
    const std::size_t count = points.size() == 2 && points[0] == points[1] ? 1 : points.size();
    for (std::size_t i = 0; i < count; ++i) {
        std::snprintf(line, sizeof line, "   <trkpt lat=\"%.7f\" lon=\"%.7f\"/>\n", points[i][1].get<double>(),
                      points[i][0].get<double>());
        out += line;
    }
    out += "  </trkseg>\n </trk>\n</gpx>\n";
    return out;
}

// GPX 1.1: the stops as waypoints in visit order, the road as one track with a segment per hop.
std::string render_tour_gpx(const Json& answer, const Json& request) {
    const RequestStopLookup stops(request);
    std::string out = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                      "<gpx version=\"1.1\" creator=\"ringroad\" xmlns=\"http://www.topografix.com/GPX/1/1\">\n";
    out += "  <metadata><desc>" + xml_escape(answer.at("caution").get<std::string>()) + "</desc></metadata>\n";
    const Json& order = answer.at("order");
    for (std::size_t visit = 0; visit < order.size(); ++visit) {
        const std::string id = order[visit].get<std::string>();
        const graph::Coordinate& point = stops[id].position;
        out += "  " + gpx_point("wpt", point.lat(), point.lon()) + "><name>" + xml_escape(id) + "</name><desc>visit " +
               std::to_string(visit) + "</desc></wpt>\n";
    }
    out += "  <trk><name>tour</name>\n";
    for (const auto& hop : answer.at("hops")) {
        if (!hop.contains("geometry")) throw InputError("tour: the answer carries no geometry (ask with \"geometry\": true)");
        out += "    <trkseg>\n";
        for (const auto& point : hop.at("geometry").at("coordinates")) {
            out += "      " + gpx_point("trkpt", point[1].get<double>(), point[0].get<double>()) + "/>\n";
        }
        out += "    </trkseg>\n";
    }
    out += "  </trk>\n</gpx>\n";
    return out;
}

} // namespace ringroad::answers
