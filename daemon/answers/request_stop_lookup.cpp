#include "daemon/answers/request_stop_lookup.hpp"

#include "common/input_error.hpp"

namespace ringroad::answers {

RequestStopLookup::RequestStopLookup(const nlohmann::ordered_json& request) {
    const auto list = request.find("stops");
    if (list == request.end() || !list->is_array()) return;
    for (const auto& stop : *list) {
        if (!stop.is_object() || !stop.contains("id") || !stop.contains("lat") || !stop.contains("lon")) continue;
        StopEcho echo;
        echo.position = graph::Coordinate::from_degrees(stop.at("lat").get<double>(), stop.at("lon").get<double>());
        echo.stop = &stop;
        stops_.emplace(stop.at("id").get<std::string>(), echo);
    }
}

const StopEcho& RequestStopLookup::operator[](const std::string& id) const {
    const auto it = stops_.find(id);
    if (it == stops_.end()) throw InputError("the answer names stop '" + id + "', which the request does not have");
    return it->second;
}

} // namespace ringroad::answers
