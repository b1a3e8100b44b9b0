#pragma once
// Coordinate: a WGS84 position stored as integer 1e-7 degrees (the precision of OSM itself),
// so that positions compare exactly and pack into 8 bytes.

#include <cmath>
#include <cstdint>

namespace ringroad::graph {

struct Coordinate {
    std::int32_t lat_e7 = 0;
    std::int32_t lon_e7 = 0;

    static Coordinate from_degrees(double lat, double lon) {
        return {static_cast<std::int32_t>(std::lround(lat * 1e7)),
                static_cast<std::int32_t>(std::lround(lon * 1e7))};
    }
    double lat() const noexcept { return lat_e7 * 1e-7; }
    double lon() const noexcept { return lon_e7 * 1e-7; }
    friend bool operator==(const Coordinate&, const Coordinate&) = default;
};
static_assert(sizeof(Coordinate) == 8);

} // namespace ringroad::graph
