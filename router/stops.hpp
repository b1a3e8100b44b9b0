#pragma once
// Stops: the list of places a matrix, tour or network is about, read from a CSV file with the
// header `id,lat,lon` (WGS84 degrees) and any further columns (kept and echoed). Reading checks
// every row and throws ringroad::InputError with one line naming the file, the line and the
// column at fault: a missing column, a non-numeric or out-of-range coordinate, an empty or
// duplicate id. Whether a stop is near a road is checked later, by snapping (router/snapping.hpp).

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace ringroad::router {

struct Stop {
    std::string id;
    double lat = 0.0;
    double lon = 0.0;
    std::vector<std::string> extra_values;  // aligned with StopList::extra_columns
    std::size_t line = 0;                   // line in the source file (0 when not from a file)
};

struct StopList {
    std::string source;                     // file name used in messages
    std::vector<std::string> extra_columns; // header names beyond id, lat, lon, in file order
    std::vector<Stop> stops;
};

// Throws InputError ("stops.csv:7: column 'lat': 'abc' is not a number", "stops.csv: missing
// column 'lon'", "stops.csv:9: column 'id': duplicate id 'depot' (first on line 2)", "stops.csv:
// no stops"...).
StopList read_stops_csv(const std::string& path);
StopList parse_stops_csv(std::string_view text, const std::string& source_name);

// Checks one coordinate pair; throws InputError naming `what` (a stop, a field) when a value is
// not finite or outside [-90, 90] / [-180, 180].
void check_coordinate_range(double lat, double lon, const std::string& what);

} // namespace ringroad::router
