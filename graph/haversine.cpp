#include "graph/haversine.hpp"

#include <cmath>
#include <numbers>

namespace ringroad::graph {

double haversine_meters(double lat1, double lon1, double lat2, double lon2) {
    constexpr double to_radians = std::numbers::pi / 180.0;
    const double phi1 = lat1 * to_radians;
    const double phi2 = lat2 * to_radians;
    const double sin_half_dphi = std::sin((phi2 - phi1) / 2.0);
    const double sin_half_dlambda = std::sin((lon2 - lon1) * to_radians / 2.0);
    const double h = sin_half_dphi * sin_half_dphi +
                     std::cos(phi1) * std::cos(phi2) * sin_half_dlambda * sin_half_dlambda;
    // min() guards asin against h creeping above 1 by rounding for antipodal points.
    return 2.0 * kEarthMeanRadiusMeters * std::asin(std::sqrt(std::min(1.0, h)));
}

} // namespace ringroad::graph
