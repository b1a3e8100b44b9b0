#pragma once
// Great-circle distance by the haversine formula on a sphere of the WGS84 mean radius
// R1 = (2a + b) / 3 = 6 371 008.8 m (IUGG / NIMA TR8350.2 definition of the mean radius).

#include "graph/coordinate.hpp"

namespace ringroad::graph {

inline constexpr double kEarthMeanRadiusMeters = 6371008.8;

double haversine_meters(double lat1, double lon1, double lat2, double lon2);
inline double haversine_meters(Coordinate a, Coordinate b) {
    return haversine_meters(a.lat(), a.lon(), b.lat(), b.lon());
}

} // namespace ringroad::graph
