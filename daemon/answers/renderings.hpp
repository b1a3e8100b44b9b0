#pragma once
// The other formats, rendered from an answer document (and the request body it answered, for
// what the user sent: stop positions and further stop fields). The command line renders its
// --format with these whether the answer was computed in-process or by the service.
//  * CSV (RFC 4180): matrix tables, tour visits.
//  * GeoJSON (RFC 7946, lon/lat): route, tour and road network; tours and networks need an
//    answer asked with "geometry": true.
//  * GPX 1.1: route and tour (again with "geometry": true for a tour).
// A document of the wrong shape (a matrix tour drawn as GeoJSON) throws InputError.

#include <nlohmann/json.hpp>

#include <string>
#include <string_view>

namespace ringroad::answers {

// The JSON rendering: indented by two, one trailing newline.
std::string render_json(const nlohmann::ordered_json& answer);

// The matrix as a table of seconds (or metres), "id,<id1>,..." header, one decimal, empty cell
// where no route.
std::string render_matrix_csv(const nlohmann::ordered_json& answer, bool seconds);
// One row per visit; a closed tour ends with a row back at the start. On roads the stops'
// positions and further fields come from `request`.
std::string render_tour_csv(const nlohmann::ordered_json& answer, const nlohmann::ordered_json& request);

std::string render_route_geojson(const nlohmann::ordered_json& answer);
std::string render_tour_geojson(const nlohmann::ordered_json& answer, const nlohmann::ordered_json& request);
std::string render_network_geojson(const nlohmann::ordered_json& answer, const nlohmann::ordered_json& request);

std::string render_route_gpx(const nlohmann::ordered_json& answer);
std::string render_tour_gpx(const nlohmann::ordered_json& answer, const nlohmann::ordered_json& request);

// Escapes text for XML character data and attribute values (GPX).
std::string xml_escape(std::string_view text);

} // namespace ringroad::answers
