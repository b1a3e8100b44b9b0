#include "extract/road_extractor.hpp"

#include "common/input_error.hpp"
#include "common/progress.hpp"
#include "extract/graph_assembly.hpp"
#include "extract/road_scan.hpp"

#include <chrono>
#include <ctime>
#include <filesystem>

namespace ringroad::extract {

namespace {

std::string utc_now_iso8601() {
    const std::time_t now = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    std::tm utc{};
    gmtime_r(&now, &utc);
    char text[32];
    std::strftime(text, sizeof text, "%Y-%m-%dT%H:%M:%SZ", &utc);
    return text;
}

void add_metadata(graph::RoadGraphData& data, const ExtractOptions& options, const CollectedRoads& roads,
                  const AssemblyCounts& counts) {
    auto add = [&data](std::string key, std::string value) { data.metadata.emplace_back(std::move(key), std::move(value)); };
    add("source", std::filesystem::path(options.input_path).filename().string());
    add("source_timestamp", roads.replication_timestamp);
    add("profile", std::string(options.profile.name()));
    add("built_at", utc_now_iso8601());
    add("road_ways", std::to_string(counts.road_ways));
    add("ways_missing_nodes", std::to_string(counts.ways_missing_nodes));
    add("restrictions_read", std::to_string(counts.restrictions_read));
    add("restrictions_unmatched", std::to_string(counts.restrictions_unmatched));
    add("blocking_barriers", std::to_string(counts.blocking_barriers));
    add("delaying_barriers", std::to_string(counts.delaying_barriers));
    add("names_repaired", std::to_string(roads.names_repaired));
}

} // namespace

graph::RoadGraphData extract_road_graph(const ExtractOptions& options, Progress* progress) {
    const CollectedRoads roads = scan_osm_file(options.input_path, options.profile, progress);
    if (progress != nullptr) progress->phase("assembling the road graph");
    AssemblyCounts counts;
    graph::RoadGraphData data = assemble_road_graph(roads, counts);
    if (data.segments.empty() || data.edges.empty()) {
        std::string message = options.input_path + ": no roads for the " + std::string(options.profile.name()) + " profile";
        if (counts.ways_missing_nodes > 0) {
            message += " (" + std::to_string(counts.ways_missing_nodes) + " ways refer to nodes missing from the extract)";
        }
        throw InputError(message);
    }
    add_metadata(data, options, roads, counts);
    return data;
}

graph::RoadGraph extract_and_build_road_graph(const ExtractOptions& options, Progress* progress) {
    graph::RoadGraphData data = extract_road_graph(options, progress);
    if (progress != nullptr) progress->phase("finding components");
    return graph::build_road_graph(std::move(data));
}

} // namespace ringroad::extract
