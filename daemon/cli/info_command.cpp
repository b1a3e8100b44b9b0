// `ringroad info REGION.rrg [--json]`: provenance and counts of a region graph. Loading the
// file checks its magic, version and every section checksum, and each stored structure (routing
// graph, snapping index, hierarchies) is checked the way the routing commands check it, so
// `info` doubles as a verifier.

#include "common/input_error.hpp"
#include "daemon/cli/commands.hpp"
#include "daemon/cli/output.hpp"
#include "graph/graph_file.hpp"
#include "router/hierarchy/contraction_hierarchy.hpp"
#include "router/routing_graph.hpp"
#include "router/snap_index.hpp"

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <cstdio>
#include <iostream>
#include <optional>
#include <string>
#include <vector>

namespace ringroad::cli {

namespace {

// Metadata values that are whole numbers are reported as numbers in JSON.
bool is_count(const std::string& value) {
    return !value.empty() && value.size() < 19 && value.find_first_not_of("0123456789") == std::string::npos;
}

double road_km(const graph::RoadGraph& graph) {
    const std::string decimetres = graph.metadata_value("road_length_dm");
    return decimetres.empty() ? 0.0 : std::stod(decimetres) / 10000.0;
}

// The stored hierarchies by metric: usable by the other commands (with their default restriction
// setting), or present but not (another layout version, other settings, damage).
// Also the other structures stored for queries (router/STORED.md); checking them throws on damage.
struct HierarchyReport {
    std::vector<std::string> usable;
    std::vector<std::string> unusable;
    std::vector<std::string> stored;   // "routing graph", "snapping index"
};

HierarchyReport check_hierarchies(const graph::RoadGraph& graph) {
    HierarchyReport report;
    std::optional<router::RoutingGraph> routing_graph =
        router::RoutingGraph::from_sections(graph, router::RestrictionPolicy::automatic);
    if (routing_graph) report.stored.emplace_back("routing graph");
    if (router::snapping::PackedPieceIndex::from_sections(graph)) report.stored.emplace_back("snapping index");
    for (const router::Metric metric : {router::Metric::time, router::Metric::distance}) {
        if (!router::hierarchy::has_hierarchy_sections(graph, metric)) continue;
        if (!routing_graph) routing_graph.emplace(graph, router::RestrictionPolicy::automatic);
        const bool usable = router::hierarchy::ContractionHierarchy::from_sections(graph, *routing_graph, metric).has_value();
        (usable ? report.usable : report.unusable).emplace_back(router::metric_name(metric));
    }
    return report;
}

std::string joined(const std::vector<std::string>& words) {
    std::string text;
    for (const std::string& word : words) text += (text.empty() ? "" : ", ") + word;
    return text;
}

std::string hierarchy_line(const HierarchyReport& report) {
    std::string line = report.usable.empty() ? "none" : joined(report.usable);
    if (!report.unusable.empty()) {
        line += "  (" + joined(report.unusable) + " stored by another version or for other settings: not used;"
                " rebuild the file with `ringroad build`)";
    }
    return line;
}

nlohmann::json info_json(const graph::RoadGraph& graph, const std::string& path) {
    nlohmann::json info = nlohmann::json::object();
    info["file"] = path;
    for (const auto& [key, value] : graph.metadata()) {
        if (is_count(value)) {
            info[key] = std::stoull(value);
        } else {
            info[key] = value;
        }
    }
    info["road_km"] = std::round(road_km(graph) * 1000.0) / 1000.0;
    const HierarchyReport hierarchies = check_hierarchies(graph);
    info["hierarchy"] = !hierarchies.usable.empty();
    info["hierarchy_metrics"] = hierarchies.usable;
    info["hierarchy_unusable"] = hierarchies.unusable;
    info["stored_for_queries"] = hierarchies.stored;
    for (const char* key : {"profile", "source", "source_timestamp"}) {
        if (!info.contains(key)) info[key] = "";
    }
    return info;
}

void print_text(const graph::RoadGraph& graph, const std::string& path) {
    const HierarchyReport hierarchies = check_hierarchies(graph);
    auto value = [&](const char* key) {
        const std::string text = graph.metadata_value(key);
        return text.empty() ? std::string("-") : text;
    };
    char km[32];
    std::snprintf(km, sizeof km, "%.2f", road_km(graph));
    std::cout << "Region graph       " << path << '\n'
              << "  source           " << value("source") << '\n'
              << "  map snapshot     " << value("source_timestamp") << '\n'
              << "  profile          " << value("profile") << '\n'
              << "  built            " << value("built_at") << '\n'
              << "  junctions        " << graph.vertex_count() << "  (main component: "
              << value("main_component_junctions") << ")\n"
              << "  edges            " << graph.edge_count() << '\n'
              << "  road length      " << km << " km\n"
              << "  components       " << graph.component_count() << '\n'
              << "  turn rules       " << graph.turn_restrictions().size() << " stored, "
              << value("restrictions_unmatched") << " not matched\n"
              << "  skipped ways     " << value("ways_missing_nodes") << " (nodes missing from the extract)\n"
              << "  hierarchy        " << hierarchy_line(hierarchies) << '\n'
              << "  stored           " << (hierarchies.stored.empty() ? "-" : joined(hierarchies.stored))
              << "  (derived at every open when absent)\n"
              << "  bounds           " << value("bbox") << "  (lon,lat,lon,lat)\n";
}

} // namespace

void add_info_command(CLI::App& app) {
    auto* command = app.add_subcommand("info", "Print the provenance and counts of a region graph");
    auto path = std::make_shared<std::string>();
    auto as_json = std::make_shared<bool>(false);
    command->add_option("region", *path, "Region graph file (.rrg)")->required();
    command->add_flag("--json", *as_json, "One JSON object instead of text");
    command->callback([path, as_json] {
        const graph::RoadGraph graph = graph::load_road_graph(*path);
        if (*as_json) {
            std::cout << info_json(graph, *path).dump(kJsonIndent) << '\n';
        } else {
            print_text(graph, *path);
        }
    });
}

} // namespace ringroad::cli
