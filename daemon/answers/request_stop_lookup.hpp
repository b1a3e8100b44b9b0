#pragma once
// For the renderings: the stops of a request body by id (position as the graph stores it, and
// the further fields in the order given).

#include "graph/coordinate.hpp"

#include <nlohmann/json.hpp>

#include <string>
#include <unordered_map>

namespace ringroad::answers {

struct StopEcho {
    graph::Coordinate position;   // rounded to 1e-7 degree like a snapped stop's `requested`
    const nlohmann::ordered_json* stop = nullptr;
};

class RequestStopLookup {
public:
    explicit RequestStopLookup(const nlohmann::ordered_json& request);
    // Throws InputError when the request has no such stop (a document from another request).
    const StopEcho& operator[](const std::string& id) const;

private:
    std::unordered_map<std::string, StopEcho> stops_;
};

} // namespace ringroad::answers
