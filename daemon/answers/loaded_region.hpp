#pragma once
// LoadedRegion: one region file opened once and shared, read-only, by every request that runs
// while it is current. The command line loads one per process; the service holds the current one
// behind a std::shared_ptr and swaps it on reload, so requests in flight finish on the region
// they started with.

#include "router/road_router.hpp"

#include <chrono>
#include <memory>
#include <string>

namespace ringroad::answers {

struct LoadedRegion {
    std::string path;                                  // as given at start-up, never from a request
    std::unique_ptr<const router::RoadRouter> router;  // owns the road graph and the hierarchies
    std::chrono::system_clock::time_point loaded_at;
};

// Loads and verifies `path` (graph::load_road_graph) and makes its router. Throws InputError
// naming the file when it cannot be used; the caller's current region is untouched.
std::shared_ptr<const LoadedRegion> load_region(const std::string& path, const router::RouterOptions& options = {});

} // namespace ringroad::answers
