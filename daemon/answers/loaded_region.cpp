#include "daemon/answers/loaded_region.hpp"

#include "graph/graph_file.hpp"

namespace ringroad::answers {

std::shared_ptr<const LoadedRegion> load_region(const std::string& path, const router::RouterOptions& options) {
    auto region = std::make_shared<LoadedRegion>();
    region->path = path;
    region->router = std::make_unique<const router::RoadRouter>(graph::load_road_graph(path), options);
    region->loaded_at = std::chrono::system_clock::now();
    return region;
}

} // namespace ringroad::answers
