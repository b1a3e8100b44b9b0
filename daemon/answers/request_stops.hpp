#pragma once
// The places a request is about: `"stops": [{"id", "lat", "lon", ...}]` (further fields are kept
// in their order and echoed), or for a tour or network a bare `"matrix": {"ids", "costs"}`; and
// placing stops on the roads under the far-stop policy ("error": the first stop too far from
// every road refuses the request; "skip": it is left out and listed with its distance).

#include "daemon/answers/request_fields.hpp"
#include "planners/matrices/cost_matrix.hpp"
#include "router/road_router.hpp"

#include <string>
#include <vector>

namespace ringroad::answers {

struct RequestStop {
    std::string id;
    double lat = 0.0;
    double lon = 0.0;
    Json extra = Json::object();   // every field beyond id, lat, lon, in the order given
};

// Reads body["stops"] (required): a non-empty array of at most limits.max_stops objects with a
// unique non-empty string id and lat/lon in range. Paths name the item ("stops[3].lat").
std::vector<RequestStop> read_stops(RequestObject& body, const AnswerLimits& limits);

// Reads body["matrix"]: {"ids": [...], "costs": [[...]]}, square, numbers >= 0 or null (no link),
// ids unique and non-empty.
planners::matrices::LabelledMatrix read_matrix(RequestObject& body, const AnswerLimits& limits);

// Refuses (413 "too_large") an N x N table over limits.max_matrix_cells, stating the estimate
// and the limit in cells and bytes. `bytes_per_cell` is what the question holds per cell.
void check_table_size(std::size_t stops, std::size_t bytes_per_cell, const AnswerLimits& limits, const std::string& field);

// What a request holds per table cell, counted from the structures it builds (see ANSWERS.md).
inline constexpr std::size_t kMatrixBytesPerCell = 72;   // packed weight, two JSON numbers, text
inline constexpr std::size_t kTourBytesPerCell = 48;     // packed weight, cost copies, closure

struct PlacedStops {
    std::vector<std::size_t> kept;              // indices into the request's stops, in order
    std::vector<router::SnappedStop> snapped;   // one per kept stop
    Json skipped = Json::array();               // [{"id", "meters_to_road"}] for far_stops "skip"
};

// Snaps every stop within `radius_meters`. A stop too far (or outside the region's bounds) is an
// error (422 "far_from_road", field "stops[i]") unless `skip_far`. Refuses when no stop is left.
PlacedStops place_stops(const router::RoadRouter& router, const std::vector<RequestStop>& stops, double radius_meters,
                        bool skip_far);

// The common options: "snap_radius" (metres, > 0) and "far_stops" ("error" | "skip").
double read_snap_radius(RequestObject& body);
bool read_skip_far(RequestObject& body);
// Refuses (400, naming the field) "geometry", "far_stops" or "snap_radius" on a bare-matrix
// request: they place `what` ("stops", "sites") on roads. Call after body.finish().
void refuse_road_options_on_matrix(RequestObject& body, bool geometry, const std::string& what);

// The region a road question needs; refuses (422 "no_region") when there is none.
const router::RoadRouter& region_router(const LoadedRegion* region);

} // namespace ringroad::answers
