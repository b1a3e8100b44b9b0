#pragma once
// A one-line note on stderr when the region file carries a contraction hierarchy this run cannot
// use (an older layout, other restriction settings, damage): the answers stay exact, but come
// from Dijkstra or a hierarchy built in memory, which is much slower on a large region, and a
// dispatcher should know why and how to fix it (rebuild the file).

#include "router/road_router.hpp"

#include <string>

namespace ringroad::cli {

void note_unusable_hierarchy(const router::RoadRouter& road_router, const std::string& region, router::Metric metric,
                             router::Engine engine);

} // namespace ringroad::cli
