#include "router/metric.hpp"

namespace ringroad::router {

std::optional<Metric> metric_from_name(std::string_view name) {
    if (name == "time") return Metric::time;
    if (name == "distance") return Metric::distance;
    return std::nullopt;
}

std::string_view metric_name(Metric metric) {
    return metric == Metric::time ? "time" : "distance";
}

} // namespace ringroad::router
