#include "daemon/cli/unusable_hierarchy_note.hpp"

#include <iostream>

namespace ringroad::cli {

void note_unusable_hierarchy(const router::RoadRouter& road_router, const std::string& region, router::Metric metric,
                             router::Engine engine) {
    if (engine == router::Engine::dijkstra || !road_router.has_unusable_hierarchy(metric)) return;
    const char* instead = engine == router::Engine::hierarchy ? "a hierarchy is built in memory for this run"
                                                              : "answers come from Dijkstra";
    std::cerr << "ringroad: note: " << region << ": its stored " << router::metric_name(metric)
              << " hierarchy was written by another ringroad version or for other restriction settings and is not"
                 " used; "
              << instead << " (exact, slower). Rebuild the file with `ringroad build` to restore it.\n";
}

} // namespace ringroad::cli
